/**
 * Identities of the water property functions, all labelled 'self-consistency': they check
 * relations the equations must satisfy, not published numbers.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { expectClose } from '../support/expect-close';
import { at } from '../support/present';
import { runs, unit } from '../support/random';
import { water } from '~/lib/thermo/water';
import { ThermoRangeError } from '~/lib/thermo/errors';
import { props1 } from '~/lib/thermo/water/region1';
import { props2 } from '~/lib/thermo/water/region2';
import { props3 } from '~/lib/thermo/water/region3';
import { props5 } from '~/lib/thermo/water/region5';

const SC = 'self-consistency';
const MPa = 1e6;

/** (p, T) over IF97's whole range: uniform T, log-uniform p (fast-check). */
const anyState = fc.tuple(unit, unit).map(([a, b]) => {
  const T = 273.15 + a * 2000;
  const pMax = T > 1073.15 ? 50e6 : 100e6;
  return { T, p: 100 * Math.pow(pMax / 100, b) };
});

const statesByRegion = [
  { region: 1, p: 3e6, T: 300 },
  { region: 1, p: 80e6, T: 600 },
  { region: 2, p: 0.0035e6, T: 700 },
  { region: 2, p: 30e6, T: 700 },
  { region: 3, p: 25.5837018e6, T: 650 },
  { region: 3, p: 60e6, T: 720 },
  { region: 5, p: 30e6, T: 1500 },
  { region: 5, p: 0.5e6, T: 2000 },
];

describe('thermodynamic identities', () => {
  it.each(statesByRegion)(`${SC}: h = u + p v with u from the region's own derivatives (region $region, p = $p Pa, T = $T K)`, ({ region, p, T }) => {
    const out = new Float64Array(13);
    if (region === 1) props1(p, T, out);
    else if (region === 2) props2(p, T, out);
    else if (region === 5) props5(p, T, out);
    else props3(1 / water.pt(p, T).v, T, out);
    const pp = region === 3 ? at(out, 6) : p;
    expectClose(at(out, 0), at(out, 5) + pp * at(out, 2), { rtol: 1e-13 });
  });

  it.each(statesByRegion)(`${SC}: cp equals the central difference of h at constant p (region $region, p = $p Pa, T = $T K)`, ({ region, p, T }) => {
    const st = water.pt(p, T);
    expect(st.region).toBe(region);
    const dT = 1e-3;
    const cpNum = (water.pt(p, T + dT).h - water.pt(p, T - dT).h) / (2 * dT);
    expectClose(st.cp, cpNum, { rtol: 1e-6 });
  });

  it.each(statesByRegion)(`${SC}: (dh/ds) at constant p equals T (region $region, p = $p Pa, T = $T K)`, ({ p, T }) => {
    const a = water.pt(p, T - 1e-3);
    const b = water.pt(p, T + 1e-3);
    expectClose((b.h - a.h) / (b.s - a.s), T, { rtol: 1e-7 });
  });

  it(`${SC}: v of region 3 from water.pt reproduces p through the basic equation`, () => {
    for (const { p, T } of [{ p: 25e6, T: 650 }, { p: 22.1e6, T: 647.5 }, { p: 17e6, T: 626 }, { p: 100e6, T: 800 }]) {
      const st = water.pt(p, T);
      expect(st.region).toBe(3);
      expectClose(water.region3(1 / st.v, T).p, p, { rtol: 1e-12 });
    }
  });
});

describe('round trips between forward and inverse functions', () => {
  it(`${SC}: pt -> h -> ph gives T back within 1e-9 relative over 3000 random states of all regions`, () => {
    const seen = new Set<number>();
    fc.assert(
      fc.property(anyState, ({ p, T }) => {
        const st = water.pt(p, T);
        seen.add(st.region);
        const back = water.ph(p, st.h);
        expect(back.region).toBe(st.region);
        expect(Math.abs(back.T - T) / T).toBeLessThan(1e-9);
      }),
      runs(97, 3000),
    );
    expect([...seen].sort()).toEqual([1, 2, 3, 5]);
  });

  it(`${SC}: pt -> s -> ps gives T back within 1e-9 relative over 3000 random states`, () => {
    fc.assert(
      fc.property(anyState, ({ p, T }) => {
        const back = water.ps(p, water.pt(p, T).s);
        expect(Math.abs(back.T - T) / T).toBeLessThan(1e-9);
      }),
      runs(97, 3000),
    );
  });

  it(`${SC}: round trips near the critical point (region 3, 640..660 K, 21.9..23 MPa)`, () => {
    let worst = 0;
    for (let i = 0; i <= 40; i++) {
      for (let j = 0; j <= 40; j++) {
        const T = 640 + 0.5 * i;
        const p = 21.9e6 + (1.1e6 * j) / 40;
        const st = water.pt(p, T);
        worst = Math.max(worst, Math.abs(water.ph(p, st.h).T - T) / T, Math.abs(water.ps(p, st.s).T - T) / T);
      }
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it(`${SC}: the allocation-free functions agree with the state functions`, () => {
    fc.assert(
      fc.property(anyState, ({ p, T }) => {
        const st = water.pt(p, T);
        expect(water.h_pt(p, T)).toBe(st.h);
        expect(water.s_pt(p, T)).toBe(st.s);
        expect(water.v_pt(p, T)).toBe(st.v);
        expect(water.cp_pt(p, T)).toBe(st.cp);
        expect(water.T_ph(p, st.h)).toBe(water.ph(p, st.h).T);
        expect(water.s_ph(p, st.h)).toBe(water.ph(p, st.h).s);
        expect(water.T_ps(p, st.s)).toBe(water.ps(p, st.s).T);
        expect(water.h_ps(p, st.s)).toBe(water.ps(p, st.s).h);
      }),
      runs(97, 200),
    );
  });

  it(`${SC}: tsat(psat(T)) = T within 1e-9 from 273.15 K to 647.09 K`, () => {
    for (let T = 273.15; T <= 647.09; T += 0.37) expectClose(water.tsat(water.psat(T)), T, { rtol: 1e-9 });
  });

  it(`${SC}: psat(tsat(p)) = p within 1e-9 from 611.213 Pa to 22.06 MPa`, () => {
    for (let k = 0; k <= 500; k++) {
      const p = 611.3 * Math.pow(22.06e6 / 611.3, k / 500);
      expectClose(water.psat(water.tsat(p)), p, { rtol: 1e-9 });
    }
  });
});

describe('two-phase states', () => {
  it.each([0.001e6, 0.1e6, 1e6, 10e6, 16e6, 18e6, 21e6, 22e6, 22.06e6])(`${SC}: px, ph and ps agree on the two-phase state at p = %d Pa`, (p) => {
    for (const x of [0.1, 0.5, 0.9]) {
      const st = water.px(p, x);
      expect(st.region).toBe(4);
      expect(st.phase).toBe('two-phase');
      expect(Number.isNaN(st.cp) && Number.isNaN(st.w)).toBe(true);
      expectClose(st.T, water.tsat(p), { rtol: 1e-15 });
      const liq = water.px(p, 0);
      const vap = water.px(p, 1);
      expect(vap.v).toBeGreaterThan(liq.v);
      expectClose(st.h, liq.h + x * (vap.h - liq.h), { rtol: 1e-14 });
      const byH = water.ph(p, st.h);
      const byS = water.ps(p, st.s);
      expect(byH.region).toBe(4);
      expect(byS.region).toBe(4);
      expectClose(byH.x!, x, { rtol: 1e-9 });
      expectClose(byS.x!, x, { rtol: 1e-9 });
      expectClose(byH.v, st.v, { rtol: 1e-9 });
    }
  });

  it(`${SC}: tx(T, x) lies at psat(T) and matches px there`, () => {
    for (const T of [300, 400, 500, 600, 630, 640, 646, 647.09]) {
      const a = water.tx(T, 0.3);
      expectClose(a.p, water.psat(T), { rtol: 1e-15 });
      const b = water.px(a.p, 0.3);
      expectClose(b.h, a.h, { rtol: 1e-8 });
    }
  });

  it(`${SC}: the saturated liquid from px joins the single-phase liquid below 623.15 K`, () => {
    for (const p of [0.01e6, 1e6, 10e6]) {
      const sat = water.px(p, 0);
      const sub = water.pt(p, sat.T - 1e-6);
      expectClose(sub.h, sat.h, { rtol: 1e-7 });
      expectClose(sat.cp, sub.cp, { rtol: 1e-6 });
    }
  });

  it(`${SC}: saturated phases approach each other and the critical point continuously`, () => {
    let prevGap = Infinity;
    for (const d of [1, 0.1, 0.02, 0.011, 0.009, 0.001, 1e-5, 0]) {
      const T = 647.096 - d;
      const gap = water.tx(T, 1).h - water.tx(T, 0).h;
      expect(gap).toBeGreaterThanOrEqual(0);
      expect(gap).toBeLessThan(prevGap);
      prevGap = gap;
    }
    expect(prevGap).toBe(0);
  });
});

describe('regions and phases', () => {
  it.each([
    { p: 0.1e6, T: 300, region: 1, phase: 'liquid' },
    { p: 0.1e6, T: 400, region: 2, phase: 'vapour' },
    { p: 40e6, T: 700, region: 3, phase: 'supercritical' },
    { p: 20e6, T: 630, region: 3, phase: 'liquid' },
    { p: 18e6, T: 633, region: 3, phase: 'vapour' },
    { p: 30e6, T: 900, region: 2, phase: 'supercritical' },
    { p: 1e6, T: 1500, region: 5, phase: 'vapour' },
    { p: 40e6, T: 1500, region: 5, phase: 'supercritical' },
  ])(`${SC}: p = $p Pa, T = $T K is region $region, $phase`, ({ p, T, region, phase }) => {
    const st = water.pt(p, T);
    expect(st.region).toBe(region);
    expect(st.phase).toBe(phase);
    expect(st.x).toBeNull();
    for (const k of ['p', 'T', 'h', 's', 'v', 'cp', 'w'] as const) expect(Number.isFinite(st[k])).toBe(true);
  });
});

describe('range errors name the input, its value and the valid range', () => {
  const cases: { what: string; call: () => unknown; input: string; value: string }[] = [
    { what: 'negative pressure', call: () => water.pt(-1, 300), input: 'p_Pa', value: '-1' },
    { what: 'zero pressure', call: () => water.pt(0, 300), input: 'p_Pa', value: '0' },
    { what: 'pressure above 100 MPa', call: () => water.pt(101e6, 500), input: 'p_Pa', value: '101000000' },
    { what: 'pressure above 50 MPa in region 5', call: () => water.pt(60e6, 1500), input: 'p_Pa', value: '60000000' },
    { what: 'temperature below 273.15 K', call: () => water.pt(1e5, 273), input: 'T_K', value: '273' },
    { what: 'temperature above 2273.15 K', call: () => water.pt(1e5, 2300), input: 'T_K', value: '2300' },
    { what: 'NaN temperature', call: () => water.pt(1e5, NaN), input: 'T_K', value: 'NaN' },
    { what: 'enthalpy above the range', call: () => water.ph(1e6, 8e6), input: 'h_J_per_kg', value: '8000000' },
    { what: 'enthalpy below the range', call: () => water.ph(1e6, -1e5), input: 'h_J_per_kg', value: '-100000' },
    { what: 'enthalpy of region 5 above 50 MPa', call: () => water.ph(80e6, 4.5e6), input: 'h_J_per_kg', value: '4500000' },
    { what: 'entropy above the range', call: () => water.ps(1e6, 20e3), input: 's_J_per_kgK', value: '20000' },
    { what: 'entropy below the range', call: () => water.ps(1e6, -100), input: 's_J_per_kgK', value: '-100' },
    { what: 'vapour fraction above 1', call: () => water.px(1e6, 1.2), input: 'x', value: '1.2' },
    { what: 'negative vapour fraction', call: () => water.tx(400, -0.1), input: 'x', value: '-0.1' },
    { what: 'px above the critical pressure', call: () => water.px(23e6, 0.5), input: 'p_Pa', value: '23000000' },
    { what: 'tx above the critical temperature', call: () => water.tx(650, 0.5), input: 'T_K', value: '650' },
    { what: 'psat below 273.15 K', call: () => water.psat(250), input: 'T_K', value: '250' },
    { what: 'tsat above the critical pressure', call: () => water.tsat(30e6), input: 'p_Pa', value: '30000000' },
    { what: 'tsat below the triple-point pressure', call: () => water.tsat(500), input: 'p_Pa', value: '500' },
    { what: 'region 3 at negative density', call: () => water.region3(-5, 650), input: 'rho_kg_per_m3', value: '-5' },
  ];
  it.each(cases)(`${SC}: $what throws ThermoRangeError naming $input`, ({ call, input, value }) => {
    let err: unknown;
    try {
      call();
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ThermoRangeError);
    const e = err as ThermoRangeError;
    expect(e.input).toBe(input);
    expect(e.message).toContain(`${input} = ${value}`);
    expect(e.message).toMatch(/valid range .*\d/);
  });
});
