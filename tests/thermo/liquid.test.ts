import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/expect-close';
import { LIQUID_P_REF_Pa, LIQUID_T_REF_K, liquid, liquidFlowExergy } from '~/lib/thermo/liquid';
import { deadState, flowExergy } from '~/lib/thermo/exergy';
import { ThermoRangeError } from '~/lib/thermo/errors';

// an invented thermal oil (fixture data, not a product's data sheet)
const oil = liquid({ cp_J_per_kgK: 2300, rho_kg_per_m3: 850, label: 'thermal oil (fixture)' });

describe('incompressible liquid', () => {
  it('self-consistency: h = cp (T - Tref) + v (p - pref) and s = cp ln(T/Tref)', () => {
    expectClose(oil.h(LIQUID_T_REF_K, LIQUID_P_REF_Pa), 0, { atol: 1e-12 });
    expectClose(oil.s(LIQUID_T_REF_K), 0, { atol: 1e-12 });
    expectClose(oil.h(523.15, 8e5), 2300 * 225 + (8e5 - 101325) / 850, { rtol: 1e-12 });
    expectClose(oil.s(523.15), 2300 * Math.log(523.15 / 298.15), { rtol: 1e-12 });
    const st = oil.pt(8e5, 523.15);
    expect(st).toMatchObject({ p: 8e5, T: 523.15, v: 1 / 850, cp: 2300 });
    expectClose(oil.T_ph(8e5, st.h), 523.15, { rtol: 1e-12 });
  });

  it('docs/domain.md s.5: psi = c[(T - T0) - T0 ln(T/T0)] + v (p - p0) equals the general flow exergy', () => {
    for (const [T0, p0] of [
      [298.15, 101325],
      [278.15, 98000],
      [313.15, 103000],
    ] as const) {
      const dead = deadState.liquid(oil, T0, p0);
      for (const [T, p] of [
        [523.15, 8e5],
        [350, 2e5],
        [260, 5e4],
        [T0, p0],
      ] as const) {
        const general = flowExergy({ h: oil.h(T, p), s: oil.s(T) }, dead);
        const closed = 2300 * (T - T0 - T0 * Math.log(T / T0)) + ((p - p0) * 1) / 850;
        expectClose(general, closed, { rtol: 1e-10, atol: 1e-9, label: `T=${T} p=${p} T0=${T0}` });
        expectClose(liquidFlowExergy(oil, T, p, T0, p0), closed, { rtol: 1e-12, atol: 1e-9 });
      }
    }
  });

  it('self-consistency: the thermal part is never negative (zero only at T0)', () => {
    for (const T of [200, 250, 290, 298.15, 310, 600]) {
      expect(liquidFlowExergy(oil, T, 101325, 298.15, 101325)).toBeGreaterThanOrEqual(0);
    }
  });

  it('rejects bad parameters and states with ThermoRangeError', () => {
    expect(() => liquid({ cp_J_per_kgK: 0, rho_kg_per_m3: 1000 })).toThrow(ThermoRangeError);
    expect(() => liquid({ cp_J_per_kgK: 4180, rho_kg_per_m3: -1 })).toThrow(ThermoRangeError);
    expect(() => oil.h(100, 1e5)).toThrow(ThermoRangeError);
    expect(() => oil.h(300, -1)).toThrow(ThermoRangeError);
    expect(() => oil.s(Number.NaN)).toThrow(ThermoRangeError);
  });
});
