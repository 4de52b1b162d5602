/**
 * The demo's exports are physically consistent: the hourly means the ingest core reads from them
 * close each unit's mass and energy balances within the instrument noise the generator adds.
 * Tolerances are a few times the noise of an hourly mean (noise per minute / sqrt(60)) plus the
 * small bias of taking a nonlinear function of hourly means; each is stated at its check.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { evaluateUnitHour, inputNames } from '~/lib/equipment';
import { combustionFromO2, mixture, water } from '~/lib/thermo';
import { siteMidnightMs } from '../../scripts/demo/generate';
import { DEMO_FUEL } from '../../scripts/demo/plant';
import { DEMO_GAS, DEMO_P_ATM_Pa, PUMP_DRIVE_EFFICIENCY, COMPRESSOR_DRIVE_EFFICIENCY, TG1_GENERATOR_EFFICIENCY } from '../../scripts/demo/site';
import { dryAir } from '~/lib/thermo';
import { DAY_ms, generate, HOUR_ms, Hours, mean, type Generated } from './support';

const NONE = { turbineOutage: null, foulingStartMs: null, valvePassingStartMs: null, turbineStepMs: null, frozenTransmitter: null };
const START = '2025-01-06'; // a Monday
const startMs = siteMidnightMs(START);

let run: Generated;
let hours: Hours;
/** Hours in which the unit runs and its key flows are steady (relative spread below 2 %). */
function steady(keys: string[]): number[] {
  return hours.hourStarts().filter((h) =>
    keys.every((k) => {
      const s = hours.stat(k, h);
      return s && s.mean !== null && s.stdDev !== null && Math.abs(s.mean) > 0.3 && s.stdDev / Math.abs(s.mean) < 0.02 && s.coveredFraction > 0.95;
    }),
  );
}
/** Mean of a truth figure over an hour. */
function truthMean(hourMs: number, pick: (t: NonNullable<ReturnType<Generated['truth']['get']>>) => number): number {
  const xs: number[] = [];
  for (let ms = hourMs; ms < hourMs + HOUR_ms; ms += 60_000) {
    const t = run.truth.get(ms);
    if (t) xs.push(pick(t));
  }
  return mean(xs);
}

beforeAll(() => {
  // Monday and Tuesday, healthy plant, no status words or gaps; plus the Sunday before for idling
  run = generate({ start: '2025-01-05', days: 3, seed: 11, clean: true, faults: NONE });
  hours = new Hours(run.files);
});

describe('the demo exports close the balances of each unit', () => {
  it('self-consistency: TG1 exhaust enthalpy closes the energy balance with the power and the generator efficiency', () => {
    const hs = steady(['tg1.m', 'tg1.W']);
    expect(hs.length).toBeGreaterThan(12);
    for (const h of hs) {
      const m = hours.si('tg1.m', h);
      const hIn = water.h_pt(hours.si('hp.p', h), hours.si('hp.T', h));
      const hEx = water.h_pt(hours.si('tg1.ex.p', h), hours.si('tg1.ex.T', h));
      const W = hours.si('tg1.W', h);
      // hourly-mean noise: flow 0.05 %, power 0.03 %, exhaust T 0.03 K; 0.6 % covers them and the averaging bias
      expect(Math.abs(W / (m * (hIn - hEx) * TG1_GENERATOR_EFFICIENCY) - 1)).toBeLessThan(0.006);
      // the exhaust is superheated: its p and T fix the state
      expect(hours.si('tg1.ex.T', h)).toBeGreaterThan(water.tsat(hours.si('tg1.ex.p', h)) + 20);
    }
  });

  it('self-consistency: PRV1 is isenthalpic (HP header enthalpy = downstream enthalpy) while it passes steam', () => {
    const g = generate({ start: START, days: 1, seed: 12, clean: true, faults: { ...NONE, valvePassingStartMs: startMs } });
    const hh = new Hours(g.files);
    let n = 0;
    for (const h of hh.hourStarts()) {
      expect(hh.si('prv1.m', h)).toBeGreaterThan(0.7 / 3.6);
      const hIn = water.h_pt(hh.si('hp.p', h), hh.si('hp.T', h));
      const hOut = water.h_pt(hh.si('lp.p', h), hh.si('prv1.T', h));
      // temperature noise 0.3 K per minute: the hourly means agree to about 0.05 K, i.e. 0.1 kJ/kg
      expect(Math.abs(hOut - hIn)).toBeLessThan(1500);
      n++;
    }
    expect(n).toBeGreaterThan(20);
  });

  it('self-consistency: E601 hot-side heat equals cold-side heat', () => {
    const hs = steady(['e601.steam.m', 'e601.loop.m']);
    expect(hs.length).toBeGreaterThan(12);
    for (const h of hs) {
      const Qhot = hours.si('e601.steam.m', h) * (water.h_pt(hours.si('e601.shell.p', h), hours.si('e601.steam.T', h)) - water.h_pt(hours.si('e601.cond.p', h), hours.si('e601.cond.T', h)));
      const Qcold = hours.si('e601.loop.m', h) * (water.h_pt(hours.si('e601.sup.p', h), hours.si('e601.sup.T', h)) - water.h_pt(hours.si('e601.ret.p', h), hours.si('e601.ret.T', h)));
      // steam flow noise 0.5 % + 0.01 t/h per minute; loop dT noise 0.01 K in about 15 K: 1.5 %
      expect(Math.abs(Qhot / Qcold - 1)).toBeLessThan(0.015);
    }
  });

  it('self-consistency: DA1 mixes adiabatically (enthalpy in = enthalpy out) and conserves mass', () => {
    const hs = steady(['b1.fw.m', 'da.steam.m', 'da.cr.m', 'da.mu.m']);
    expect(hs.length).toBeGreaterThan(12);
    for (const h of hs) {
      const pDa = hours.si('da.p', h);
      const mS = hours.si('da.steam.m', h);
      const mCr = hours.si('da.cr.m', h);
      const mMu = hours.si('da.mu.m', h);
      const mOut = hours.si('b1.fw.m', h);
      const Hin = mS * water.h_pt(pDa, hours.si('da.steam.T', h)) + mCr * water.h_pt(hours.si('da.cr.p', h), hours.si('da.cr.T', h)) + mMu * water.h_pt(hours.si('da.mu.p', h), hours.si('da.mu.T', h));
      const Hout = mOut * water.h_pt(pDa, hours.si('da.out.T', h));
      expect(Math.abs(Hin / Hout - 1)).toBeLessThan(0.01);
      expect(Math.abs((mS + mCr + mMu) / mOut - 1)).toBeLessThan(0.01);
      // the outlet is liquid below saturation, so the engine's (p, T) state is unambiguous
      expect(hours.si('da.out.T', h)).toBeLessThan(water.tsat(pDa) - 0.5);
    }
  });

  it('self-consistency: the headers balance (B1 = TG1 + PRV1 = E601 + DA1 + campus) and feedwater equals steam', () => {
    const hs = steady(['b1.steam.m']);
    expect(hs.length).toBeGreaterThan(24);
    for (const h of hs) {
      const mB = hours.si('b1.steam.m', h);
      const mHp = hours.si('tg1.m', h) + hours.si('prv1.m', h);
      const mLp = hours.si('e601.steam.m', h) + hours.si('da.steam.m', h) + hours.si('lp.campus.m', h);
      expect(Math.abs(mHp / mB - 1)).toBeLessThan(0.01);
      expect(Math.abs(mLp / mHp - 1)).toBeLessThan(0.01);
      expect(Math.abs(hours.si('b1.fw.m', h) / mB - 1)).toBeLessThan(0.01);
    }
  });

  it("self-consistency: B1's steam and gas flows agree with its efficiency, and the stack closes its first-law balance", () => {
    const hs = steady(['b1.steam.m', 'b1.gas.V']);
    expect(hs.length).toBeGreaterThan(12);
    const fuelGas = mixture({ ...DEMO_GAS }, 'mole');
    for (const h of hs) {
      const mS = hours.si('b1.steam.m', h);
      const Qw = mS * (water.h_pt(hours.si('b1.steam.p', h), hours.si('b1.steam.T', h)) - water.h_pt(hours.si('b1.fw.p', h), hours.si('b1.fw.T', h)));
      const mF = hours.si('b1.gas.V', h) * DEMO_FUEL.M_kg_per_mol!;
      const eta = Qw / (mF * DEMO_FUEL.LHV_J_per_kg);
      // against the generator's own efficiency of the hour: gas and steam flow noise 0.05 % each
      expect(Math.abs(eta / truthMean(h, (t) => t.boilerEfficiency) - 1)).toBeLessThan(0.005);
      expect(eta).toBeGreaterThan(0.88);
      expect(eta).toBeLessThan(0.95);
      // first law with absolute enthalpies: what the fuel and air bring minus what the stack and
      // the water take is the casing loss, small and positive (common practice: 0.3-3 % of the fuel,
      // the most at low load)
      const Tair = hours.si('b1.air.T', h); // boiler-house intake: combustion air and gas enter at it
      const comb = combustionFromO2(DEMO_FUEL, { O2_fraction: hours.si('b1.stack.O2', h), basis: 'dry' });
      const inFlow = mF * (fuelGas.h(Tair) + comb.air_kg_per_kgFuel * comb.combustionAir.h(Tair) - comb.flue_kg_per_kgFuel * comb.flueGas.h(hours.si('b1.stack.T', h)));
      const casing = (inFlow - Qw) / (mF * DEMO_FUEL.LHV_J_per_kg);
      expect(casing).toBeGreaterThan(0.002);
      expect(casing).toBeLessThan(0.03);
    }
  });

  it("self-consistency: the equipment engine reads B1's efficiency from the exported hour as the generator made it", () => {
    const h = steady(['b1.steam.m', 'b1.gas.V'])[6]!;
    const model = {
      ports: [
        { name: 'fuel', role: 'fuel', direction: 'in' as const, fluid: { kind: 'fuel-gas' as const, composition: { ...DEMO_GAS } } },
        { name: 'stack', role: 'flue-gas', direction: 'out' as const, fluid: { kind: 'flue-gas' as const, o2Basis: 'dry' as const }, flow: 'fuel-ratio' as const },
        { name: 'feedwater', role: 'water', direction: 'in' as const, fluid: { kind: 'water' as const } },
        { name: 'steam', role: 'water', direction: 'out' as const, fluid: { kind: 'water' as const } },
      ],
    };
    const values: Record<string, number> = {
      T0_K: hours.si('b1.air.T', h),
      p0_Pa: DEMO_P_ATM_Pa,
      'fuel.mDot_kg_per_s': hours.si('b1.gas.V', h) * DEMO_FUEL.M_kg_per_mol!,
      'fuel.p_Pa': DEMO_P_ATM_Pa + 20_000,
      'fuel.T_K': hours.si('b1.air.T', h),
      'stack.p_Pa': DEMO_P_ATM_Pa,
      'stack.T_K': hours.si('b1.stack.T', h),
      'stack.O2_fraction': hours.si('b1.stack.O2', h),
      'feedwater.mDot_kg_per_s': hours.si('b1.fw.m', h),
      'feedwater.p_Pa': hours.si('b1.fw.p', h),
      'feedwater.T_K': hours.si('b1.fw.T', h),
      'steam.mDot_kg_per_s': hours.si('b1.steam.m', h),
      'steam.p_Pa': hours.si('b1.steam.p', h),
      'steam.T_K': hours.si('b1.steam.T', h),
    };
    const x = inputNames('boiler', model).map((n) => values[n]!);
    const b = evaluateUnitHour('boiler', model, x);
    const eta = (b.extras as Record<string, number>).energyEfficiencyLHV!;
    // feedwater and steam flows are two meters (0.4 % noise each per minute)
    expect(Math.abs(eta / truthMean(h, (t) => t.boilerEfficiency) - 1)).toBeLessThan(0.006);
  });

  it('self-consistency: FWP1 motor power drives the measured enthalpy rise at a plausible pump efficiency', () => {
    const hs = steady(['b1.fw.m', 'fwp.W']);
    expect(hs.length).toBeGreaterThan(12);
    for (const h of hs) {
      const pSuc = hours.si('fwp.suc.p', h);
      const pDis = hours.si('fwp.dis.p', h);
      const hSuc = water.h_pt(pSuc, hours.si('fwp.suc.T', h));
      const sSuc = water.s_pt(pSuc, hours.si('fwp.suc.T', h));
      const hDis = water.h_pt(pDis, hours.si('fwp.dis.T', h));
      const Wshaft = hours.si('fwp.W', h) * PUMP_DRIVE_EFFICIENCY;
      const m = hours.si('b1.fw.m', h);
      // a 0.7 K rise read from two RTDs (0.08 K per minute, 0.01 K an hour): 5 %
      expect(Math.abs(Wshaft / (m * (hDis - hSuc)) - 1)).toBeLessThan(0.05);
      const etaPump = (m * (water.h_ps(pDis, sSuc) - hSuc)) / Wshaft;
      expect(etaPump).toBeGreaterThan(0.4);
      expect(etaPump).toBeLessThan(0.75);
    }
  });

  it('self-consistency: AC1 (dry compression) heats the air by its shaft work less a small casing loss, at a plausible efficiency', () => {
    const hs = steady(['ac1.V', 'ac1.W']);
    expect(hs.length).toBeGreaterThan(12);
    for (const h of hs) {
      const m = hours.si('ac1.V', h) * dryAir.M_kg_per_mol;
      const Tin = hours.si('ac1.in.T', h);
      const pIn = hours.si('ac1.in.p', h);
      const pOut = hours.si('ac1.out.p', h);
      const Wshaft = hours.si('ac1.W', h) * COMPRESSOR_DRIVE_EFFICIENCY;
      const wIs = dryAir.h(dryAir.T_ps(pOut, dryAir.s(Tin, pIn))) - dryAir.h(Tin);
      const eta = (m * wIs) / Wshaft;
      expect(eta).toBeGreaterThan(0.55);
      expect(eta).toBeLessThan(0.78);
      // casing loss: common practice 1-3 % of the shaft power for a dry screw air end
      const casing = 1 - (m * (dryAir.h(hours.si('ac1.out.T', h)) - dryAir.h(Tin))) / Wshaft;
      expect(casing).toBeGreaterThan(0.005);
      expect(casing).toBeLessThan(0.03);
    }
  });

  it('self-consistency: AC1 and the E601 loop idle on Sunday and run on Monday', () => {
    const sundayNoon = siteMidnightMs('2025-01-05') + 12 * HOUR_ms;
    const mondayNoon = sundayNoon + DAY_ms;
    expect(hours.si('ac1.W', sundayNoon)).toBeLessThan(1000);
    expect(hours.si('e601.loop.m', sundayNoon)).toBeLessThan(0.5 / 3.6);
    expect(hours.si('e601.steam.m', sundayNoon)).toBeLessThan(0.05 / 3.6);
    expect(hours.si('ac1.W', mondayNoon)).toBeGreaterThan(50_000);
    expect(hours.si('e601.loop.m', mondayNoon)).toBeGreaterThan(40 / 3.6);
    // the boiler and the turbine run all week
    expect(hours.si('tg1.W', sundayNoon)).toBeGreaterThan(300_000);
  });
});
