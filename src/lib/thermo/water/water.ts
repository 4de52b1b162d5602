/**
 * Water and steam properties by IAPWS-IF97: the state functions that the rest of Lossline calls.
 * SI base units throughout (Pa, K, J/kg, J/(kg K), m3/kg, m/s).
 * Longer than 400 lines on purpose: the region dispatch of every state function (p-T, p-h, p-s, h-s,
 * saturation) sits in one file, so that the region boundaries are decided in one place; the regions'
 * equations, backward equations and coefficients are already in files of their own.
 * @see IAPWS R7-97(2012) Revised Release on the IAPWS Industrial Formulation 1997
 * @see IAPWS SR3-03(2014), IAPWS SR5-05(2016) supplementary backward equations for region 3
 */
import { NoConvergenceError, ThermoRangeError } from '../errors';
import { T1_ph, T1_ps, T2_ph, T2_ps, T3_ph, T3_ps, v3_ph, v3_ps } from './backward';
import {
  P_MAX_PA, P_MAX_R5_PA, PC_PA, R, RHOC_KG_PER_M3, T_13_K, T_25_K, T_MAX_K, T_MIN_K, TC_K,
} from './constants';
import { h1, props1, s1 } from './region1';
import { h2, props2, s2 } from './region2';
import { F3, helmholtz3, props3 } from './region3';
import { v3Backward, v3SatBackward } from './region3-vpt';
import { h5, props5, s5 } from './region5';
import { P_SAT_623_PA, P_SAT_MIN_PA, pB23, psatRaw, tB23, tsatRaw } from './saturation';

/** Phase of a water state. Region 3 and 2 states above both critical values are 'supercritical'. */
export type WaterPhase = 'liquid' | 'vapour' | 'two-phase' | 'supercritical';
/** IF97 region: 1 liquid, 2 vapour, 3 near-critical, 4 two-phase (saturation), 5 high-temperature steam. */
export type WaterRegion = 1 | 2 | 3 | 4 | 5;

/**
 * A water or steam state in SI base units.
 * p [Pa], T [K], h [J/kg], s [J/(kg K)], v [m3/kg], cp [J/(kg K)], w speed of sound [m/s],
 * x vapour mass fraction [-] in region 4 (null elsewhere); cp and w are NaN inside the two-phase
 * region (0 < x < 1) and those of the saturated phase at x = 0 or x = 1.
 */
export interface WaterState {
  p: number;
  T: number;
  h: number;
  s: number;
  v: number;
  cp: number;
  w: number;
  x: number | null;
  region: WaterRegion;
  phase: WaterPhase;
}

// Scratch arrays reused across calls (layout of props1/2/3/5: h, s, v, cp, w, u, ...).
const OUT = new Float64Array(13);
const LIQ = new Float64Array(13);
const VAP = new Float64Array(13);
/** Temperature [K] and vapour fraction of the last core solve (ph/ps). */
let resT = 0;
let resX = NaN;

function mk(p: number, T: number, out: Float64Array, x: number | null, region: WaterRegion, phase: WaterPhase): WaterState {
  return { p, T, h: out[0], s: out[1], v: out[2], cp: out[3], w: out[4], x, region, phase };
}

function phaseOf(region: WaterRegion, p: number, T: number, v: number): WaterPhase {
  if (region === 1) return 'liquid';
  if (p > PC_PA && T > TC_K) return 'supercritical';
  if (region === 3) return 1 / v >= RHOC_KG_PER_M3 ? 'liquid' : 'vapour';
  return 'vapour';
}

// ---------------------------------------------------------------- range checks

function checkT(T_K: number, ctx: string): void {
  if (!(T_K >= T_MIN_K && T_K <= T_MAX_K)) throw new ThermoRangeError('T_K', T_K, `${T_MIN_K}..${T_MAX_K} K`, ctx);
}

function checkP(p_Pa: number, ctx: string, pMax = P_MAX_PA, why = ''): void {
  if (!(p_Pa > 0 && p_Pa <= pMax)) {
    throw new ThermoRangeError('p_Pa', p_Pa, `0 < p_Pa <= ${pMax} Pa${why}`, ctx);
  }
}

function checkPT(p_Pa: number, T_K: number, ctx: string): void {
  checkT(T_K, ctx);
  if (T_K > T_25_K) checkP(p_Pa, ctx, P_MAX_R5_PA, ` (IF97 region 5, ${T_25_K} K < T_K <= ${T_MAX_K} K)`);
  else checkP(p_Pa, ctx);
}

function checkX(x: number, ctx: string): void {
  if (!(x >= 0 && x <= 1)) throw new ThermoRangeError('x', x, '0..1 (vapour mass fraction)', ctx);
}

// ---------------------------------------------------------------- region 3 density

/**
 * Density [kg/m3] of region 3 at p [Pa], T [K] by safeguarded Newton iteration on p(rho,T) of the
 * basic equation, from rho0 on the branch `side` (+1 liquid-like, -1 vapour-like): where
 * dp/drho <= 0 (inside the spinodal) the iterate is pushed toward its branch.
 * @throws NoConvergenceError after 100 iterations
 * @see IAPWS R7-97(2012) Eq. 28 and Table 31 (p = rho R T delta phi_delta)
 */
export function rho3_pT(p_Pa: number, T_K: number, rho0: number, side: 1 | -1 = rho0 >= RHOC_KG_PER_M3 ? 1 : -1): number {
  const tau = TC_K / T_K;
  const RT = R * T_K;
  let rho = rho0;
  let lo = 0;
  let hi = Infinity;
  let F = NaN;
  for (let it = 0; it < 100; it++) {
    const delta = rho / RHOC_KG_PER_M3;
    helmholtz3(delta, tau);
    const dfd = delta * F3[1];
    F = rho * RT * dfd - p_Pa;
    const dp = RT * (2 * dfd + delta * delta * F3[2]);
    // rounding noise of p is a few 1e-16 p; near the critical point (dp/drho -> 0) it limits rho
    if (F === 0 || Math.abs(F) <= 1e-15 * p_Pa || (it >= 50 && Math.abs(F) <= 1e-12 * p_Pa)) return rho;
    let next: number;
    if (dp > 0) {
      if (F < 0) lo = Math.max(lo, rho);
      else hi = Math.min(hi, rho);
      next = rho - F / dp;
    } else {
      next = side > 0 ? rho * 1.02 : rho * 0.98;
    }
    if (next > rho * 1.25) next = rho * 1.25;
    else if (next < rho * 0.8) next = rho * 0.8;
    if (dp > 0 && !(next > lo && next < hi) && hi < Infinity) next = 0.5 * (lo + hi);
    if (Math.abs(next - rho) <= 1e-14 * rho) return next;
    rho = next;
  }
  throw new NoConvergenceError(`region 3 density at p_Pa = ${p_Pa}, T_K = ${T_K}`, 100, F / p_Pa);
}

/** Region 3 density [kg/m3] at p [Pa], T [K] in region 3: SR5-05 v(p,T), polished. */
function rho3(p_Pa: number, T_K: number): number {
  if (T_K === TC_K && p_Pa === PC_PA) return RHOC_KG_PER_M3;
  return rho3_pT(p_Pa, T_K, 1 / v3Backward(p_Pa, T_K));
}

// ---------------------------------------------------------------- forward (p, T)

/** IF97 region (1, 2, 3 or 5) of a checked (p, T). @see IAPWS R7-97(2012) Fig. 1 and Eqs. 5, 30 */
function regionPT(p_Pa: number, T_K: number): 1 | 2 | 3 | 5 {
  if (T_K > T_25_K) return 5;
  if (T_K <= T_13_K) return p_Pa >= psatRaw(T_K) ? 1 : 2;
  return p_Pa > pB23(T_K) ? 3 : 2;
}

/** Fills OUT for a checked (p, T); returns the region. */
function propsPT(p_Pa: number, T_K: number): 1 | 2 | 3 | 5 {
  const r = regionPT(p_Pa, T_K);
  if (r === 1) props1(p_Pa, T_K, OUT);
  else if (r === 2) props2(p_Pa, T_K, OUT);
  else if (r === 5) props5(p_Pa, T_K, OUT);
  else props3(rho3(p_Pa, T_K), T_K, OUT);
  return r;
}

// ---------------------------------------------------------------- saturation

let satKeyP = NaN;
let satKeyT = NaN;

/**
 * Width [K] of the band below the critical temperature in which the saturated phases are scaled
 * toward the critical point instead of solved. Within about 5e-5 K of Tc the region 3 isotherm
 * at p = psat(T) has no vapour root at all (IF97's region 3 and saturation equations meet the
 * critical point only within their tolerances), and just outside that the two roots are too close
 * to separate reliably, so inside the band each saturated property y follows
 * y = y_c + (y(Tb) - y_c) sqrt((Tc - T)/(Tc - Tb)) with Tb = Tc - 10 mK (the mean-field shape of
 * an analytic equation of state near its critical point); cp and w are NaN there.
 */
const T_BAND_K = 0.01;
const BAND_LIQ = new Float64Array(13);
const BAND_VAP = new Float64Array(13);
const CRIT = new Float64Array(13);
let bandReady = false;

/** Saturated liquid and vapour densities of region 3 at T [K], p = psat(T) [Pa], into liq/vap. */
function sat3(p_Pa: number, T_K: number, liq: Float64Array, vap: Float64Array): void {
  const rl = rho3_pT(p_Pa, T_K, 1 / v3SatBackward(p_Pa, T_K, 0), 1);
  const rv = rho3_pT(p_Pa, T_K, 1 / v3SatBackward(p_Pa, T_K, 1), -1);
  if (!(rl > RHOC_KG_PER_M3 && rv < RHOC_KG_PER_M3)) {
    throw new NoConvergenceError(`saturated densities at T_K = ${T_K} (liquid ${rl}, vapour ${rv})`, 0, rl - rv);
  }
  props3(rl, T_K, liq);
  props3(rv, T_K, vap);
}

/** Fills LIQ and VAP with the saturated liquid and vapour at p = psat(T) [Pa], T = Tsat(p) [K]. */
function satProps(p_Pa: number, T_K: number): void {
  if (p_Pa === satKeyP && T_K === satKeyT) return;
  if (p_Pa <= P_SAT_623_PA) {
    props1(p_Pa, T_K, LIQ);
    props2(p_Pa, T_K, VAP);
  } else if (TC_K - T_K >= T_BAND_K) {
    sat3(p_Pa, T_K, LIQ, VAP);
  } else {
    if (!bandReady) {
      const Tb = TC_K - T_BAND_K;
      sat3(psatRaw(Tb), Tb, BAND_LIQ, BAND_VAP);
      props3(RHOC_KG_PER_M3, TC_K, CRIT);
      bandReady = true;
    }
    const f = T_K >= TC_K ? 0 : Math.sqrt((TC_K - T_K) / T_BAND_K);
    for (let k = 0; k < 6; k++) {
      LIQ[k] = CRIT[k] + f * (BAND_LIQ[k] - CRIT[k]);
      VAP[k] = CRIT[k] + f * (BAND_VAP[k] - CRIT[k]);
    }
    // v is scaled through density, the variable in which the coexistence curve is symmetric
    LIQ[2] = 1 / (RHOC_KG_PER_M3 + f * (1 / BAND_LIQ[2] - RHOC_KG_PER_M3));
    VAP[2] = 1 / (RHOC_KG_PER_M3 + f * (1 / BAND_VAP[2] - RHOC_KG_PER_M3));
    LIQ[3] = LIQ[4] = VAP[3] = VAP[4] = NaN;
  }
  satKeyP = p_Pa;
  satKeyT = T_K;
}

/** Fills OUT with the two-phase mixture of LIQ and VAP at vapour fraction x. */
function mix(x: number): void {
  for (let k = 0; k < 3; k++) OUT[k] = LIQ[k] + x * (VAP[k] - LIQ[k]);
  OUT[3] = x === 0 ? LIQ[3] : x === 1 ? VAP[3] : NaN;
  OUT[4] = x === 0 ? LIQ[4] : x === 1 ? VAP[4] : NaN;
  OUT[5] = LIQ[5] + x * (VAP[5] - LIQ[5]);
}

function satPT(p_Pa: number): number {
  return p_Pa >= PC_PA ? TC_K : tsatRaw(p_Pa);
}

function satTP(T_K: number): number {
  return T_K >= TC_K ? PC_PA : psatRaw(T_K);
}

// ---------------------------------------------------------------- inverse (p, h) and (p, s)

type Props = (p_Pa: number, T_K: number, out: Float64Array) => void;
const IDX_H = 0;
const IDX_S = 1;

/** Converged when |h - target| <= 1e-13 (|h| + 100 kJ/kg), or likewise for s with 100 J/(kg K). */
function residualTol(target: number, idx: number): number {
  return 1e-13 * (Math.abs(target) + (idx === IDX_H ? 1e5 : 1e2));
}

/**
 * Newton iteration on T at constant p of the forward equation `fn` (region 1, 2 or 5) so that
 * property `idx` (h or s) equals `target`, bracketed by [lo, hi]; leaves OUT at the returned T.
 */
function solveT(fn: Props, p: number, target: number, idx: number, T0: number, lo: number, hi: number): number {
  let T = T0 >= lo && T0 <= hi ? T0 : 0.5 * (lo + hi);
  let F = NaN;
  const tol = residualTol(target, idx);
  for (let it = 0; it < 100; it++) {
    fn(p, T, OUT);
    F = OUT[idx] - target;
    if (Math.abs(F) <= tol) return T;
    if (F < 0) lo = T;
    else hi = T;
    const d = idx === IDX_H ? OUT[3] : OUT[3] / T;
    let next = T - F / d;
    if (!(next >= lo && next <= hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - T) <= 2e-15 * T) return T; // T resolved to its last bits
    T = next;
  }
  throw new NoConvergenceError(`IF97 T at p_Pa = ${p} for ${idx === IDX_H ? 'h' : 's'} = ${target}`, 100, F);
}

/** As solveT for region 3: T on an isobar, density by rho3_pT on the side fixed by [lo, hi]. */
function solveT3(p: number, target: number, idx: number, T0: number, v0: number, lo: number, hi: number): number {
  let T = T0 >= lo && T0 <= hi ? T0 : 0.5 * (lo + hi);
  let rho = NaN;
  let F = NaN;
  const tol = residualTol(target, idx);
  const vGuess = v0 > 0 ? v0 : v3Backward(p, T);
  for (let it = 0; it < 200; it++) {
    rho = it === 0 ? rho3_pT(p, T, 1 / vGuess, 1 / vGuess >= RHOC_KG_PER_M3 ? 1 : -1) : rho3_pT(p, T, rho);
    props3(rho, T, OUT);
    F = OUT[idx] - target;
    if (Math.abs(F) <= tol) return T;
    if (F < 0) lo = T;
    else hi = T;
    const d = idx === IDX_H ? OUT[3] : OUT[3] / T;
    let next = T - F / d;
    if (!(next >= lo && next <= hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - T) <= 2e-15 * T) return T; // T resolved to its last bits
    // a large jump restarts the density from the backward equation on the right side
    if (Math.abs(next - T) > 2) rho = 1 / v3Backward(p, next);
    T = next;
  }
  throw new NoConvergenceError(`IF97 region 3 T at p_Pa = ${p} for ${idx === IDX_H ? 'h' : 's'} = ${target}`, 200, F);
}

// Helpers of solvePY as module-level functions: closures created per call would cost an
// allocation each (and, under tsx/esbuild keepNames, a defineProperty call each).
function y1(isH: boolean, p: number, T: number): number {
  return isH ? h1(p, T) : s1(p, T);
}
function y2(isH: boolean, p: number, T: number): number {
  return isH ? h2(p, T) : s2(p, T);
}
function y5(isH: boolean, p: number, T: number): number {
  return isH ? h5(p, T) : s5(p, T);
}
/** Lowest h or s of IF97 at p (at 273.15 K). */
function yLow(isH: boolean, p: number): number {
  return p >= P_SAT_MIN_PA ? y1(isH, p, T_MIN_K) : y2(isH, p, T_MIN_K);
}
/** Highest h or s of IF97 at p (at 2273.15 K, or 1073.15 K above 50 MPa). */
function yHigh(isH: boolean, p: number): number {
  return p <= P_MAX_R5_PA ? y5(isH, p, T_MAX_K) : y2(isH, p, T_25_K);
}
/**
 * Slack of a bound: 1e-9 of (|bound| + 1 kJ/kg or 1 J/(kg K)), so that a value computed at a
 * corner of the range (e.g. s at 273.15 K) is not refused for its last rounding bits.
 */
function slack(isH: boolean, b: number): number {
  return 1e-9 * (Math.abs(b) + (isH ? 1e3 : 1));
}
function below(isH: boolean, y: number, b: number): boolean {
  return y < b - slack(isH, b);
}
function above(isH: boolean, y: number, b: number): boolean {
  return y > b + slack(isH, b);
}
function rangeFail(isH: boolean, p: number, y: number, ctx: string): ThermoRangeError {
  return new ThermoRangeError(
    isH ? 'h_J_per_kg' : 's_J_per_kgK', y,
    `${yLow(isH, p)}..${yHigh(isH, p)} ${isH ? 'J/kg' : 'J/(kg K)'} at p_Pa = ${p}`, ctx,
  );
}
function T12guess(isH: boolean, region: 1 | 2, p: number, y: number): number {
  if (region === 1) return isH ? T1_ph(p, y) : T1_ps(p, y);
  return isH ? T2_ph(p, y) : T2_ps(p, y);
}

/** Region 2 from T_lo [K] up to 1073.15 K, else region 5 (h or s given at p). */
function solveVapour(isH: boolean, p: number, y: number, idx: number, Tlo: number, ctx: string): 2 | 5 {
  const y25 = y2(isH, p, T_25_K);
  if (!above(isH, y, y25)) {
    resT = solveT(props2, p, y, idx, T12guess(isH, 2, p, y), Tlo, T_25_K);
    return 2;
  }
  if (p > P_MAX_R5_PA || above(isH, y, y5(isH, p, T_MAX_K))) throw rangeFail(isH, p, y, ctx);
  // start from cp of about 2.3 kJ/(kg K) above 1073.15 K
  const T0 = isH ? T_25_K + (y - y25) / 2300 : T_25_K * Math.exp((y - y25) / 2300);
  resT = solveT(props5, p, y, idx, T0, T_25_K, T_MAX_K);
  return 5;
}

/**
 * Core of ph and ps: fills OUT (h, s, v, cp, w, u), sets resT and resX, returns the region.
 * idx = IDX_H for (p, h), IDX_S for (p, s). Ties at a region boundary (within rounding) go to
 * the lower region, as in water.pt.
 */
function solvePY(p: number, y: number, idx: number, ctx: string): WaterRegion {
  checkP(p, ctx);
  const isH = idx === IDX_H;
  resX = NaN;
  if (!Number.isFinite(y)) throw rangeFail(isH, p, y, ctx);

  if (p < P_SAT_MIN_PA) {
    if (below(isH, y, y2(isH, p, T_MIN_K))) throw rangeFail(isH, p, y, ctx);
    return solveVapour(isH, p, y, idx, T_MIN_K, ctx);
  }
  if (p <= P_SAT_623_PA) {
    const Ts = tsatRaw(p);
    satProps(p, Ts);
    if (y <= LIQ[idx]) {
      if (below(isH, y, y1(isH, p, T_MIN_K))) throw rangeFail(isH, p, y, ctx);
      resT = solveT(props1, p, y, idx, T12guess(isH, 1, p, y), T_MIN_K, Ts);
      return 1;
    }
    if (y < VAP[idx]) {
      const x = (y - LIQ[idx]) / (VAP[idx] - LIQ[idx]);
      mix(x);
      resT = Ts;
      resX = x;
      return 4;
    }
    return solveVapour(isH, p, y, idx, Ts, ctx);
  }
  // p above psat(623.15 K): regions 1, 3 (with 4 below pc) and 2 split by the B23 line
  if (!above(isH, y, y1(isH, p, T_13_K))) {
    if (below(isH, y, y1(isH, p, T_MIN_K))) throw rangeFail(isH, p, y, ctx);
    resT = solveT(props1, p, y, idx, T12guess(isH, 1, p, y), T_MIN_K, T_13_K);
    return 1;
  }
  const TB = Math.max(T_13_K, tB23(p));
  if (!below(isH, y, y2(isH, p, TB))) return solveVapour(isH, p, y, idx, TB, ctx);
  const T3 = isH ? T3_ph(p, y) : T3_ps(p, y);
  const v3 = isH ? v3_ph(p, y) : v3_ps(p, y);
  if (p < PC_PA) {
    const Ts = tsatRaw(p);
    satProps(p, Ts);
    if (y <= LIQ[idx]) {
      resT = solveT3(p, y, idx, T3, v3, T_13_K, Ts);
      return 3;
    }
    if (y < VAP[idx]) {
      const x = (y - LIQ[idx]) / (VAP[idx] - LIQ[idx]);
      mix(x);
      resT = Ts;
      resX = x;
      return 4;
    }
    resT = solveT3(p, y, idx, T3, v3, Ts, TB);
    return 3;
  }
  resT = solveT3(p, y, idx, T3, v3, T_13_K, TB);
  return 3;
}

function stateFromCore(p: number, region: WaterRegion): WaterState {
  if (region === 4) return mk(p, resT, OUT, resX, 4, 'two-phase');
  return mk(p, resT, OUT, null, region, phaseOf(region, p, resT, OUT[2]));
}

// ---------------------------------------------------------------- public API

/**
 * State of water at pressure and temperature (single phase; on the saturation line p = psat(T)
 * the liquid is returned).
 * @param p_Pa pressure [Pa]; 0 < p <= 100 MPa for T <= 1073.15 K, 0 < p <= 50 MPa above
 * @param T_K temperature [K]; 273.15 K..2273.15 K
 * @returns state in SI base units (x null)
 * @throws ThermoRangeError naming p_Pa or T_K when outside IF97's range
 * @throws NoConvergenceError if the region 3 density iteration fails (not seen in tests)
 * @see IAPWS R7-97(2012) Eqs. 7, 15, 28, 32; region 3 by IAPWS SR5-05(2016) v(p,T) polished by
 *   Newton iteration on Eq. 28
 */
function pt(p_Pa: number, T_K: number): WaterState {
  checkPT(p_Pa, T_K, 'water.pt');
  const r = propsPT(p_Pa, T_K);
  return mk(p_Pa, T_K, OUT, null, r, phaseOf(r, p_Pa, T_K, OUT[2]));
}

/**
 * State of water at pressure and specific enthalpy. Liquid, two-phase or vapour is decided from the
 * saturation properties at p; regions 1 and 2 start from the backward equations T(p,h), region 3
 * from SR3-03 T(p,h) and v(p,h), region 5 from a linear estimate; all are polished by Newton
 * iteration on the forward equation (|h(p,T) - h| <= 1e-13 (|h| + 100 kJ/kg)).
 * @param p_Pa pressure [Pa]; 0 < p <= 100 MPa
 * @param h_J_per_kg specific enthalpy [J/kg]; from h(p, 273.15 K) to h(p, 2273.15 K) (to
 *   h(p, 1073.15 K) above 50 MPa)
 * @throws ThermoRangeError naming p_Pa or h_J_per_kg (with the range at that p)
 * @see IAPWS R7-97(2012) Eqs. 11, 22-24; IAPWS SR3-03(2014) Eqs. 2-5
 */
function ph(p_Pa: number, h_J_per_kg: number): WaterState {
  return stateFromCore(p_Pa, solvePY(p_Pa, h_J_per_kg, IDX_H, 'water.ph'));
}

/**
 * State of water at pressure and specific entropy (as `ph`, with the backward equations T(p,s)).
 * @param p_Pa pressure [Pa]; 0 < p <= 100 MPa
 * @param s_J_per_kgK specific entropy [J/(kg K)]; from s(p, 273.15 K) to s(p, 2273.15 K) (to
 *   s(p, 1073.15 K) above 50 MPa)
 * @throws ThermoRangeError naming p_Pa or s_J_per_kgK
 * @see IAPWS R7-97(2012) Eqs. 13, 25-27; IAPWS SR3-03(2014) Eqs. 6-9
 */
function ps(p_Pa: number, s_J_per_kgK: number): WaterState {
  return stateFromCore(p_Pa, solvePY(p_Pa, s_J_per_kgK, IDX_S, 'water.ps'));
}

/**
 * Two-phase state at saturation pressure and vapour fraction. Above psat(623.15 K) the saturated
 * phases come from the region 3 equation solved for density at (p, Tsat(p)); at the critical
 * pressure both phases are the critical point.
 * @param p_Pa pressure [Pa]; 611.213 Pa (psat(273.15 K)) .. 22.064 MPa
 * @param x vapour mass fraction [-]; 0..1
 * @returns region 4 state; cp and w NaN for 0 < x < 1
 * @throws ThermoRangeError naming p_Pa or x
 * @see IAPWS R7-97(2012) Eq. 31
 */
function px(p_Pa: number, x: number): WaterState {
  if (!(p_Pa >= P_SAT_MIN_PA && p_Pa <= PC_PA)) {
    throw new ThermoRangeError('p_Pa', p_Pa, `${P_SAT_MIN_PA}..${PC_PA} Pa (saturation line)`, 'water.px');
  }
  checkX(x, 'water.px');
  const T = satPT(p_Pa);
  satProps(p_Pa, T);
  mix(x);
  return mk(p_Pa, T, OUT, x, 4, 'two-phase');
}

/**
 * Two-phase state at saturation temperature and vapour fraction (see `px`).
 * @param T_K temperature [K]; 273.15 K..647.096 K
 * @param x vapour mass fraction [-]; 0..1
 * @throws ThermoRangeError naming T_K or x
 * @see IAPWS R7-97(2012) Eq. 30
 */
function tx(T_K: number, x: number): WaterState {
  if (!(T_K >= T_MIN_K && T_K <= TC_K)) {
    throw new ThermoRangeError('T_K', T_K, `${T_MIN_K}..${TC_K} K (saturation line)`, 'water.tx');
  }
  checkX(x, 'water.tx');
  const p = satTP(T_K);
  satProps(p, T_K);
  mix(x);
  return mk(p, T_K, OUT, x, 4, 'two-phase');
}

/**
 * Saturation pressure [Pa].
 * @param T_K temperature [K]; 273.15 K..647.096 K
 * @throws ThermoRangeError naming T_K
 * @see IAPWS R7-97(2012) Eq. 30
 */
function psat(T_K: number): number {
  if (!(T_K >= T_MIN_K && T_K <= TC_K)) throw new ThermoRangeError('T_K', T_K, `${T_MIN_K}..${TC_K} K`, 'water.psat');
  return psatRaw(T_K);
}

/**
 * Saturation temperature [K].
 * @param p_Pa pressure [Pa]; 611.213 Pa..22.064 MPa
 * @throws ThermoRangeError naming p_Pa
 * @see IAPWS R7-97(2012) Eq. 31
 */
function tsat(p_Pa: number): number {
  if (!(p_Pa >= P_SAT_MIN_PA && p_Pa <= PC_PA)) {
    throw new ThermoRangeError('p_Pa', p_Pa, `${P_SAT_MIN_PA}..${PC_PA} Pa`, 'water.tsat');
  }
  return tsatRaw(p_Pa);
}

/**
 * Region 3 basic equation evaluated at density and temperature (no density solve, no check
 * that (rho, T) lies in region 3 beyond the bounds below).
 * @param rho_kg_per_m3 density [kg/m3]; > 0 and <= 1200
 * @param T_K temperature [K]; 623.15 K..1073.15 K
 * @throws ThermoRangeError naming rho_kg_per_m3 or T_K
 * @see IAPWS R7-97(2012) Eq. 28, Table 31
 */
function region3(rho_kg_per_m3: number, T_K: number): WaterState {
  if (!(rho_kg_per_m3 > 0 && rho_kg_per_m3 <= 1200)) {
    throw new ThermoRangeError('rho_kg_per_m3', rho_kg_per_m3, '0 < rho <= 1200 kg/m3', 'water.region3');
  }
  if (!(T_K >= T_13_K && T_K <= T_25_K)) throw new ThermoRangeError('T_K', T_K, `${T_13_K}..${T_25_K} K`, 'water.region3');
  props3(rho_kg_per_m3, T_K, OUT);
  const p = OUT[6];
  return mk(p, T_K, OUT, null, 3, phaseOf(3, p, T_K, OUT[2]));
}

/** Specific enthalpy [J/kg] at p [Pa], T [K] without allocating (ranges and errors as `pt`). */
function h_pt(p_Pa: number, T_K: number): number {
  checkPT(p_Pa, T_K, 'water.h_pt');
  propsPT(p_Pa, T_K);
  return OUT[0];
}
/** Specific entropy [J/(kg K)] at p [Pa], T [K] without allocating (as `pt`). */
function s_pt(p_Pa: number, T_K: number): number {
  checkPT(p_Pa, T_K, 'water.s_pt');
  propsPT(p_Pa, T_K);
  return OUT[1];
}
/**
 * Specific enthalpy [J/kg] and entropy [J/(kg K)] at p [Pa], T [K] into `out`, without allocating: the
 * same numbers as `pt` (one evaluation, ranges and errors as `pt`); returns the phase as `pt` gives it.
 */
function hs_pt(p_Pa: number, T_K: number, out: { h: number; s: number }): WaterPhase {
  checkPT(p_Pa, T_K, 'water.pt');
  const r = propsPT(p_Pa, T_K);
  out.h = OUT[0];
  out.s = OUT[1];
  return phaseOf(r, p_Pa, T_K, OUT[2]);
}
/**
 * T, h, s and the vapour fraction (null outside the two-phase region) at p [Pa], h [J/kg] into `out`
 * without allocating (the figures of `ph`); returns the phase as `ph` gives it.
 */
function ths_ph(p_Pa: number, h_J_per_kg: number, out: { T: number; h: number; s: number; x: number | null }): WaterPhase {
  const region = solvePY(p_Pa, h_J_per_kg, IDX_H, 'water.ph');
  out.T = resT;
  out.h = OUT[0];
  out.s = OUT[1];
  if (region === 4) {
    out.x = resX;
    return 'two-phase';
  }
  out.x = null;
  return phaseOf(region, p_Pa, resT, OUT[2]);
}
/** Specific volume [m3/kg] at p [Pa], T [K] without allocating (as `pt`). */
function v_pt(p_Pa: number, T_K: number): number {
  checkPT(p_Pa, T_K, 'water.v_pt');
  propsPT(p_Pa, T_K);
  return OUT[2];
}
/** Isobaric heat capacity [J/(kg K)] at p [Pa], T [K] without allocating (as `pt`). */
function cp_pt(p_Pa: number, T_K: number): number {
  checkPT(p_Pa, T_K, 'water.cp_pt');
  propsPT(p_Pa, T_K);
  return OUT[3];
}
/** Temperature [K] at p [Pa], h [J/kg] without allocating (as `ph`; Tsat in the two-phase region). */
function T_ph(p_Pa: number, h_J_per_kg: number): number {
  solvePY(p_Pa, h_J_per_kg, IDX_H, 'water.T_ph');
  return resT;
}
/** Specific entropy [J/(kg K)] at p [Pa], h [J/kg] without allocating (as `ph`). */
function s_ph(p_Pa: number, h_J_per_kg: number): number {
  solvePY(p_Pa, h_J_per_kg, IDX_H, 'water.s_ph');
  return OUT[1];
}
/** Temperature [K] at p [Pa], s [J/(kg K)] without allocating (as `ps`). */
function T_ps(p_Pa: number, s_J_per_kgK: number): number {
  solvePY(p_Pa, s_J_per_kgK, IDX_S, 'water.T_ps');
  return resT;
}
/** Specific enthalpy [J/kg] at p [Pa], s [J/(kg K)] without allocating (as `ps`). */
function h_ps(p_Pa: number, s_J_per_kgK: number): number {
  solvePY(p_Pa, s_J_per_kgK, IDX_S, 'water.h_ps');
  return OUT[0];
}

/**
 * Water and steam by IAPWS-IF97. State functions return a fresh `WaterState`; the `*_pt`, `*_ph`,
 * `*_ps` functions return one number and allocate nothing (for hot loops).
 */
export const water = {
  pt, ph, ps, px, tx, psat, tsat, region3,
  h_pt, s_pt, hs_pt, ths_ph, v_pt, cp_pt, T_ph, s_ph, T_ps, h_ps,
} as const;
