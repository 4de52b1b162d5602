/**
 * First-order (GUM) uncertainty of a unit hour against a Monte Carlo propagation of the same case
 * (JCGM 101:2008, analytics' seeded monteCarlo), and against analytics' `propagate` (same method,
 * shared implementation), for a turbine and a boiler of the invented reference plant.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/expect-close';
import { at } from '../support/present';
import { monteCarlo, propagate } from '~/lib/analytics/uncertainty';
import { evaluateUnitHour, inputNames, inputVector, unitHourWithUncertainty, type BalanceKind, type UnitModel } from '~/lib/equipment';

interface RefCase {
  id: string;
  kind: BalanceKind;
  model: UnitModel;
  inputs: Record<string, number>;
}
const FIX = JSON.parse(readFileSync(new URL('../fixtures/equipment-reference.json', import.meta.url), 'utf8')) as { cases: RefCase[] };
const byId = (id: string) => FIX.cases.find((c) => c.id === id)!;

/** Standard uncertainties, common practice (docs/domain.md s.6): RTD 0.5 K, pressure 0.25 %, flow 1 %, power 0.5 %. */
function typicalU(names: readonly string[], x: Float64Array): Float64Array {
  return Float64Array.from(names.map((n, i) => {
    if (n === 'T0_K' || n === 'p0_Pa') return 0;
    if (n.endsWith('.T_K')) return 0.5;
    if (n.endsWith('.p_Pa')) return 0.0025 * at(x, i);
    if (n.endsWith('.mDot_kg_per_s')) return 0.01 * at(x, i);
    if (n.endsWith('.O2_fraction')) return 0.002;
    if (n.endsWith('Efficiency')) return 0.003;
    if (n.endsWith('_W')) return 0.005 * at(x, i);
    return 0;
  }));
}

const CASES = [
  { id: 'turbine-extraction-wet-exhaust', trials: 20000 },
  { id: 'boiler-gas-reheat-blowdown', trials: 20000 },
];

describe.each(CASES)('JCGM 101:2008 Monte Carlo vs first-order propagation: $id', ({ id, trials }) => {
  const c = byId(id);
  const names = inputNames(c.kind, c.model);
  const x = inputVector(c.kind, c.model, c.inputs);
  const u = typicalU(names, x);
  const r = unitHourWithUncertainty(c.kind, c.model, x, u);

  it('expanded uncertainty (k = 2) of efficiency and destruction within 10 % of Monte Carlo', () => {
    const mc = monteCarlo((xx) => {
      const b = evaluateUnitHour(c.kind, c.model, xx);
      return [b.efficiency!, b.destruction_W];
    }, x, u, { trials, seed: 2024 });
    expect(r.k).toBe(2);
    expectClose(r.efficiency!.U, 2 * at(mc.u, 0), { rtol: 0.1, label: 'U(efficiency)' });
    expectClose(r.destruction_W.U, 2 * at(mc.u, 1), { rtol: 0.1, label: 'U(destruction)' });
    // and the uncertainty is not trivially small: it is at least 0.1 % of the value
    expect(r.efficiency!.U).toBeGreaterThan(1e-3 * r.efficiency!.value);
  });

  it("self-consistency: equals analytics' propagate on the same model", () => {
    const p = propagate((xx) => {
      const b = evaluateUnitHour(c.kind, c.model, xx);
      return [b.efficiency!, b.destruction_W];
    }, x, u);
    expectClose(r.efficiency!.u, at(p.u, 0), { rtol: 1e-4, label: 'u(efficiency)' });
    expectClose(r.destruction_W.u, at(p.u, 1), { rtol: 1e-4, label: 'u(destruction)' });
    expectClose(r.efficiency!.value, at(p.y, 0), { rtol: 1e-12 });
  });
});

describe('uncertainty details', () => {
  it('self-consistency: inputs with u = 0 contribute nothing and are not stepped (saturated states stay valid)', () => {
    const c = byId('heat-exchanger-steam-water');
    const names = inputNames(c.kind, c.model);
    const x = inputVector(c.kind, c.model, c.inputs);
    const u = new Float64Array(names.length);
    const iT = names.indexOf('water-out.T_K');
    expect(iT, 'the input water-out.T_K').toBeGreaterThanOrEqual(0);
    u[iT] = 0.5;
    const r = unitHourWithUncertainty(c.kind, c.model, x, u);
    // only one input: u(eff) = |d eff / dT| * 0.5, and the sensitivity is that of a one-sided finite difference
    const h = 1e-3;
    const xp = Float64Array.from(x);
    xp[iT] = at(xp, iT) + h;
    const xm = Float64Array.from(x);
    xm[iT] = at(xm, iT) - h;
    const d = (evaluateUnitHour(c.kind, c.model, xp).efficiency! - evaluateUnitHour(c.kind, c.model, xm).efficiency!) / (2 * h);
    expectClose(r.efficiency!.u, Math.abs(d) * 0.5, { rtol: 1e-4 });
    for (let i = 0; i < names.length; i++) if (i !== iT) expect(r.sensitivity.efficiency[i]).toBe(0);
    expect(r.unavailable).toEqual([]);
  });

  it('self-consistency: a dissipative unit has no efficiency uncertainty, only destruction', () => {
    const c = byId('valve-letdown-isenthalpic');
    const names = inputNames(c.kind, c.model);
    const x = inputVector(c.kind, c.model, c.inputs);
    const r = unitHourWithUncertainty(c.kind, c.model, x, typicalU(names, x));
    expect(r.efficiency).toBeNull();
    expect(r.product_W).toBeNull();
    expect(r.destruction_W.U).toBeGreaterThan(0);
    // 1 % flow uncertainty alone gives 1 % of D (D is proportional to the flow)
    const only = new Float64Array(names.length);
    only[names.indexOf('inlet.mDot_kg_per_s')] = 0.01 * at(x, names.indexOf('inlet.mDot_kg_per_s'), 'inputs');
    expectClose(unitHourWithUncertainty(c.kind, c.model, x, only).destruction_W.u, 0.01 * r.balance.destruction_W, { rtol: 1e-6 });
  });
});
