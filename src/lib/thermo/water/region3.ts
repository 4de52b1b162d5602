/**
 * IAPWS-IF97 region 3 (near-critical and supercritical fluid): the Helmholtz free energy equation
 * f(rho, T). Validity: 623.15 K <= T <= T_B23(p), p_B23(T) <= p <= 100 MPa.
 * @see IAPWS R7-97(2012) Eq. 28, Tables 30-32
 */
import { R3 } from './coefficients';
import { R, RHOC_KG_PER_M3, TC_K } from './constants';

const N1 = 0.10658070028513e1;
const N = R3.n.length;
const II = Int32Array.from(R3.I);
const JJ = Int32Array.from(R3.J);
const NN = Float64Array.from(R3.n);
const NI = Float64Array.from(R3.n, (n, k) => n * R3.I[k]);
const NII = Float64Array.from(R3.n, (n, k) => n * R3.I[k] * (R3.I[k] - 1));
const NJ = Float64Array.from(R3.n, (n, k) => n * R3.J[k]);
const NJJ = Float64Array.from(R3.n, (n, k) => n * R3.J[k] * (R3.J[k] - 1));
const NIJ = Float64Array.from(R3.n, (n, k) => n * R3.I[k] * R3.J[k]);
const D_POW = new Float64Array(12);
const T_POW = new Float64Array(27);

/**
 * Dimensionless Helmholtz energy of the last `helmholtz3` call:
 * [phi, phi_delta, phi_deltadelta, phi_tau, phi_tautau, phi_deltatau].
 */
export const F3 = new Float64Array(6);

/** Fills F3 for delta = rho/322 kg/m3 (> 0) and tau = 647.096 K/T. */
export function helmholtz3(delta: number, tau: number): void {
  D_POW[0] = 1;
  for (let k = 1; k < 12; k++) D_POW[k] = D_POW[k - 1] * delta;
  T_POW[0] = 1;
  for (let k = 1; k < 27; k++) T_POW[k] = T_POW[k - 1] * tau;
  let f = 0, fi = 0, fii = 0, fj = 0, fjj = 0, fij = 0;
  for (let k = 0; k < N; k++) {
    const t = D_POW[II[k]] * T_POW[JJ[k]];
    f += NN[k] * t;
    fi += NI[k] * t;
    fii += NII[k] * t;
    fj += NJ[k] * t;
    fjj += NJJ[k] * t;
    fij += NIJ[k] * t;
  }
  const id = 1 / delta;
  const it = 1 / tau;
  F3[0] = N1 * Math.log(delta) + f;
  F3[1] = N1 * id + fi * id;
  F3[2] = -N1 * id * id + fii * id * id;
  F3[3] = fj * it;
  F3[4] = fjj * it * it;
  F3[5] = fij * id * it;
}

/** Pressure [Pa] of region 3 at rho [kg/m3], T [K]; no range check. */
export function p3(rho_kg_per_m3: number, T_K: number): number {
  const delta = rho_kg_per_m3 / RHOC_KG_PER_M3;
  helmholtz3(delta, TC_K / T_K);
  return rho_kg_per_m3 * R * T_K * delta * F3[1];
}

/**
 * Properties of region 3 written into `out` (index: 0 h [J/kg], 1 s [J/(kg K)], 2 v [m3/kg],
 * 3 cp [J/(kg K)], 4 w [m/s], 5 u [J/kg], 6 p [Pa], 7 dp/drho at constant T [Pa m3/kg],
 * 8 dp/dT at constant rho [Pa/K], 9 dh/drho at constant T, 10 dh/dT at constant rho [J/(kg K)],
 * 11 ds/drho at constant T, 12 ds/dT at constant rho); no range check. cp and w are those of the
 * single-phase equation (may be negative or NaN inside the spinodal, which callers never ask for).
 */
export function props3(rho_kg_per_m3: number, T_K: number, out: Float64Array): void {
  const rho = rho_kg_per_m3;
  const delta = rho / RHOC_KG_PER_M3;
  const tau = TC_K / T_K;
  helmholtz3(delta, tau);
  const f = F3[0], fd = F3[1], fdd = F3[2], ft = F3[3], ftt = F3[4], fdt = F3[5];
  const RT = R * T_K;
  const dfd = delta * fd;
  const a = 2 * dfd + delta * delta * fdd; // (dp/drho)_T / (R T)
  const b = dfd - delta * tau * fdt; // (dp/dT)_rho / (rho R)
  out[0] = RT * (tau * ft + dfd);
  out[1] = R * (tau * ft - f);
  out[2] = 1 / rho;
  out[3] = R * (-tau * tau * ftt + (b * b) / a);
  out[4] = Math.sqrt(RT * (a - (b * b) / (tau * tau * ftt)));
  out[5] = RT * tau * ft;
  out[6] = rho * RT * dfd;
  out[7] = RT * a;
  out[8] = rho * R * b;
  out[9] = (RT / rho) * (delta * delta * fdd + dfd + delta * tau * fdt);
  out[10] = R * (-tau * tau * ftt + b);
  out[11] = (R / rho) * (delta * tau * fdt - dfd);
  out[12] = (-R * tau * tau * ftt) / T_K;
}
