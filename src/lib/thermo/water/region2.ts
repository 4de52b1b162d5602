/**
 * IAPWS-IF97 region 2 (vapour, superheated and supercritical gas): ideal-gas plus residual Gibbs
 * free energy. Validity: 273.15 K <= T <= 623.15 K with 0 < p <= psat(T); 623.15 K < T <= 863.15 K
 * with 0 < p <= p_B23(T); 863.15 K < T <= 1073.15 K with 0 < p <= 100 MPa.
 * @see IAPWS R7-97(2012) Eqs. 15-17, Tables 10-12
 */
import { R2O, R2R } from './coefficients';
import { R } from './constants';

const NO = R2O.n.length;
const JO_O = Int32Array.from(R2O.J, (j) => j + 5); // tau^j, j = -5..3 at j + 5
const NO_N = Float64Array.from(R2O.n);
const NO_J = Float64Array.from(R2O.n, (n, k) => n * R2O.J[k]);
const NO_JJ = Float64Array.from(R2O.n, (n, k) => n * R2O.J[k] * (R2O.J[k] - 1));

const N = R2R.n.length;
const II = Int32Array.from(R2R.I);
const JJ = Int32Array.from(R2R.J);
const NN = Float64Array.from(R2R.n);
const NI = Float64Array.from(R2R.n, (n, k) => n * R2R.I[k]);
const NII = Float64Array.from(R2R.n, (n, k) => n * R2R.I[k] * (R2R.I[k] - 1));
const NJ = Float64Array.from(R2R.n, (n, k) => n * R2R.J[k]);
const NJJ = Float64Array.from(R2R.n, (n, k) => n * R2R.J[k] * (R2R.J[k] - 1));
const NIJ = Float64Array.from(R2R.n, (n, k) => n * R2R.I[k] * R2R.J[k]);

/** pi^i, i = 0..24; reused across calls. */
const PI_POW = new Float64Array(25);
/** (tau - 0.5)^j, j = 0..58; reused across calls. */
const TAU_POW = new Float64Array(59);
/** tau^j, j = -5..3 at j + 5; reused across calls. */
const TAU0_POW = new Float64Array(9);

/**
 * Dimensionless Gibbs energy of the last `gibbs2` call, ideal-gas part then residual part:
 * [g0, g0_tau, g0_tautau, gr, gr_pi, gr_pipi, gr_tau, gr_tautau, gr_pitau]
 * (g0_pi = 1/pi, g0_pipi = -1/pi^2 and g0_pitau = 0 are used in closed form).
 */
export const G2 = new Float64Array(9);

/** Pressure scale of region 2 [Pa]. */
export const PSTAR2_PA = 1e6;
/** Temperature scale of region 2 [K]. */
export const TSTAR2_K = 540;

/** Fills G2 for pi = p/1 MPa (> 0) and tau = 540 K/T. */
export function gibbs2(pi: number, tau: number): void {
  // ideal-gas part
  const it = 1 / tau;
  TAU0_POW[5] = 1;
  TAU0_POW[6] = tau;
  TAU0_POW[7] = tau * tau;
  TAU0_POW[8] = TAU0_POW[7] * tau;
  for (let k = 4; k >= 0; k--) TAU0_POW[k] = TAU0_POW[k + 1] * it;
  let g0 = Math.log(pi), g0t = 0, g0tt = 0;
  for (let k = 0; k < NO; k++) {
    const t = TAU0_POW[JO_O[k]];
    g0 += NO_N[k] * t;
    g0t += NO_J[k] * t;
    g0tt += NO_JJ[k] * t;
  }
  G2[0] = g0;
  G2[1] = g0t * it;
  G2[2] = g0tt * it * it;
  // residual part
  const b = tau - 0.5;
  // powers by four interleaved multiplication chains (x^k = x^(k-4) x^4)
  const p2 = pi * pi;
  const p4 = p2 * p2;
  PI_POW[0] = 1;
  PI_POW[1] = pi;
  PI_POW[2] = p2;
  PI_POW[3] = p2 * pi;
  for (let k = 4; k < 25; k++) PI_POW[k] = PI_POW[k - 4] * p4;
  const b2 = b * b;
  const b4 = b2 * b2;
  TAU_POW[0] = 1;
  TAU_POW[1] = b;
  TAU_POW[2] = b2;
  TAU_POW[3] = b2 * b;
  for (let k = 4; k < 59; k++) TAU_POW[k] = TAU_POW[k - 4] * b4;
  let g = 0, gi = 0, gii = 0, gj = 0, gjj = 0, gij = 0;
  for (let k = 0; k < N; k++) {
    const t = PI_POW[II[k]] * TAU_POW[JJ[k]];
    g += NN[k] * t;
    gi += NI[k] * t;
    gii += NII[k] * t;
    gj += NJ[k] * t;
    gjj += NJJ[k] * t;
    gij += NIJ[k] * t;
  }
  const ip = 1 / pi;
  const ib = 1 / b;
  G2[3] = g;
  G2[4] = gi * ip;
  G2[5] = gii * ip * ip;
  G2[6] = gj * ib;
  G2[7] = gjj * ib * ib;
  G2[8] = gij * ip * ib;
}

/** Specific enthalpy [J/kg] in region 2 at p [Pa], T [K]; no range check. */
export function h2(p_Pa: number, T_K: number): number {
  const tau = TSTAR2_K / T_K;
  gibbs2(p_Pa / PSTAR2_PA, tau);
  return R * T_K * tau * (G2[1] + G2[6]); // same expression as props2
}

/** Specific entropy [J/(kg K)] in region 2 at p [Pa], T [K]; no range check. */
export function s2(p_Pa: number, T_K: number): number {
  const tau = TSTAR2_K / T_K;
  gibbs2(p_Pa / PSTAR2_PA, tau);
  return R * (tau * (G2[1] + G2[6]) - (G2[0] + G2[3]));
}

/**
 * Properties of region 2 written into `out` (index: 0 h [J/kg], 1 s [J/(kg K)], 2 v [m3/kg],
 * 3 cp [J/(kg K)], 4 w [m/s], 5 u [J/kg]); no range check.
 */
export function props2(p_Pa: number, T_K: number, out: Float64Array): void {
  const pi = p_Pa / PSTAR2_PA;
  const tau = TSTAR2_K / T_K;
  gibbs2(pi, tau);
  const gt = G2[1] + G2[6];
  const gtt = G2[2] + G2[7];
  const grp = G2[4], grpp = G2[5], grpt = G2[8];
  const RT = R * T_K;
  const pg = pi * grp;
  out[0] = RT * tau * gt;
  out[1] = R * (tau * gt - (G2[0] + G2[3]));
  out[2] = (RT / p_Pa) * (1 + pg);
  out[3] = -R * tau * tau * gtt;
  const d = 1 + pg - tau * pi * grpt;
  out[4] = Math.sqrt((RT * (1 + 2 * pg + pg * pg)) / (1 - pi * pi * grpp + (d * d) / (tau * tau * gtt)));
  out[5] = RT * (tau * gt - 1 - pg);
}
