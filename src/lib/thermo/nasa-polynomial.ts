/**
 * The NASA Glenn 9-coefficient polynomials, precombined for evaluation: the constants and range of
 * the ideal-gas model, one temperature range scaled to the wanted unit, cp, h and s0 of it, and the
 * safeguarded Newton iteration that inverts them. gas.ts builds species and mixtures on these and
 * re-exports the constants.
 *
 * @see McBride, Zehe & Gordon, NASA/TP-2002-211556 (2002), eqs. 4.9-4.11 (9-coefficient form).
 */
import { NoConvergenceError, requireRange } from './errors';
import type { NasaRange, NasaSpeciesData } from './species-data';

/** Molar gas constant [J/(mol K)]: exact since the 2019 SI, N_A k = 8.314 462 618 153 24 (CODATA 2018 prints 8.314462618). */
export const R_J_per_molK = 8.31446261815324;
/** Standard-state (reference) pressure of the NASA data and of the mixture entropy [Pa]. */
export const P_REF_Pa = 1e5;
/** Reference temperature of formation enthalpies [K]. */
export const T_REF_K = 298.15;
/** Validity range of the polynomials [K]. */
export const T_MIN_K = 200;
export const T_MAX_K = 6000;
/** Pressure range accepted by entropy functions [Pa]; ideal-gas behaviour is the caller's judgement. */
export const P_MIN_Pa = 1;
export const P_MAX_Pa = 1e8;

/** Precombined polynomial of one temperature range, already scaled to the wanted unit. */
export interface ScaledRange {
  /** cp = sum cpc[k] T^(k-2), k = 0..6 */
  readonly cpc: Float64Array;
  /** h = -cpc0/T + cpc1 ln T + cpc2 T + cpc3 T^2/2 + ... + b1 (stored as hc[0..7]) */
  readonly hc: Float64Array;
  /** s0 = -cpc0/(2T^2) - cpc1/T + cpc2 ln T + cpc3 T + ... + b2 (stored as sc[0..7]) */
  readonly sc: Float64Array;
}

export function scaleRange(a: readonly number[], b: readonly number[], factor: number): ScaledRange {
  const cpc = new Float64Array(7);
  const hc = new Float64Array(8);
  const sc = new Float64Array(8);
  for (let k = 0; k < 7; k++) cpc[k] = a[k] * factor;
  hc[0] = -a[0] * factor;
  hc[1] = a[1] * factor;
  hc[2] = a[2] * factor;
  hc[3] = (a[3] / 2) * factor;
  hc[4] = (a[4] / 3) * factor;
  hc[5] = (a[5] / 4) * factor;
  hc[6] = (a[6] / 5) * factor;
  hc[7] = b[0] * factor;
  sc[0] = (-a[0] / 2) * factor;
  sc[1] = -a[1] * factor;
  sc[2] = a[2] * factor;
  sc[3] = a[3] * factor;
  sc[4] = (a[4] / 2) * factor;
  sc[5] = (a[5] / 3) * factor;
  sc[6] = (a[6] / 4) * factor;
  sc[7] = b[1] * factor;
  return { cpc, hc, sc };
}

export function evalCp(r: ScaledRange, T: number): number {
  const c = r.cpc;
  const iT = 1 / T;
  return c[0] * iT * iT + c[1] * iT + c[2] + T * (c[3] + T * (c[4] + T * (c[5] + T * c[6])));
}

export function evalH(r: ScaledRange, T: number): number {
  const c = r.hc;
  return c[0] / T + c[1] * Math.log(T) + T * (c[2] + T * (c[3] + T * (c[4] + T * (c[5] + T * c[6])))) + c[7];
}

export function evalS(r: ScaledRange, T: number): number {
  const c = r.sc;
  const iT = 1 / T;
  return c[0] * iT * iT + c[1] * iT + c[2] * Math.log(T) + T * (c[3] + T * (c[4] + T * (c[5] + T * c[6]))) + c[7];
}

export const T_MID_K = 1000;

export function checkT(T_K: number, context: string): void {
  requireRange('T_K', T_K, T_MIN_K, T_MAX_K, 'K', context);
}

export function checkP(p_Pa: number, context: string): void {
  requireRange('p_Pa', p_Pa, P_MIN_Pa, P_MAX_Pa, 'Pa', context);
}

/** A pair of scaled ranges with the NASA breakpoint at 1000 K. */
export interface ScaledPolynomial {
  readonly low: ScaledRange;
  readonly high: ScaledRange;
}

export function scalePolynomial(data: NasaSpeciesData, factor: number): ScaledPolynomial {
  const [lo, hi] = data.ranges;
  assertRanges(lo, hi);
  return { low: scaleRange(lo.a, lo.b, factor), high: scaleRange(hi.a, hi.b, factor) };
}

function assertRanges(lo: NasaRange, hi: NasaRange): void {
  if (lo.Tmin_K > T_MIN_K || lo.Tmax_K !== T_MID_K || hi.Tmin_K !== T_MID_K || hi.Tmax_K < T_MAX_K) {
    throw new Error('NASA data block does not cover 200-1000-6000 K');
  }
}

export function pick(p: ScaledPolynomial, T: number): ScaledRange {
  return T <= T_MID_K ? p.low : p.high;
}

/** Safeguarded Newton iteration on [T_MIN_K, T_MAX_K] for a monotonically increasing f. */
export function solveT(f: (T: number) => number, df: (T: number) => number, what: string): number {
  let lo = T_MIN_K;
  let hi = T_MAX_K;
  let T = 500;
  let r = f(T);
  for (let i = 0; i < 60; i++) {
    if (r > 0) hi = T;
    else lo = T;
    let next = T - r / df(T);
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    const step = Math.abs(next - T);
    T = next;
    r = f(T);
    if (step < 1e-10 * T || r === 0) return T;
  }
  throw new NoConvergenceError(what, 60, r);
}
