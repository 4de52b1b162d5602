/**
 * IAPWS-IF97 verification values, copied as printed in the release (units of the release: p MPa,
 * T K, v m3/kg, h and u kJ/kg, s and cp kJ/(kg K), w m/s) and converted here. The rows are those of
 * docs/reference/check-values.md section 1. The release prints 9 significant figures, so the
 * tolerance is rtol 1e-8 (one unit in the 9th digit is at most 1e-8 relative).
 */
import { describe, it } from 'vitest';
import { expectClose } from '../support/expect-close';
import { water } from '~/lib/thermo/water';
import { subregion2_ph, subregion2_ps, T1_ph, T1_ps, T2_ph, T2_ps } from '~/lib/thermo/water/backward';
import { pB23, tB23 } from '~/lib/thermo/water/saturation';

const MPa = 1e6;
const kJ = 1e3;
const DIGITS9 = 1e-8;

type Row = { source: string; T: number; p?: number; rho?: number; v?: number; h: number; u: number; s: number; cp: number; w: number; pOut?: number };

const T5 = 'IAPWS R7-97(2012) Table 5';
const T15 = 'IAPWS R7-97(2012) Table 15';
const T33 = 'IAPWS R7-97(2012) Table 33';
const T42 = 'IAPWS R7-97(2012) Table 42';

const forwardPT: Row[] = [
  { source: T5, T: 300, p: 3, v: 1.00215168e-3, h: 1.15331273e2, u: 1.12324818e2, s: 3.92294792e-1, cp: 4.17301218, w: 1.50773921e3 },
  { source: T5, T: 300, p: 80, v: 9.71180894e-4, h: 1.84142828e2, u: 1.06448356e2, s: 3.68563852e-1, cp: 4.01008987, w: 1.63469054e3 },
  { source: T5, T: 500, p: 3, v: 1.202418e-3, h: 9.75542239e2, u: 9.71934985e2, s: 2.58041912, cp: 4.65580682, w: 1.24071337e3 },
  { source: T15, T: 300, p: 0.0035, v: 3.94913866e1, h: 2.54991145e3, u: 2.4116916e3, s: 8.52238967, cp: 1.91300162, w: 4.27920172e2 },
  { source: T15, T: 700, p: 0.0035, v: 9.23015898e1, h: 3.33568375e3, u: 3.01262819e3, s: 1.01749996e1, cp: 2.08141274, w: 6.44289068e2 },
  { source: T15, T: 700, p: 30, v: 5.42946619e-3, h: 2.63149474e3, u: 2.46861076e3, s: 5.17540298, cp: 1.03505092e1, w: 4.80386523e2 },
  { source: T42, T: 1500, p: 0.5, v: 1.3845509, h: 5.21976855e3, u: 4.5274931e3, s: 9.65408875, cp: 2.61609445, w: 9.1706869e2 },
  { source: T42, T: 1500, p: 30, v: 2.30761299e-2, h: 5.16723514e3, u: 4.47495124e3, s: 7.72970133, cp: 2.72724317, w: 9.28548002e2 },
  { source: T42, T: 2000, p: 30, v: 3.11385219e-2, h: 6.57122604e3, u: 5.63707038e3, s: 8.53640523, cp: 2.88569882, w: 1.06736948e3 },
];

describe('IF97 basic equations, regions 1, 2 and 5 from (p, T)', () => {
  it.each(forwardPT)('$source: v, h, u, s, cp, w at T = $T K, p = $p MPa', (r) => {
    const st = water.pt(r.p! * MPa, r.T);
    expectClose(st.v, r.v!, { rtol: DIGITS9, label: 'v' });
    expectClose(st.h, r.h * kJ, { rtol: DIGITS9, label: 'h' });
    expectClose(st.h - st.p * st.v, r.u * kJ, { rtol: DIGITS9, label: 'u' });
    expectClose(st.s, r.s * kJ, { rtol: DIGITS9, label: 's' });
    expectClose(st.cp, r.cp * kJ, { rtol: DIGITS9, label: 'cp' });
    expectClose(st.w, r.w, { rtol: DIGITS9, label: 'w' });
  });

  it.each([
    { source: T5, T: 300, p: 3, region: 1, phase: 'liquid' },
    { source: T15, T: 700, p: 30, region: 2, phase: 'supercritical' },
    { source: T15, T: 300, p: 0.0035, region: 2, phase: 'vapour' },
    { source: T42, T: 1500, p: 0.5, region: 5, phase: 'vapour' },
  ])('$source: the state at T = $T K, p = $p MPa lies in region $region', ({ T, p, region, phase }) => {
    const st = water.pt(p * MPa, T);
    if (st.region !== region || st.phase !== phase || st.x !== null) {
      throw new Error(`expected region ${region} ${phase}, got ${st.region} ${st.phase} x=${st.x}`);
    }
  });
});

const region3Rows: Row[] = [
  { source: T33, T: 650, rho: 500, pOut: 2.55837018e1, h: 1.86343019e3, u: 1.81226279e3, s: 4.05427273, cp: 1.38935717e1, w: 5.02005554e2 },
  { source: T33, T: 650, rho: 200, pOut: 2.22930643e1, h: 2.37512401e3, u: 2.26365868e3, s: 4.85438792, cp: 4.46579342e1, w: 3.83444594e2 },
  { source: T33, T: 750, rho: 500, pOut: 7.83095639e1, h: 2.25868845e3, u: 2.10206932e3, s: 4.46971906, cp: 6.34165359, w: 7.60696041e2 },
];

describe('IF97 basic equation of region 3 from (rho, T)', () => {
  it.each(region3Rows)('$source: p, h, u, s, cp, w at T = $T K, rho = $rho kg/m3', (r) => {
    const st = water.region3(r.rho!, r.T);
    expectClose(st.p, r.pOut! * MPa, { rtol: DIGITS9, label: 'p' });
    expectClose(st.v, 1 / r.rho!, { rtol: 1e-15, label: 'v' });
    expectClose(st.h, r.h * kJ, { rtol: DIGITS9, label: 'h' });
    expectClose(st.h - st.p * st.v, r.u * kJ, { rtol: DIGITS9, label: 'u' });
    expectClose(st.s, r.s * kJ, { rtol: DIGITS9, label: 's' });
    expectClose(st.cp, r.cp * kJ, { rtol: DIGITS9, label: 'cp' });
    expectClose(st.w, r.w, { rtol: DIGITS9, label: 'w' });
  });

  it.each(region3Rows)('$source: water.pt at the printed p = $pOut MPa, T = $T K returns rho = $rho kg/m3', (r) => {
    const st = water.pt(r.pOut! * MPa, r.T);
    if (st.region !== 3) throw new Error(`expected region 3, got ${st.region}`);
    // the printed p has 9 digits; rho follows within (dp/p) / (dln p/dln rho)
    expectClose(1 / st.v, r.rho!, { rtol: 1e-7 });
    expectClose(st.h, r.h * kJ, { rtol: 1e-7 });
  });
});

describe('IF97 saturation line', () => {
  it.each([
    { source: 'IAPWS R7-97(2012) Table 35', T: 300, p: 3.53658941e-3 },
    { source: 'IAPWS R7-97(2012) Table 35', T: 500, p: 2.63889776 },
    { source: 'IAPWS R7-97(2012) Table 35', T: 600, p: 1.23443146e1 },
  ])('$source: psat at T = $T K', ({ T, p }) => {
    expectClose(water.psat(T), p * MPa, { rtol: DIGITS9 });
  });

  it.each([
    { source: 'IAPWS R7-97(2012) Table 36', p: 0.1, T: 3.72755919e2 },
    { source: 'IAPWS R7-97(2012) Table 36', p: 1, T: 4.53035632e2 },
    { source: 'IAPWS R7-97(2012) Table 36', p: 10, T: 5.84149488e2 },
  ])('$source: Tsat at p = $p MPa', ({ p, T }) => {
    expectClose(water.tsat(p * MPa), T, { rtol: DIGITS9 });
  });
});

describe('IF97 boundary between regions 2 and 3', () => {
  const B23 = 'IAPWS R7-97(2012) section 4, check values after Eq. 6';
  it(`${B23}: p_B23(623.15 K) = 16.5291643 MPa`, () => {
    expectClose(pB23(623.15), 1.65291643e1 * MPa, { rtol: DIGITS9 });
  });
  it(`${B23}: T_B23(16.5291643 MPa) = 623.15 K`, () => {
    // the printed input p has 9 digits; dT/dp of B23 is about 14 K/MPa, so 5e-8 MPa moves T 7e-7 K
    expectClose(tB23(1.65291643e1 * MPa), 623.15, { rtol: 2e-9 });
  });
});

const T7 = 'IAPWS R7-97(2012) Table 7';
const T9 = 'IAPWS R7-97(2012) Table 9';
const T24 = 'IAPWS R7-97(2012) Table 24';
const T29 = 'IAPWS R7-97(2012) Table 29';

const backwardPH = [
  { source: T7, region: 1, p: 3, h: 500, T: 3.91798509e2 },
  { source: T7, region: 1, p: 80, h: 500, T: 3.78108626e2 },
  { source: T7, region: 1, p: 80, h: 1500, T: 6.11041229e2 },
  { source: T24, region: 2, p: 0.001, h: 3000, T: 5.34433241e2 },
  { source: T24, region: 2, p: 3, h: 3000, T: 5.7537337e2 },
  { source: T24, region: 2, p: 3, h: 4000, T: 1.01077577e3 },
  { source: T24, region: 2, p: 5, h: 3500, T: 8.01299102e2 },
  { source: T24, region: 2, p: 5, h: 4000, T: 1.01531583e3 },
  { source: T24, region: 2, p: 25, h: 3500, T: 8.75279054e2 },
  { source: T24, region: 2, p: 40, h: 2700, T: 7.43056411e2 },
  { source: T24, region: 2, p: 60, h: 2700, T: 7.91137067e2 },
  { source: T24, region: 2, p: 60, h: 3200, T: 8.8275686e2 },
];

const backwardPS = [
  { source: T9, region: 1, p: 3, s: 0.5, T: 3.07842258e2 },
  { source: T9, region: 1, p: 80, s: 0.5, T: 3.09979785e2 },
  { source: T9, region: 1, p: 80, s: 3, T: 5.65899909e2 },
  { source: T29, region: 2, p: 0.1, s: 7.5, T: 3.99517097e2 },
  { source: T29, region: 2, p: 0.1, s: 8, T: 5.14127081e2 },
  { source: T29, region: 2, p: 2.5, s: 8, T: 1.03984917e3 },
  { source: T29, region: 2, p: 8, s: 6, T: 6.0048404e2 },
  { source: T29, region: 2, p: 8, s: 7.5, T: 1.06495556e3 },
  { source: T29, region: 2, p: 90, s: 6, T: 1.03801126e3 },
  { source: T29, region: 2, p: 20, s: 5.75, T: 6.97992849e2 },
  { source: T29, region: 2, p: 80, s: 5.25, T: 8.54011484e2 },
  { source: T29, region: 2, p: 80, s: 5.75, T: 9.49017998e2 },
];

// Permissible deviation of the backward from the basic equations (R7-97(2012) sections 5.2 and
// 6.3, from memory): |dT| <= 25 mK in region 1 and subregion 2c, <= 10 mK in subregions 2a and 2b
const dTtol = (region: number, sub: string): number => (region === 1 || sub === 'c' ? 0.025 : 0.010);

describe('IF97 backward equations T(p,h) and T(p,s), regions 1 and 2', () => {
  it.each(backwardPH)('$source: backward T(p,h) at p = $p MPa, h = $h kJ/kg', ({ region, p, h, T }) => {
    const Tb = region === 1 ? T1_ph(p * MPa, h * kJ) : T2_ph(p * MPa, h * kJ);
    expectClose(Tb, T, { rtol: DIGITS9 });
  });
  it.each(backwardPS)('$source: backward T(p,s) at p = $p MPa, s = $s kJ/(kg K)', ({ region, p, s, T }) => {
    const Tb = region === 1 ? T1_ps(p * MPa, s * kJ) : T2_ps(p * MPa, s * kJ);
    expectClose(Tb, T, { rtol: DIGITS9 });
  });
  it.each(backwardPH)('$source: water.ph at p = $p MPa, h = $h kJ/kg is region $region within the backward tolerance', ({ region, p, h, T }) => {
    const st = water.ph(p * MPa, h * kJ);
    if (st.region !== region) throw new Error(`expected region ${region}, got ${st.region}`);
    expectClose(st.T, T, { atol: dTtol(region, subregion2_ph(p * MPa, h * kJ)), rtol: 0 });
    expectClose(st.h, h * kJ, { rtol: 1e-12, label: 'polished h' });
  });
  it.each(backwardPS)('$source: water.ps at p = $p MPa, s = $s kJ/(kg K) is region $region within the backward tolerance', ({ region, p, s, T }) => {
    const st = water.ps(p * MPa, s * kJ);
    if (st.region !== region) throw new Error(`expected region ${region}, got ${st.region}`);
    expectClose(st.T, T, { atol: dTtol(region, subregion2_ps(p * MPa, s * kJ)), rtol: 0 });
    expectClose(st.s, s * kJ, { rtol: 1e-12, label: 'polished s' });
  });
});
