/**
 * IAPWS-IF97 region 1 (compressed liquid): the basic Gibbs free energy equation.
 * Validity: 273.15 K <= T <= 623.15 K, psat(T) <= p <= 100 MPa.
 * @see IAPWS R7-97(2012) Eq. 7, Tables 2-4
 */
import { R1 } from './coefficients';
import { R } from './constants';

const N = R1.n.length;
const II = Int32Array.from(R1.I);
const JO = Int32Array.from(R1.J, (j) => j + 41); // offset into TAU_POW
const NN = Float64Array.from(R1.n);
const NI = Float64Array.from(R1.n, (n, k) => n * R1.I[k]);
const NII = Float64Array.from(R1.n, (n, k) => n * R1.I[k] * (R1.I[k] - 1));
const NJ = Float64Array.from(R1.n, (n, k) => n * R1.J[k]);
const NJJ = Float64Array.from(R1.n, (n, k) => n * R1.J[k] * (R1.J[k] - 1));
const NIJ = Float64Array.from(R1.n, (n, k) => n * R1.I[k] * R1.J[k]);

/** (7.1 - pi)^k, k = 0..32; reused across calls. */
const PI_POW = new Float64Array(33);
/** (tau - 1.222)^j, j = -41..17 stored at j + 41; reused across calls. */
const TAU_POW = new Float64Array(59);

/**
 * Dimensionless Gibbs energy and derivatives of the last `gibbs1` call:
 * [gamma, gamma_pi, gamma_pipi, gamma_tau, gamma_tautau, gamma_pitau].
 */
export const G1 = new Float64Array(6);

/** Fills G1 for reduced pressure pi = p/16.53 MPa and inverse reduced temperature tau = 1386 K/T. */
export function gibbs1(pi: number, tau: number): void {
  const a = 7.1 - pi;
  const b = tau - 1.222;
  // powers by four interleaved multiplication chains (x^k = x^(k-4) x^4): short dependency
  // chains let the CPU overlap the multiplications
  const a2 = a * a;
  const a4 = a2 * a2;
  PI_POW[0] = 1;
  PI_POW[1] = a;
  PI_POW[2] = a2;
  PI_POW[3] = a2 * a;
  for (let k = 4; k < 33; k++) PI_POW[k] = PI_POW[k - 4] * a4;
  const b2 = b * b;
  const b4 = b2 * b2;
  TAU_POW[41] = 1;
  TAU_POW[42] = b;
  TAU_POW[43] = b2;
  TAU_POW[44] = b2 * b;
  for (let k = 45; k < 59; k++) TAU_POW[k] = TAU_POW[k - 4] * b4;
  const ib = 1 / b;
  const ib2 = ib * ib;
  const ib4 = ib2 * ib2;
  TAU_POW[40] = ib;
  TAU_POW[39] = ib2;
  TAU_POW[38] = ib2 * ib;
  TAU_POW[37] = ib4;
  for (let k = 36; k >= 0; k--) TAU_POW[k] = TAU_POW[k + 4] * ib4;
  let g = 0, gi = 0, gii = 0, gj = 0, gjj = 0, gij = 0;
  for (let k = 0; k < N; k++) {
    const t = PI_POW[II[k]] * TAU_POW[JO[k]];
    g += NN[k] * t;
    gi += NI[k] * t;
    gii += NII[k] * t;
    gj += NJ[k] * t;
    gjj += NJJ[k] * t;
    gij += NIJ[k] * t;
  }
  G1[0] = g;
  const ia = 1 / a; // d/dpi (7.1 - pi)^i = -i (7.1 - pi)^(i-1)
  G1[1] = -gi * ia;
  G1[2] = gii * ia * ia;
  G1[3] = gj * ib;
  G1[4] = gjj * ib * ib;
  G1[5] = -gij * ia * ib;
}

/** Reduced pressure of region 1 for p [Pa]. */
export const PSTAR1_PA = 16.53e6;
/** Reduced temperature scale of region 1 [K]. */
export const TSTAR1_K = 1386;

/** Specific enthalpy [J/kg] in region 1 at p [Pa], T [K]; no range check. */
export function h1(p_Pa: number, T_K: number): number {
  const tau = TSTAR1_K / T_K;
  gibbs1(p_Pa / PSTAR1_PA, tau);
  return R * T_K * tau * G1[3]; // same expression as props1, so both agree to the bit
}

/** Specific entropy [J/(kg K)] in region 1 at p [Pa], T [K]; no range check. */
export function s1(p_Pa: number, T_K: number): number {
  const tau = TSTAR1_K / T_K;
  gibbs1(p_Pa / PSTAR1_PA, tau);
  return R * (tau * G1[3] - G1[0]);
}

/** Specific volume [m3/kg] in region 1 at p [Pa], T [K]; no range check. */
export function v1(p_Pa: number, T_K: number): number {
  gibbs1(p_Pa / PSTAR1_PA, TSTAR1_K / T_K);
  return (R * T_K * G1[1]) / PSTAR1_PA;
}

/**
 * Properties of region 1 written into `out` (index: 0 h [J/kg], 1 s [J/(kg K)], 2 v [m3/kg],
 * 3 cp [J/(kg K)], 4 w [m/s], 5 u [J/kg]); no range check.
 */
export function props1(p_Pa: number, T_K: number, out: Float64Array): void {
  const pi = p_Pa / PSTAR1_PA;
  const tau = TSTAR1_K / T_K;
  gibbs1(pi, tau);
  const g = G1[0], gp = G1[1], gpp = G1[2], gt = G1[3], gtt = G1[4], gpt = G1[5];
  const RT = R * T_K;
  out[0] = RT * tau * gt;
  out[1] = R * (tau * gt - g);
  out[2] = (RT * gp) / PSTAR1_PA;
  out[3] = -R * tau * tau * gtt;
  const d = gp - tau * gpt;
  out[4] = Math.sqrt((RT * gp * gp) / ((d * d) / (tau * tau * gtt) - gpp));
  out[5] = RT * (tau * gt - pi * gp);
}
