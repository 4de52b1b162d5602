/**
 * IAPWS-IF97 region 4 (saturation line) and the boundary equations between regions.
 * @see IAPWS R7-97(2012) Eqs. 5-6 (B23), 20-21 (B2bc), 29-31 (saturation), Table 34
 */
import { R4_N } from './coefficients';

const [, n1, n2, n3, n4, n5, n6, n7, n8, n9, n10] = R4_N;

/**
 * Saturation pressure [Pa] at T [K] by the saturation-pressure equation; no range check
 * (valid 273.15 K <= T <= 647.096 K).
 * @see IAPWS R7-97(2012) Eq. 30
 */
export function psatRaw(T_K: number): number {
  const th = T_K + n9 / (T_K - n10);
  const A = th * th + n1 * th + n2;
  const B = n3 * th * th + n4 * th + n5;
  const C = n6 * th * th + n7 * th + n8;
  const q = (2 * C) / (-B + Math.sqrt(B * B - 4 * A * C));
  const q2 = q * q;
  return q2 * q2 * 1e6;
}

/**
 * Saturation temperature [K] at p [Pa] by the saturation-temperature equation; no range check
 * (valid 611.213 Pa <= p <= 22.064 MPa).
 * @see IAPWS R7-97(2012) Eq. 31
 */
export function tsatRaw(p_Pa: number): number {
  const beta = Math.sqrt(Math.sqrt(p_Pa / 1e6));
  const E = beta * beta + n3 * beta + n6;
  const F = n1 * beta * beta + n4 * beta + n7;
  const G = n2 * beta * beta + n5 * beta + n8;
  const D = (2 * G) / (-F - Math.sqrt(F * F - 4 * E * G));
  return (n10 + D - Math.sqrt((n10 + D) * (n10 + D) - 4 * (n9 + n10 * D))) / 2;
}

/** psat(273.15 K) [Pa], Eq. 30: the lowest pressure of the saturation line (IF97's triple-point value). */
export const P_SAT_MIN_PA = psatRaw(273.15);
/** psat(623.15 K) [Pa], Eq. 30: above it the saturation line lies in region 3. */
export const P_SAT_623_PA = psatRaw(623.15);

const B23 = [0.34805185628969e3, -0.11671859879975e1, 0.10192970039326e-2, 0.57254459862746e3, 0.1391883977870e2];

/**
 * Pressure [Pa] of the boundary between regions 2 and 3 at T [K] (623.15 K..863.15 K).
 * @see IAPWS R7-97(2012) Eq. 5
 */
export function pB23(T_K: number): number {
  return (B23[0] + B23[1] * T_K + B23[2] * T_K * T_K) * 1e6;
}

/**
 * Temperature [K] of the boundary between regions 2 and 3 at p [Pa] (16.529 MPa..100 MPa).
 * @see IAPWS R7-97(2012) Eq. 6
 */
export function tB23(p_Pa: number): number {
  return B23[3] + Math.sqrt((p_Pa / 1e6 - B23[4]) / B23[2]);
}

/**
 * Pressure [Pa] of the boundary between subregions 2b and 2c at h [J/kg].
 * @see IAPWS R7-97(2012) Eq. 20
 */
export function pB2bc(h_J_per_kg: number): number {
  const h = h_J_per_kg / 1e3;
  return (0.90584278514723e3 - 0.67955786399241 * h + 0.12809002730136e-3 * h * h) * 1e6;
}

/**
 * Enthalpy [J/kg] of the boundary between subregions 2b and 2c at p [Pa].
 * @see IAPWS R7-97(2012) Eq. 21
 */
export function hB2bc(p_Pa: number): number {
  return (0.26526571908428e4 + Math.sqrt((p_Pa / 1e6 - 0.45257578905948e1) / 0.12809002730136e-3)) * 1e3;
}

/**
 * Enthalpy [J/kg] of the boundary between subregions 3a and 3b at p [Pa] (near-critical isentrope
 * s = sc, as a cubic in p).
 * @see IAPWS SR3-03(2014) Eq. 1
 */
export function hB3ab(p_Pa: number): number {
  const p = p_Pa / 1e6;
  return (0.201464004206875e4 + 3.74696550136983 * p - 0.0219921901054187 * p * p + 0.875131686009950e-4 * p * p * p) * 1e3;
}

/** Entropy [J/(kg K)] at the critical point, the 3a/3b boundary of the T(p,s) equations (SR3-03). */
export const S_B3AB_J_PER_KGK = 4.41202148223476e3;
