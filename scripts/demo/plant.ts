/**
 * The physics of the demo plant, minute by minute: campus demand and weather drive the LP steam
 * demand; the steam cycle (boiler, HP header, TG1 or PRV1, LP header, E601, DA1, FWP1) and the air
 * compressor are solved with the property core (IAPWS-IF97 water, NASA-polynomial gases, complete
 * combustion from the measured O2), so every true value closes its unit's mass and energy balances:
 *
 *   TG1    W_el = m (h_in - h_ex) eta_gen,   h_ex = h_in - eta_s (h_in - h_s(p_ex, s_in))
 *   PRV1   h_out = h_in (isenthalpic throttle)
 *   E601   m_steam (h_LP - h_cond) = m_loop (h_sup - h_ret); condensing side at Tsat(p_shell),
 *          the loop heated by effectiveness 1 - exp(-UA / (m cp))
 *   DA1    adiabatic mixer: sum of m h in = m h out, outlet 1.2 K below saturation
 *   FWP1   h_dis = h_suc + (h_s(p_dis, s_suc) - h_suc) / eta_p,  W_el = m (h_dis - h_suc) / eta_motor
 *   B1     m_fuel (h_fuel(T0) + a h_air(T0) - f h_flue(T_stack) - r LHV) = m_steam (h_steam - h_fw),
 *          a and f the air and flue gas per kg fuel from the O2 (first law with absolute enthalpies;
 *          r LHV the casing loss)
 *   AC1    W_el = m (h_s(p_out, s_in) - h_in) / (eta_s eta_motor); dry compression: the air takes the
 *          shaft work less a 1.5 % casing loss
 *   B1 burns boiler-house air at the site's T0 (the intake temperature)
 *
 * True values are SI (Pa absolute, K, kg/s, W, mol/s for normal volume flows); ./generate.ts adds the
 * instrument noise and writes them in the export's units. Random draws per minute are fixed in
 * number, so a planted fault changes the physics but never the noise sequence.
 */
import { combustionFromO2, dryAir, gaseousFuel, mixture, water, type CombustionResult } from '~/lib/thermo';
import { createRng, type Rng } from '~/lib/analytics/rng';
import {
  COMPRESSOR_DRIVE_EFFICIENCY,
  DEMO_GAS,
  DEMO_P_ATM_Pa,
  DEMO_TAGS,
  PUMP_DRIVE_EFFICIENCY,
  TG1_GENERATOR_EFFICIENCY,
} from './site';

const DAY_ms = 86_400_000;
const K0 = 273.15;
const BAR = 1e5;
const TPH = 1 / 3.6; // kg/s per t/h

/** When the planted events happen (UTC ms) and how strong they are. */
export interface FaultPlan {
  /** baselines are trained on [start, baselineEndMs): no fault before it */
  baselineEndMs: number;
  /** planned TG1 inspection: turbine stopped, PRV1 carries the LP demand (normal operation) */
  turbineOutage: { fromMs: number; toMs: number } | null;
  /** E601 fouling starts (asymptotic fouling resistance) */
  foulingStartMs: number | null;
  /** time constant of the fouling growth [days] */
  foulingTau_days: number;
  /** asymptotic fouling, as UA_clean * R_f at t -> infinity [-] (UA falls to 1 / (1 + this)) */
  foulingFinal: number;
  /** PRV1 starts passing steam while it should be shut */
  valvePassingStartMs: number | null;
  /** passing flow at the start and after `valvePassingGrowth_days` [t/h] */
  valvePassingStart_tph: number;
  valvePassingEnd_tph: number;
  valvePassingGrowth_days: number;
  /** TG1 isentropic efficiency drops by `turbineStep` from this instant */
  turbineStepMs: number | null;
  /** drop of isentropic efficiency [-] */
  turbineStep: number;
  /** the make-up water temperature transmitter freezes (flatline) over this period */
  frozenTransmitter: { fromMs: number; toMs: number } | null;
}

/** Design figures of the plant (also used by the tests). */
export const DESIGN = Object.freeze({
  boilerMcr_kg_per_s: 28 * TPH,
  boilerSteamSet_barg: 40,
  boilerSteamSet_degC: 400,
  lpSet_barg: 4.0,
  daSet_barg: 0.2,
  daSubcooling_K: 1.2,
  tgMaxFlow_kg_per_s: 21 * TPH,
  tgMinFlow_kg_per_s: 5 * TPH,
  tgDesignFlow_kg_per_s: 17 * TPH,
  tgEtaDesign: 0.735,
  e601UA0_W_per_K: 33_000,
  e601SupplySet_degC: 85,
  e601LoopFlow_kg_per_s: 55 * TPH,
  e601ShellCapBelowLp_Pa: 0.35 * BAR,
  e601Subcooling_K: 4,
  ac1RatedFlow_Nm3_per_h: 1300,
  ac1OutSet_barg: 3.0,
  /** share of AC1's shaft power lost through its casing (the rest heats the air) [-] */
  ac1CasingLoss: 0.015,
});

/** Normal cubic metre: 0 degC, 101.325 kPa (molar volume of an ideal gas there) [m3/mol]. */
const VM_NORMAL_m3_per_mol = (8.31446261815324 * K0) / 101_325;

const FUEL = gaseousFuel({ ...DEMO_GAS }, 'demo pipeline gas');
const FUEL_GAS = mixture({ ...DEMO_GAS }, 'mole');
export const DEMO_FUEL = FUEL;

/** A first-order autoregressive process with standard deviation sd and time constant tau. */
class Ar1 {
  x = 0;
  private readonly a: number;
  private readonly b: number;
  constructor(
    tau_min: number,
    readonly sd: number,
  ) {
    this.a = Math.exp(-1 / tau_min);
    this.b = Math.sqrt(1 - this.a * this.a) * sd;
  }
  step(rng: Rng): number {
    this.x = this.a * this.x + this.b * rng.normal();
    return this.x;
  }
}

const clamp = (x: number, lo: number, hi: number) => (x < lo ? lo : x > hi ? hi : x);
/** 0 before a, 1 after b, a cosine ramp between. */
function ramp(x: number, a: number, b: number): number {
  if (x <= a) return 0;
  if (x >= b) return 1;
  return 0.5 - 0.5 * Math.cos((Math.PI * (x - a)) / (b - a));
}

/** Local calendar of a minute (the site's clock). */
export interface LocalTime {
  /** hour of the day, fractional [0, 24) */
  hour: number;
  /** day of week, 0 Sunday .. 6 Saturday */
  dow: number;
  /** day of the year, fractional, 0 = 1 January 00:00 */
  doy: number;
}

/** Weekday production shape of the campus (0..1). */
function production(lt: LocalTime): number {
  const h = lt.hour;
  if (lt.dow >= 1 && lt.dow <= 5) return ramp(h, 5.5, 7) * (1 - ramp(h, 21, 22.5));
  if (lt.dow === 6) return 0.6 * ramp(h, 5.5, 7) * (1 - ramp(h, 13.5, 15));
  return 0;
}

/** Index of each tag key in DEMO_TAGS (and in MinuteTruth.values). */
export const TAG_INDEX: Readonly<Record<string, number>> = Object.freeze(Object.fromEntries(DEMO_TAGS.map((t, i) => [t.key, i])));
const I = TAG_INDEX;

/** True values of one minute, by tag index (SI, in the order of DEMO_TAGS), plus the operating states the writer needs. */
export interface MinuteTruth {
  values: Float64Array;
  tgRunning: boolean;
  loopRunning: boolean;
  compressorRunning: boolean;
  /** passing flow of PRV1 [kg/s] (0 before the fault) */
  valvePassing_kg_per_s: number;
  /** TG1 isentropic efficiency this minute [-] */
  tgEta: number;
  /** E601 UA this minute [W/K] */
  e601UA_W_per_K: number;
  /** B1 efficiency on LHV: m_s (h_s - h_fw) / (m_f LHV) [-] */
  boilerEfficiency: number;
}

/**
 * The demo plant, stepped one minute at a time. Deterministic from the seed: the process draws a
 * fixed number of random numbers per minute.
 */
export class DemoPlant {
  private readonly rng: Rng;
  private readonly weather = new Ar1(2.5 * 1440, 2.8);
  private readonly demand = new Ar1(240, 0.015);
  private readonly loop = new Ar1(240, 0.025);
  private readonly air = new Ar1(240, 0.025);
  private readonly hpWobble = new Ar1(10, 0.12 * BAR);
  private readonly lpWobble = new Ar1(6, 0.025 * BAR);
  private readonly daWobble = new Ar1(8, 0.004 * BAR);
  private readonly o2Wobble = new Ar1(40, 0.0006);
  private readonly steamTWobble = new Ar1(30, 0.6);
  private readonly muWobble = new Ar1(120, 0.3);
  private readonly combustionCache = new Map<number, CombustionResult>();
  /** temperatures of stagnant equipment while stopped [K] */
  private loopRetIdle_K = 330;
  private loopSupIdle_K = 335;
  private shellIdle_K = 330;
  private acOutIdle_K = 300;
  private acOutIdle_Pa = DEMO_P_ATM_Pa + DESIGN.ac1OutSet_barg * BAR;
  private tgIdleEx_K = 450;
  private lastMuT_K = 285;
  /** the deaerator's steam of the last minute: a good start for this minute's iteration [kg/s] */
  private lastDa_kg_per_s = 0.5;

  constructor(
    seed: number,
    private readonly plan: FaultPlan,
  ) {
    this.rng = createRng((seed ^ 0x5eed5eed) >>> 0);
  }

  private combustion(O2_dry: number): CombustionResult {
    const key = Math.round(O2_dry * 1e4);
    let c = this.combustionCache.get(key);
    if (!c) {
      c = combustionFromO2(FUEL, { O2_fraction: key / 1e4, basis: 'dry' });
      this.combustionCache.set(key, c);
    }
    return c;
  }

  /** UA of E601 at an instant [W/K] (asymptotic fouling after the plan's start). */
  e601UA(ms: number): number {
    const UA0 = DESIGN.e601UA0_W_per_K;
    const p = this.plan;
    if (p.foulingStartMs === null || ms < p.foulingStartMs) return UA0;
    const days = (ms - p.foulingStartMs) / DAY_ms;
    return UA0 / (1 + p.foulingFinal * (1 - Math.exp(-days / p.foulingTau_days)));
  }

  /** PRV1 passing flow at an instant [kg/s]. */
  valvePassing(ms: number): number {
    const p = this.plan;
    if (p.valvePassingStartMs === null || ms < p.valvePassingStartMs) return 0;
    const f = clamp((ms - p.valvePassingStartMs) / (p.valvePassingGrowth_days * DAY_ms), 0, 1);
    return (p.valvePassingStart_tph + f * (p.valvePassingEnd_tph - p.valvePassingStart_tph)) * TPH;
  }

  /** TG1 isentropic efficiency at a flow and instant [-]. */
  tgEta(m_kg_per_s: number, ms: number): number {
    const r = m_kg_per_s / DESIGN.tgDesignFlow_kg_per_s - 1;
    const step = this.plan.turbineStepMs !== null && ms >= this.plan.turbineStepMs ? this.plan.turbineStep : 0;
    return DESIGN.tgEtaDesign - 0.025 * r * r - step;
  }

  /** The true state of the plant over the minute starting at `ms` (UTC) with local time `lt`. */
  step(ms: number, lt: LocalTime): MinuteTruth {
    const rng = this.rng;
    // Fixed number of draws per minute, whatever the plant does.
    const wx = this.weather.step(rng);
    const dem = this.demand.step(rng);
    const lw = this.loop.step(rng);
    const aw = this.air.step(rng);
    const hpw = this.hpWobble.step(rng);
    const lpw = this.lpWobble.step(rng);
    const daw = this.daWobble.step(rng);
    const o2w = this.o2Wobble.step(rng);
    const stw = this.steamTWobble.step(rng);
    const muw = this.muWobble.step(rng);

    const v = new Float64Array(DEMO_TAGS.length);
    const P_ATM = DEMO_P_ATM_Pa;

    // ---- weather
    const season_C = 10.2 - 6.3 * Math.cos((2 * Math.PI * (lt.doy - 20)) / 365.25);
    const summer = (season_C - 3.9) / 12.6;
    const diurnal = -(2.2 + 1.8 * summer) * Math.cos((2 * Math.PI * (lt.hour - 3)) / 24);
    const Tamb_C = season_C + diurnal + wx;
    const Tamb = Tamb_C + K0;
    v[I['ambient.T']!] = Tamb;
    // boiler house air intake (the site's T0): the house warms the air it draws in
    const Tbh = K0 + 14 + 0.55 * Tamb_C;
    v[I['b1.air.T']!] = Tbh;

    // ---- campus demand
    const prod = production(lt);
    const heating_tph = 0.32 * Math.max(0, 15.5 - Tamb_C) * (0.65 + 0.35 * prod);
    const campus = (5.2 + 6.5 * prod + heating_tph) * (1 + dem) * TPH;

    // ---- E601 and its hot-water loop
    const loopRunning = !((lt.dow === 6 && lt.hour >= 22) || lt.dow === 0 || (lt.dow === 1 && lt.hour < 4));
    const pLp = P_ATM + DESIGN.lpSet_barg * BAR + lpw;
    const UA = this.e601UA(ms);
    let mLoop = 0;
    let pRet = P_ATM + 0.3 * BAR;
    let pSup = P_ATM + 0.3 * BAR;
    let Tret: number;
    let Tsup: number;
    let pShell = P_ATM;
    let Qloop = 0;
    const activity = lt.dow === 0 ? 0 : Math.max(prod, 0.25);
    if (loopRunning) {
      mLoop = DESIGN.e601LoopFlow_kg_per_s * (1 + 0.1 * aw);
      pRet = P_ATM + 2.5 * BAR;
      pSup = P_ATM + 2.1 * BAR;
      const dT = (6 + 14 * activity) * (1 + lw);
      Tret = DESIGN.e601SupplySet_degC + K0 - dT;
      const eps = 1 - Math.exp(-UA / (mLoop * 4190));
      const TsatReq = Tret + (DESIGN.e601SupplySet_degC + K0 - Tret) / eps;
      const pCap = pLp - DESIGN.e601ShellCapBelowLp_Pa;
      const pReq = water.psat(Math.min(TsatReq, 640));
      if (pReq > pCap) {
        pShell = pCap;
        Tsup = Tret + eps * (water.tsat(pShell) - Tret);
      } else {
        pShell = pReq;
        Tsup = DESIGN.e601SupplySet_degC + K0;
      }
      Qloop = mLoop * (water.h_pt(pSup, Tsup) - water.h_pt(pRet, Tret));
      this.loopRetIdle_K = Tret;
      this.loopSupIdle_K = Tsup;
      this.shellIdle_K = water.tsat(pShell);
    } else {
      // stagnant loop and shell cool towards the plant room
      const a = Math.exp(-1 / 480);
      const room = Tamb + 12;
      this.loopRetIdle_K = room + (this.loopRetIdle_K - room) * a;
      this.loopSupIdle_K = room + (this.loopSupIdle_K - room) * a;
      this.shellIdle_K = room + (this.shellIdle_K - room) * a;
      Tret = this.loopRetIdle_K;
      Tsup = this.loopSupIdle_K;
    }

    // ---- boiler, headers, TG1, PRV1, DA1: LP demand depends on the deaerator's steam and the LP
    // enthalpy on the split, so iterate (converges in a few passes: the DA takes about a tenth)
    const passing = this.valvePassing(ms);
    const outage = this.plan.turbineOutage !== null && ms >= this.plan.turbineOutage.fromMs && ms < this.plan.turbineOutage.toMs;
    const pB = P_ATM + DESIGN.boilerSteamSet_barg * BAR + hpw;
    const pDa = P_ATM + DESIGN.daSet_barg * BAR + daw;
    const TdaOut = water.tsat(pDa) - DESIGN.daSubcooling_K;
    const hDaOut = water.h_pt(pDa, TdaOut);
    const pCr = P_ATM + 1.5 * BAR;
    const pMu = P_ATM + 3.5 * BAR;
    let TmuTrue = K0 + 11 + 0.5 * (season_C - 10) + muw;
    const hMu = water.h_pt(pMu, TmuTrue);
    const mCampusReturn = 0.55 * campus;
    const hCampusReturn = water.h_pt(pCr, K0 + 68 + 0.25 * (season_C - 10));

    let mDa = this.lastDa_kg_per_s;
    let mT = 0;
    let mV = 0;
    let mB = 0;
    let hHp = 0;
    let sHp = 0;
    let hEx = 0;
    let pHp = 0;
    let THp = 0;
    let TB = 0;
    let hB = 0;
    let pEx = pLp;
    let eta = 0;
    let hLp = 0;
    let mHx = 0;
    let hCond = 0;
    let pCond = pShell;
    let Tcond = this.shellIdle_K;
    let mCr = 0;
    let hCr = 0;
    let mMu = 0;
    const hHxReturn = water.h_pt(pCr, K0 + 90);
    for (let it = 0; it < 8; it++) {
      const mDaBefore = mDa;
      const mLpDemand = campus + mHx + mDa;
      mB = mLpDemand;
      const load = mB / DESIGN.boilerMcr_kg_per_s;
      TB = DESIGN.boilerSteamSet_degC + K0 + stw - 6 * (1 - load) * (1 - load);
      hB = water.h_pt(pB, TB);
      pHp = pB - 0.35 * BAR * load * load;
      THp = TB - (1.5 + 1.0 * (1 - load));
      const hp = water.pt(pHp, THp);
      hHp = hp.h;
      sHp = hp.s;
      // split: TG1 takes what it can, PRV1 the rest (and its passing flow)
      if (outage) {
        mT = 0;
      } else {
        mT = Math.min(mLpDemand - passing, DESIGN.tgMaxFlow_kg_per_s);
        if (mT < DESIGN.tgMinFlow_kg_per_s) mT = 0;
      }
      mV = mLpDemand - mT;
      if (mT > 0) {
        const r = mT / DESIGN.tgMaxFlow_kg_per_s;
        pEx = pLp + 0.03 * BAR + 0.12 * BAR * r * r;
        eta = this.tgEta(mT, ms);
        const hS = water.h_ps(pEx, sHp);
        hEx = hHp - eta * (hHp - hS);
        hLp = (mT * hEx + mV * hHp) / (mT + mV);
      } else {
        pEx = pLp;
        hEx = NaN;
        eta = NaN;
        hLp = hHp;
      }
      // E601 steam side
      if (loopRunning) {
        pCond = pShell - 0.05 * BAR;
        Tcond = water.tsat(pShell) - DESIGN.e601Subcooling_K;
        hCond = water.h_pt(pCond, Tcond);
        mHx = Qloop / (hLp - hCond);
      } else {
        mHx = 0;
        pCond = P_ATM + 0.02 * BAR;
        Tcond = this.shellIdle_K - 3;
      }
      // condensate return: E601 condensate cooled to 90 degC in the return line, plus the campus's
      mCr = mHx + mCampusReturn;
      hCr = (mHx * hHxReturn + mCampusReturn * hCampusReturn) / mCr;
      // DA1: m_s + m_mu = m_fw - m_cr; m_s h_LP + m_mu h_mu = m_fw h_out - m_cr h_cr
      const mFw = mB;
      const A = mFw - mCr;
      const Bsum = mFw * hDaOut - mCr * hCr;
      mDa = (Bsum - A * hMu) / (hLp - hMu);
      mMu = A - mDa;
      if (Math.abs(mDa - mDaBefore) < 1e-6) break;
    }
    this.lastDa_kg_per_s = mDa;
    const mFw = mB;
    const load = mB / DESIGN.boilerMcr_kg_per_s;

    // ---- FWP1 and the feedwater line
    const pFwEco = pB + 2.5 * BAR + 2.0 * BAR * load * load;
    const pDis = pFwEco + 1.8 * BAR;
    const pSuc = pDa + 0.55 * BAR - 0.05 * BAR * load * load;
    const Tsuc = TdaOut - 0.15;
    const hSuc = water.h_pt(pSuc, Tsuc);
    const sSuc = water.s_pt(pSuc, Tsuc);
    const rq = mFw / (23 * TPH) - 1;
    const etaP = 0.68 - 0.15 * rq * rq;
    const hDis = hSuc + (water.h_ps(pDis, sSuc) - hSuc) / etaP;
    const Tdis = water.T_ph(pDis, hDis);
    const Wpump = (mFw * (hDis - hSuc)) / PUMP_DRIVE_EFFICIENCY;
    const TfwEco = water.T_ph(pFwEco, hDis);

    // ---- B1 firing
    const O2 = clamp(0.029 + 0.022 * Math.pow(Math.max(0, 1 - load), 1.5) + o2w, 0.015, 0.09);
    const comb = this.combustion(O2);
    const O2true = Math.round(O2 * 1e4) / 1e4;
    const Tstack = K0 + 118 + 48 * load + 0.15 * (Tamb_C - 10) + 0.5 * stw;
    const casingLoss = 0.0055 / Math.max(load, 0.15);
    const perKgFuel =
      FUEL_GAS.h(Tbh) + comb.air_kg_per_kgFuel * comb.combustionAir.h(Tbh) - comb.flue_kg_per_kgFuel * comb.flueGas.h(Tstack) - casingLoss * FUEL.LHV_J_per_kg;
    const Qw = mB * (hB - hDis);
    const mFuel = Qw / perKgFuel;
    const nFuel_mol_per_s = mFuel / FUEL.M_kg_per_mol!;

    // ---- AC1
    const compressorRunning = !(lt.dow === 0 || (lt.dow === 1 && lt.hour < 5));
    const pAcIn = P_ATM - 1500;
    const TacIn = Tbh + 3;
    let Vac = 0;
    let Wac = 0;
    let TacOut: number;
    let pAcOut: number;
    if (compressorRunning) {
      const shape = lt.dow === 6 ? 0.55 * ramp(lt.hour, 5.5, 7) * (1 - ramp(lt.hour, 13.5, 15)) : production(lt);
      Vac = (380 + 680 * shape) * (1 + aw); // Nm3/h
      const nAir = Vac / 3600 / VM_NORMAL_m3_per_mol;
      const mAir = nAir * dryAir.M_kg_per_mol;
      pAcOut = P_ATM + DESIGN.ac1OutSet_barg * BAR + 0.02 * BAR * aw;
      const sIn = dryAir.s(TacIn, pAcIn);
      const hIn = dryAir.h(TacIn);
      const hIs = dryAir.h(dryAir.T_ps(pAcOut, sIn));
      const lf = Vac / DESIGN.ac1RatedFlow_Nm3_per_h;
      const etaAc = 0.74 - 0.15 * (1 - lf) * (1 - lf);
      const Wshaft = (mAir * (hIs - hIn)) / etaAc;
      Wac = Wshaft / COMPRESSOR_DRIVE_EFFICIENCY;
      // dry compression: the air takes the shaft work but for the casing loss
      TacOut = dryAir.T_h(hIn + (Wshaft * (1 - DESIGN.ac1CasingLoss)) / mAir);
      this.acOutIdle_K = TacOut;
      this.acOutIdle_Pa = pAcOut;
    } else {
      const a = Math.exp(-1 / 90);
      this.acOutIdle_K = TacIn + (this.acOutIdle_K - TacIn) * a;
      const pRest = P_ATM + 2.2 * BAR;
      this.acOutIdle_Pa = pRest + (this.acOutIdle_Pa - pRest) * Math.exp(-1 / 240);
      TacOut = this.acOutIdle_K;
      pAcOut = this.acOutIdle_Pa;
    }

    // ---- write the true values
    const tgRunning = mT > 0;
    const pLpTrue = pLp;
    const TLp = water.T_ph(pLpTrue, hLp);
    v[I['b1.steam.m']!] = mB;
    v[I['b1.steam.p']!] = pB;
    v[I['b1.steam.T']!] = TB;
    v[I['b1.level']!] = 50 + 4 * Math.sin(ms / 3.7e6) * load;
    v[I['b1.fw.m']!] = mFw;
    v[I['b1.fw.p']!] = pFwEco;
    v[I['b1.fw.T']!] = TfwEco;
    v[I['b1.gas.V']!] = nFuel_mol_per_s;
    v[I['b1.stack.T']!] = Tstack;
    v[I['b1.stack.O2']!] = O2true;
    v[I['hp.p']!] = pHp;
    v[I['hp.T']!] = THp;
    v[I['tg1.m']!] = mT;
    if (tgRunning) {
      this.tgIdleEx_K = water.T_ph(pEx, hEx);
      v[I['tg1.ex.T']!] = this.tgIdleEx_K;
      v[I['tg1.W']!] = mT * (hHp - hEx) * TG1_GENERATOR_EFFICIENCY;
      v[I['tg1.speed']!] = 6000;
    } else {
      this.tgIdleEx_K = TLp - 30 + (this.tgIdleEx_K - (TLp - 30)) * Math.exp(-1 / 600);
      v[I['tg1.ex.T']!] = this.tgIdleEx_K;
      v[I['tg1.W']!] = 0;
      v[I['tg1.speed']!] = 0;
    }
    v[I['tg1.ex.p']!] = pEx;
    v[I['prv1.m']!] = mV;
    v[I['prv1.T']!] = mV > 0.01 ? water.T_ph(pLpTrue, hHp) : TLp - 25;
    v[I['lp.p']!] = pLpTrue;
    v[I['lp.T']!] = TLp;
    v[I['lp.campus.m']!] = campus;
    v[I['da.p']!] = pDa;
    v[I['da.out.T']!] = TdaOut;
    v[I['da.steam.m']!] = mDa;
    v[I['da.steam.T']!] = water.T_ph(pDa, hLp);
    v[I['da.cr.m']!] = mCr;
    v[I['da.cr.p']!] = pCr;
    v[I['da.cr.T']!] = water.T_ph(pCr, hCr);
    v[I['da.mu.m']!] = mMu;
    v[I['da.mu.p']!] = pMu;
    const frozen = this.plan.frozenTransmitter !== null && ms >= this.plan.frozenTransmitter.fromMs && ms < this.plan.frozenTransmitter.toMs;
    if (!frozen) this.lastMuT_K = TmuTrue;
    else TmuTrue = this.lastMuT_K; // the reading sticks; written without noise by the generator
    v[I['da.mu.T']!] = TmuTrue;
    v[I['fwp.suc.p']!] = pSuc;
    v[I['fwp.suc.T']!] = Tsuc;
    v[I['fwp.dis.p']!] = pDis;
    v[I['fwp.dis.T']!] = Tdis;
    v[I['fwp.W']!] = Wpump;
    v[I['e601.steam.m']!] = mHx;
    v[I['e601.shell.p']!] = loopRunning ? pShell : P_ATM + 0.01 * BAR;
    v[I['e601.steam.T']!] = loopRunning ? water.T_ph(pShell, hLp) : this.shellIdle_K;
    v[I['e601.cond.p']!] = pCond;
    v[I['e601.cond.T']!] = Tcond;
    v[I['e601.loop.m']!] = mLoop;
    v[I['e601.ret.p']!] = pRet;
    v[I['e601.ret.T']!] = Tret;
    v[I['e601.sup.p']!] = pSup;
    v[I['e601.sup.T']!] = Tsup;
    v[I['ac1.in.p']!] = pAcIn;
    v[I['ac1.in.T']!] = TacIn;
    v[I['ac1.V']!] = Vac / 3600 / VM_NORMAL_m3_per_mol;
    v[I['ac1.out.p']!] = pAcOut;
    v[I['ac1.out.T']!] = TacOut;
    v[I['ac1.W']!] = Wac;

    return {
      values: v,
      tgRunning,
      loopRunning,
      compressorRunning,
      valvePassing_kg_per_s: passing,
      tgEta: eta,
      e601UA_W_per_K: UA,
      boilerEfficiency: Qw / (mFuel * FUEL.LHV_J_per_kg),
    };
  }
}
