/**
 * The uncertainty sweep's perturbed balances are lean (F, P, L, D and efficiency only, no port
 * records or companion figures). This checks, on every unit kind of the engine bench
 * (tests/engine/cases.ts), that the lean sweep gives the same sensitivities and uncertainties as
 * central differences (GUM 5.1.2 eq. 10, JCGM 100:2008) over the full balance recomputed at each
 * perturbed input, to 1e-9 relative.
 */
import { describe, expect, it } from 'vitest';
import { at } from '../support/present';
import { evaluateUnitHour, unitHourWithUncertainty, type UnitBalance } from '~/lib/equipment';
import { deadStateOf } from '~/lib/engine/compute';
import { runBalance } from '~/lib/engine/checks';
import { mapUnitHour } from '~/lib/engine/map';
import { ALL_CASES } from './cases';
import { inputOf } from './support';

const close = (a: number, b: number) => expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-9 * Math.max(Math.abs(a), Math.abs(b), 1e-300));
const figures = (b: UnitBalance) => [b.fuel_W, b.product_W ?? NaN, b.loss_W, b.destruction_W, b.efficiency ?? NaN];

describe('the lean uncertainty sweep against the full recomputation', () => {
  for (const c of ALL_CASES()) {
    it(`${c.id} (${c.kind}): same sensitivities and uncertainties to 1e-9`, () => {
      const input = inputOf(c);
      const mapped = mapUnitHour(input.unit, input.links, input.tagHours, input.site.p_atm_Pa);
      expect(mapped.problems).toEqual([]);
      const run = runBalance(input.unit, mapped, [], deadStateOf(input), false);
      const x = Float64Array.from(run.entries.map((e) => e.value));
      const u = Float64Array.from(run.entries.map((e) => e.u));
      const fast = unitHourWithUncertainty(mapped.balanceKind, mapped.model, x, u);
      // The full recomputation: a fresh model object each time (nothing compiled or memoised is shared).
      const full = (xs: Float64Array) => figures(evaluateUnitHour(mapped.balanceKind, structuredClone(mapped.model), xs));
      const variance = [0, 0, 0, 0, 0];
      let swept = 0;
      for (let i = 0; i < x.length; i++) {
        if (u[i] === 0) continue;
        swept++;
        const h = 1e-6 * Math.max(Math.abs(x[i]!), u[i]!);
        const xp = Float64Array.from(x);
        const xm = Float64Array.from(x);
        xp[i] = x[i]! + h;
        xm[i] = x[i]! - h;
        const yp = full(xp);
        const ym = full(xm);
        for (let j = 0; j < 5; j++) variance[j] = at(variance, j) + (((yp[j]! - ym[j]!) / (2 * h)) * u[i]!) ** 2;
        close(fast.sensitivity.destruction_W[i]!, (yp[3]! - ym[3]!) / (2 * h));
        if (fast.efficiency) close(fast.sensitivity.efficiency[i]!, (yp[4]! - ym[4]!) / (2 * h));
      }
      expect(swept).toBeGreaterThan(3);
      expect(fast.unavailable).toEqual([]);
      close(fast.fuel_W.u, Math.sqrt(variance[0]!));
      if (fast.product_W) close(fast.product_W.u, Math.sqrt(variance[1]!));
      close(fast.loss_W.u, Math.sqrt(variance[2]!));
      close(fast.destruction_W.u, Math.sqrt(variance[3]!));
      if (fast.efficiency) close(fast.efficiency.u, Math.sqrt(variance[4]!));
      expect(fast.destruction_W.u).toBeGreaterThan(0);
    });
  }
});
