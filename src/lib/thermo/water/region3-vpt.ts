/**
 * IAPWS-IF97 region 3 backward equations v(p,T): the subregion boundary equations and the 26
 * subregion equations 3a..3z (including the auxiliary equations 3u..3z of the near-critical range).
 * Their result is a starting value; water.pt polishes it on the basic equation f(rho,T).
 * @see IAPWS SR5-05(2016) Revised Supplementary Release on Backward Equations for Specific Volume
 *   as a Function of Pressure and Temperature v(p,T) for Region 3, Eqs. (1)-(5), Tables 2 and 10
 */
import { R3_BOUNDARY, R3_BOUNDARY_AB, R3_BOUNDARY_OP, R3_BOUNDARY_WX, R3V } from './coefficients';
import { tsatRaw } from './saturation';

/** Subregion letters of SR5-05. */
export type Subregion3 = keyof typeof R3V;

interface SubEq {
  vs: number; ps: number; Ts: number; a: number; b: number; c: number; d: number; e: number;
  isN: boolean; I: Int32Array; J: Int32Array; n: Float64Array;
  iMin: number; iMax: number; jMin: number; jMax: number;
}

const OFF = 16;
const PA = new Float64Array(64);
const PB = new Float64Array(64);

const SUB: Record<string, SubEq> = {};
for (const key of Object.keys(R3V) as Subregion3[]) {
  const { par, I, J, n } = R3V[key];
  SUB[key] = {
    vs: par[0], ps: par[1], Ts: par[2], a: par[3], b: par[4], c: par[5], d: par[6], e: par[7],
    isN: key === 'n',
    I: Int32Array.from(I), J: Int32Array.from(J), n: Float64Array.from(n),
    iMin: Math.min(...I), iMax: Math.max(...I), jMin: Math.min(...J), jMax: Math.max(...J),
  };
}

function fillPowers(buf: Float64Array, x: number, lo: number, hi: number): void {
  buf[OFF] = 1;
  for (let k = 1; k <= hi; k++) buf[OFF + k] = buf[OFF + k - 1] * x;
  if (lo < 0) {
    const ix = 1 / x;
    for (let k = -1; k >= lo; k--) buf[OFF + k] = buf[OFF + k + 1] * ix;
  }
}

/**
 * Specific volume [m3/kg] by the backward equation of one subregion at p [Pa], T [K].
 * @see IAPWS SR5-05(2016) Eq. (4) (Eq. (5) for subregion 3n)
 */
export function v3Sub(sub: Subregion3, p_Pa: number, T_K: number): number {
  const q = SUB[sub];
  const pi = p_Pa / 1e6 / q.ps;
  const th = T_K / q.Ts;
  let A = pi - q.a;
  let B = th - q.b;
  if (!q.isN) {
    if (q.c === 0.5) A = Math.sqrt(A);
    if (q.d === 0.25) B = Math.sqrt(Math.sqrt(B));
  }
  fillPowers(PA, A, q.iMin, q.iMax);
  fillPowers(PB, B, q.jMin, q.jMax);
  let sum = 0;
  for (let k = 0; k < q.n.length; k++) sum += q.n[k] * PA[OFF + q.I[k]] * PB[OFF + q.J[k]];
  if (q.isN) return q.vs * Math.exp(sum);
  if (q.e === 4) {
    const s2 = sum * sum;
    return q.vs * s2 * s2;
  }
  return q.vs * sum;
}

type PolyKey = keyof typeof R3_BOUNDARY;

/** Subregion boundary temperature [K] T(p) as a polynomial in p [MPa], SR5-05 Eq. (1). */
export function tBoundary(key: PolyKey, p_MPa: number): number {
  const n = R3_BOUNDARY[key];
  let t = 0;
  for (let i = n.length - 1; i >= 0; i--) t = t * p_MPa + n[i];
  return t;
}

function tLog(c: { I: readonly number[]; n: readonly number[] }, p_MPa: number): number {
  const l = Math.log(p_MPa);
  let t = 0;
  for (let k = 0; k < c.n.length; k++) t += c.n[k] * Math.pow(l, c.I[k]);
  return t;
}

/** 3a/3b (and 3d/3e) boundary T(p) [K], p in MPa, SR5-05 Eq. (2). */
export const tAB = (p_MPa: number): number => tLog(R3_BOUNDARY_AB, p_MPa);
/** 3o/3p boundary T(p) [K], p in MPa, SR5-05 Eq. (2). */
export const tOP = (p_MPa: number): number => tLog(R3_BOUNDARY_OP, p_MPa);
/** 3w/3x boundary T(p) [K], p in MPa, SR5-05 Eq. (2). */
export const tWX = (p_MPa: number): number => tLog(R3_BOUNDARY_WX, p_MPa);
/** 3e/3f boundary T(p) [K], p in MPa, SR5-05 Eq. (3). */
export const tEF = (p_MPa: number): number => 3.727888004 * (p_MPa - 22.064) + 647.096;

/** psat(643.15 K) [MPa] and p at the 3c/3d boundary meeting saturation [MPa], SR5-05. */
const P_SAT_643_MPA = 21.04336732;
const P_3CD_MPA = 19.00881189173929;

/**
 * The region 3 subregion containing (p, T), by the boundary equations of SR5-05 Table 2 and,
 * in the near-critical range, Table 10. Assumes (p, T) lies in region 3.
 */
export function subregion3(p_Pa: number, T_K: number): Subregion3 {
  const p = p_Pa / 1e6;
  const T = T_K;
  if (p > 40) return T <= tAB(p) ? 'a' : 'b';
  if (p > 25) {
    if (T <= tBoundary('cd', p)) return 'c';
    if (T <= tAB(p)) return 'd';
    if (T <= tEF(p)) return 'e';
    return 'f';
  }
  if (p > 23.5) {
    if (T <= tBoundary('cd', p)) return 'c';
    if (T <= tBoundary('gh', p)) return 'g';
    if (T <= tEF(p)) return 'h';
    if (T <= tBoundary('ij', p)) return 'i';
    if (T <= tBoundary('jk', p)) return 'j';
    return 'k';
  }
  if (p > 23) {
    if (T <= tBoundary('cd', p)) return 'c';
    if (T <= tBoundary('gh', p)) return 'l';
    if (T <= tEF(p)) return 'h';
    if (T <= tBoundary('ij', p)) return 'i';
    if (T <= tBoundary('jk', p)) return 'j';
    return 'k';
  }
  if (p > 22.5) {
    if (T <= tBoundary('cd', p)) return 'c';
    if (T <= tBoundary('gh', p)) return 'l';
    if (T <= tBoundary('mn', p)) return 'm';
    if (T <= tEF(p)) return 'n';
    if (T <= tOP(p)) return 'o';
    if (T <= tBoundary('ij', p)) return 'p';
    if (T <= tBoundary('jk', p)) return 'j';
    return 'k';
  }
  if (p > P_SAT_643_MPA) {
    if (T <= tBoundary('cd', p)) return 'c';
    if (T <= tBoundary('qu', p)) return 'q';
    if (T <= tBoundary('rx', p)) {
      // near-critical auxiliary subregions, SR5-05 Table 10
      if (p > 22.11) {
        if (T <= tBoundary('uv', p)) return 'u';
        if (T <= tEF(p)) return 'v';
        if (T <= tWX(p)) return 'w';
        return 'x';
      }
      if (p > 22.064) {
        if (T <= tBoundary('uv', p)) return 'u';
        if (T <= tEF(p)) return 'y';
        if (T <= tWX(p)) return 'z';
        return 'x';
      }
      if (T > tsatRaw(p_Pa)) {
        if (p <= 21.90096265) return 'x';
        return T <= tWX(p) ? 'z' : 'x';
      }
      if (p <= 21.93161551) return 'u';
      return T <= tBoundary('uv', p) ? 'u' : 'y';
    }
    if (T <= tBoundary('jk', p)) return 'r';
    return 'k';
  }
  if (p > 20.5) {
    if (T <= tBoundary('cd', p)) return 'c';
    if (T <= tsatRaw(p_Pa)) return 's';
    if (T <= tBoundary('jk', p)) return 'r';
    return 'k';
  }
  if (p > P_3CD_MPA) {
    if (T <= tBoundary('cd', p)) return 'c';
    if (T <= tsatRaw(p_Pa)) return 's';
    return 't';
  }
  return T <= tsatRaw(p_Pa) ? 'c' : 't';
}

/**
 * Backward specific volume [m3/kg] of region 3 at p [Pa], T [K] (no polishing, no range check).
 * @see IAPWS SR5-05(2016)
 */
export function v3Backward(p_Pa: number, T_K: number): number {
  return v3Sub(subregion3(p_Pa, T_K), p_Pa, T_K);
}

/**
 * Backward specific volume [m3/kg] of saturated liquid (side 0) or vapour (side 1) in region 3 at
 * p [Pa] and T = Tsat(p) [K], using the subregion next to the saturation line on that side.
 * @see IAPWS SR5-05(2016) Table 2 and Table 10
 */
export function v3SatBackward(p_Pa: number, T_K: number, side: 0 | 1): number {
  const p = p_Pa / 1e6;
  let sub: Subregion3;
  if (side === 0) sub = p < P_3CD_MPA ? 'c' : p < P_SAT_643_MPA ? 's' : p < 21.93161551 ? 'u' : 'y';
  else sub = p < 20.5 ? 't' : p < P_SAT_643_MPA ? 'r' : p < 21.90096265 ? 'x' : 'z';
  return v3Sub(sub, p_Pa, T_K);
}
