/**
 * IAPWS-IF97 backward equations T(p,h), T(p,s) for regions 1, 2 (subregions 2a, 2b, 2c) and 3
 * (with v(p,h), v(p,s) for 3a, 3b). They give starting values that water.ph and water.ps polish
 * by Newton iteration on the basic equations, so their results agree with the forward equations
 * to rounding.
 * @see IAPWS R7-97(2012) Eqs. 11, 13, 22-24, 25-27; IAPWS SR3-03(2014) Eqs. 2-3, 4-5, 6-7, 8-9
 */
import {
  B1_TPH, B1_TPS, B2A_TPH, B2B_TPH, B2C_TPH, B2A_TPS, B2B_TPS, B2C_TPS,
  B3A_TPH, B3B_TPH, B3A_VPH, B3B_VPH, B3A_TPS, B3B_TPS, B3A_VPS, B3B_VPS,
} from './coefficients';
import { hB2bc, hB3ab, S_B3AB_J_PER_KGK } from './saturation';

const OFF = 40;
const PX = new Float64Array(96);
const PY = new Float64Array(96);

/** Sum of n x^I y^J with integer exponents (after scaling I by iScale) by power tables. */
class Poly {
  private readonly I: Int32Array;
  private readonly J: Int32Array;
  private readonly n: Float64Array;
  private readonly iMin: number;
  private readonly iMax: number;
  private readonly jMin: number;
  private readonly jMax: number;
  constructor(c: { I: readonly number[]; J: readonly number[]; n: readonly number[] }, iScale = 1) {
    this.I = Int32Array.from(c.I, (i) => Math.round(i * iScale));
    this.J = Int32Array.from(c.J);
    this.n = Float64Array.from(c.n);
    this.iMin = Math.min(...this.I);
    this.iMax = Math.max(...this.I);
    this.jMin = Math.min(...this.J);
    this.jMax = Math.max(...this.J);
  }
  eval(x: number, y: number): number {
    fill(PX, x, this.iMin, this.iMax);
    fill(PY, y, this.jMin, this.jMax);
    let s = 0;
    const I = this.I, J = this.J, n = this.n;
    for (let k = 0; k < n.length; k++) s += n[k] * PX[OFF + I[k]] * PY[OFF + J[k]];
    return s;
  }
}

/** x^k for k = lo..hi into buf[OFF + k], by four interleaved chains (x^k = x^(k-4) x^4). */
function fill(buf: Float64Array, x: number, lo: number, hi: number): void {
  const x2 = x * x;
  const x4 = x2 * x2;
  buf[OFF] = 1;
  buf[OFF + 1] = x;
  buf[OFF + 2] = x2;
  buf[OFF + 3] = x2 * x;
  for (let k = 4; k <= hi; k++) buf[OFF + k] = buf[OFF + k - 4] * x4;
  if (lo < 0) {
    const ix = 1 / x;
    const ix2 = ix * ix;
    const ix4 = ix2 * ix2;
    buf[OFF - 1] = ix;
    buf[OFF - 2] = ix2;
    buf[OFF - 3] = ix2 * ix;
    buf[OFF - 4] = ix4;
    for (let k = -5; k >= lo; k--) buf[OFF + k] = buf[OFF + k + 4] * ix4;
  }
}

const P1H = new Poly(B1_TPH), P1S = new Poly(B1_TPS);
const P2AH = new Poly(B2A_TPH), P2BH = new Poly(B2B_TPH), P2CH = new Poly(B2C_TPH);
const P2AS = new Poly(B2A_TPS, 4), P2BS = new Poly(B2B_TPS), P2CS = new Poly(B2C_TPS);
const P3AH = new Poly(B3A_TPH), P3BH = new Poly(B3B_TPH), V3AH = new Poly(B3A_VPH), V3BH = new Poly(B3B_VPH);
const P3AS = new Poly(B3A_TPS), P3BS = new Poly(B3B_TPS), V3AS = new Poly(B3A_VPS), V3BS = new Poly(B3B_VPS);

/** Region 1 backward T [K] at p [Pa], h [J/kg]. @see IAPWS R7-97(2012) Eq. 11 */
export function T1_ph(p_Pa: number, h_J_per_kg: number): number {
  return P1H.eval(p_Pa / 1e6, h_J_per_kg / 2500e3 + 1);
}

/** Region 1 backward T [K] at p [Pa], s [J/(kg K)]. @see IAPWS R7-97(2012) Eq. 13 */
export function T1_ps(p_Pa: number, s_J_per_kgK: number): number {
  return P1S.eval(p_Pa / 1e6, s_J_per_kgK / 1e3 + 2);
}

/** Region 2 subregion (a, b or c) of the backward T(p,h) equations. @see IAPWS R7-97(2012) section 6.3.1 */
export function subregion2_ph(p_Pa: number, h_J_per_kg: number): 'a' | 'b' | 'c' {
  if (p_Pa <= 4e6) return 'a';
  return h_J_per_kg >= hB2bcSafe(p_Pa) ? 'b' : 'c';
}

function hB2bcSafe(p_Pa: number): number {
  // B2bc starts at 6.546699678 MPa (h = 2652.66 kJ/kg); between 4 MPa and that pressure all of
  // region 2 lies in subregion 2b (saturated vapour there has h > 2.77 MJ/kg).
  return p_Pa < 6.546699678e6 ? -Infinity : hB2bc(p_Pa);
}

/** Region 2 backward T [K] at p [Pa], h [J/kg], subregions 2a/2b/2c. @see IAPWS R7-97(2012) Eqs. 22-24 */
export function T2_ph(p_Pa: number, h_J_per_kg: number): number {
  const pi = p_Pa / 1e6;
  const eta = h_J_per_kg / 2000e3;
  switch (subregion2_ph(p_Pa, h_J_per_kg)) {
    case 'a': return P2AH.eval(pi, eta - 2.1);
    case 'b': return P2BH.eval(pi - 2, eta - 2.6);
    default: return P2CH.eval(pi + 25, eta - 1.8);
  }
}

/** Region 2 subregion of the backward T(p,s) equations (2b/2c split at s = 5.85 kJ/(kg K)). */
export function subregion2_ps(p_Pa: number, s_J_per_kgK: number): 'a' | 'b' | 'c' {
  if (p_Pa <= 4e6) return 'a';
  return s_J_per_kgK >= 5.85e3 ? 'b' : 'c';
}

/** Region 2 backward T [K] at p [Pa], s [J/(kg K)]. @see IAPWS R7-97(2012) Eqs. 25-27 */
export function T2_ps(p_Pa: number, s_J_per_kgK: number): number {
  const pi = p_Pa / 1e6;
  switch (subregion2_ps(p_Pa, s_J_per_kgK)) {
    case 'a': return P2AS.eval(Math.sqrt(Math.sqrt(pi)), s_J_per_kgK / 2e3 - 2);
    case 'b': return P2BS.eval(pi, 10 - s_J_per_kgK / 785.3);
    default: return P2CS.eval(pi, 2 - s_J_per_kgK / 2925.1);
  }
}

/** Region 3 backward T [K] at p [Pa], h [J/kg] (3a below h_3ab(p), else 3b). @see IAPWS SR3-03(2014) Eqs. 2, 3 */
export function T3_ph(p_Pa: number, h_J_per_kg: number): number {
  const pi = p_Pa / 100e6;
  if (h_J_per_kg <= hB3ab(p_Pa)) return 760 * P3AH.eval(pi + 0.24, h_J_per_kg / 2300e3 - 0.615);
  return 860 * P3BH.eval(pi + 0.298, h_J_per_kg / 2800e3 - 0.72);
}

/** Region 3 backward v [m3/kg] at p [Pa], h [J/kg]. @see IAPWS SR3-03(2014) Eqs. 4, 5 */
export function v3_ph(p_Pa: number, h_J_per_kg: number): number {
  const pi = p_Pa / 100e6;
  if (h_J_per_kg <= hB3ab(p_Pa)) return 0.0028 * V3AH.eval(pi + 0.128, h_J_per_kg / 2100e3 - 0.727);
  return 0.0088 * V3BH.eval(pi + 0.0661, h_J_per_kg / 2800e3 - 0.72);
}

/** Region 3 backward T [K] at p [Pa], s [J/(kg K)] (3a for s <= sc). @see IAPWS SR3-03(2014) Eqs. 6, 7 */
export function T3_ps(p_Pa: number, s_J_per_kgK: number): number {
  const pi = p_Pa / 100e6;
  if (s_J_per_kgK <= S_B3AB_J_PER_KGK) return 760 * P3AS.eval(pi + 0.24, s_J_per_kgK / 4.4e3 - 0.703);
  return 860 * P3BS.eval(pi + 0.76, s_J_per_kgK / 5.3e3 - 0.818);
}

/** Region 3 backward v [m3/kg] at p [Pa], s [J/(kg K)]. @see IAPWS SR3-03(2014) Eqs. 8, 9 */
export function v3_ps(p_Pa: number, s_J_per_kgK: number): number {
  const pi = p_Pa / 100e6;
  if (s_J_per_kgK <= S_B3AB_J_PER_KGK) return 0.0028 * V3AS.eval(pi + 0.187, s_J_per_kgK / 4.4e3 - 0.755);
  return 0.0088 * V3BS.eval(pi + 0.298, s_J_per_kgK / 5.3e3 - 0.816);
}
