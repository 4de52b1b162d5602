/**
 * IAPWS-IF97 region 5 (high-temperature steam): ideal-gas plus residual Gibbs free energy of the
 * 2007 revision. Validity: 1073.15 K <= T <= 2273.15 K, 0 < p <= 50 MPa.
 * @see IAPWS R7-97(2012) Eqs. 32-34, Tables 37-39
 */
import { R5O, R5R } from './coefficients';
import { R } from './constants';

const NO = R5O.n.length;
const JO_O = Int32Array.from(R5O.J, (j) => j + 3); // tau^j, j = -3..2 at j + 3
const NO_N = Float64Array.from(R5O.n);
const NO_J = Float64Array.from(R5O.n, (n, k) => n * R5O.J[k]);
const NO_JJ = Float64Array.from(R5O.n, (n, k) => n * R5O.J[k] * (R5O.J[k] - 1));

const N = R5R.n.length;
const II = Int32Array.from(R5R.I);
const JJ = Int32Array.from(R5R.J);
const NN = Float64Array.from(R5R.n);
const NI = Float64Array.from(R5R.n, (n, k) => n * R5R.I[k]);
const NII = Float64Array.from(R5R.n, (n, k) => n * R5R.I[k] * (R5R.I[k] - 1));
const NJ = Float64Array.from(R5R.n, (n, k) => n * R5R.J[k]);
const NJJ = Float64Array.from(R5R.n, (n, k) => n * R5R.J[k] * (R5R.J[k] - 1));
const NIJ = Float64Array.from(R5R.n, (n, k) => n * R5R.I[k] * R5R.J[k]);

const PI_POW = new Float64Array(4);
const TAU_POW = new Float64Array(10);
const TAU0_POW = new Float64Array(6);

/** Same layout as G2: [g0, g0_tau, g0_tautau, gr, gr_pi, gr_pipi, gr_tau, gr_tautau, gr_pitau]. */
export const G5 = new Float64Array(9);

/** Pressure scale of region 5 [Pa]. */
export const PSTAR5_PA = 1e6;
/** Temperature scale of region 5 [K]. */
export const TSTAR5_K = 1000;

/** Fills G5 for pi = p/1 MPa (> 0) and tau = 1000 K/T. */
export function gibbs5(pi: number, tau: number): void {
  const it = 1 / tau;
  TAU0_POW[3] = 1;
  TAU0_POW[4] = tau;
  TAU0_POW[5] = tau * tau;
  for (let k = 2; k >= 0; k--) TAU0_POW[k] = TAU0_POW[k + 1] * it;
  let g0 = Math.log(pi), g0t = 0, g0tt = 0;
  for (let k = 0; k < NO; k++) {
    const t = TAU0_POW[JO_O[k]];
    g0 += NO_N[k] * t;
    g0t += NO_J[k] * t;
    g0tt += NO_JJ[k] * t;
  }
  G5[0] = g0;
  G5[1] = g0t * it;
  G5[2] = g0tt * it * it;
  PI_POW[0] = 1;
  for (let k = 1; k < 4; k++) PI_POW[k] = PI_POW[k - 1] * pi;
  TAU_POW[0] = 1;
  for (let k = 1; k < 10; k++) TAU_POW[k] = TAU_POW[k - 1] * tau;
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
  G5[3] = g;
  G5[4] = gi * ip;
  G5[5] = gii * ip * ip;
  G5[6] = gj * it;
  G5[7] = gjj * it * it;
  G5[8] = gij * ip * it;
}

/** Specific enthalpy [J/kg] in region 5 at p [Pa], T [K]; no range check. */
export function h5(p_Pa: number, T_K: number): number {
  const tau = TSTAR5_K / T_K;
  gibbs5(p_Pa / PSTAR5_PA, tau);
  return R * T_K * tau * (G5[1] + G5[6]); // same expression as props5
}

/** Specific entropy [J/(kg K)] in region 5 at p [Pa], T [K]; no range check. */
export function s5(p_Pa: number, T_K: number): number {
  const tau = TSTAR5_K / T_K;
  gibbs5(p_Pa / PSTAR5_PA, tau);
  return R * (tau * (G5[1] + G5[6]) - (G5[0] + G5[3]));
}

/**
 * Properties of region 5 written into `out` (index: 0 h [J/kg], 1 s [J/(kg K)], 2 v [m3/kg],
 * 3 cp [J/(kg K)], 4 w [m/s], 5 u [J/kg]); no range check.
 */
export function props5(p_Pa: number, T_K: number, out: Float64Array): void {
  const pi = p_Pa / PSTAR5_PA;
  const tau = TSTAR5_K / T_K;
  gibbs5(pi, tau);
  const gt = G5[1] + G5[6];
  const gtt = G5[2] + G5[7];
  const grp = G5[4], grpp = G5[5], grpt = G5[8];
  const RT = R * T_K;
  const pg = pi * grp;
  out[0] = RT * tau * gt;
  out[1] = R * (tau * gt - (G5[0] + G5[3]));
  out[2] = (RT / p_Pa) * (1 + pg);
  out[3] = -R * tau * tau * gtt;
  const d = 1 + pg - tau * pi * grpt;
  out[4] = Math.sqrt((RT * (1 + 2 * pg + pg * pg)) / (1 - pi * pi * grpp + (d * d) / (tau * tau * gtt)));
  out[5] = RT * (tau * gt - 1 - pg);
}
