/**
 * The fast path of the engine against the straightforward one, on every unit kind of the engine bench
 * (tests/engine/cases.ts), at random points around the cases' readings (fast-check):
 * - the planned hour (src/lib/engine/hour-plan.ts: the mapping kept per link set, an hour only fills the
 *   input vector) gives the same row as the full mapping of the same hour;
 * - the sweep kernel (src/lib/equipment/sweep-kernel.ts) gives the same uncertainties (GUM 5.1.2 eq. 10,
 *   JCGM 100:2008) as moving the full balance for every input, to 1e-9 relative.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeUnitHour, type TagHour, type UnitHourResult } from '~/lib/engine';
import { deadStateOf } from '~/lib/engine/compute';
import { runBalance } from '~/lib/engine/checks';
import { mapUnitHour } from '~/lib/engine/map';
import { unitHourWithUncertainty } from '~/lib/equipment';
import { ALL_CASES } from './cases';
import { hoursOf, inputOf } from './support';

const row = (r: UnitHourResult) => {
  const { detail: _d, ...rest } = Object.getOwnPropertyDescriptors(r);
  return Object.fromEntries(Object.entries(rest).map(([k, d]) => [k, d.value]));
};

/** Each tag's mean moved: temperatures by up to +-3 K, others by up to +-3 %; maybe one tag missing. */
const moves = (n: number) =>
  fc.record({ f: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: n, maxLength: n }), drop: fc.integer({ min: -3 * n, max: n - 1 }) });

describe('the planned hour against the full mapping', () => {
  for (const c of ALL_CASES()) {
    it(`${c.id}: same row at random readings`, () => {
      const base = inputOf(c);
      computeUnitHour(base); // the first hour of the link set keeps the plan
      let planned = 0;
      fc.assert(
        fc.property(moves(c.links.length), ({ f, drop }) => {
          const hours = hoursOf(c);
          c.links.forEach((l, i) => {
            const th = hours.get(l.tag)!;
            const mean = l.quantity === 'temperature' ? th.mean! + 3 * f[i]! : th.mean! * (1 + 0.03 * f[i]!);
            hours.set(l.tag, { ...th, mean, min: mean, max: mean } as TagHour);
          });
          if (drop >= 0) hours.delete(c.links[drop]!.tag);
          const fast = computeUnitHour({ ...base, tagHours: hours });
          const full = computeUnitHour({ ...base, links: [...base.links], tagHours: hours });
          expect(row(fast)).toEqual(row(full));
          if (drop < 0) planned++;
        }),
        { numRuns: 25, seed: 15 },
      );
      expect(planned).toBeGreaterThan(5);
      // The audit trail of a planned hour is the full mapping's.
      expect(computeUnitHour(base).detail).toEqual(computeUnitHour({ ...base, links: [...base.links] }).detail);
    });
  }
});

describe('the sweep kernel against moving the full balance', () => {
  const close = (a: number, b: number) => expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-9 * Math.max(Math.abs(a), Math.abs(b), 1e-300));
  for (const c of ALL_CASES()) {
    it(`${c.id}: same uncertainties to 1e-9 at random points`, () => {
      const input = inputOf(c);
      const mapped = mapUnitHour(input.unit, input.links, input.tagHours, input.site.p_atm_Pa);
      const run = runBalance(input.unit, mapped, [], deadStateOf(input), false);
      const x0 = Float64Array.from(run.entries.map((e) => e.value));
      const u = Float64Array.from(run.entries.map((e) => e.u));
      fc.assert(
        fc.property(fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: x0.length, maxLength: x0.length }), (f) => {
          const x = x0.map((v, i) => (i < 2 ? v : v * (1 + 0.01 * f[i]!)));
          const fast = unitHourWithUncertainty(mapped.balanceKind, mapped.model, x, u);
          const full = unitHourWithUncertainty(mapped.balanceKind, mapped.model, x, u, { fullSweep: true });
          expect(fast.unavailable).toEqual(full.unavailable);
          for (const k of ['fuel_W', 'loss_W', 'destruction_W'] as const) close(fast[k].u, full[k].u);
          if (full.product_W) close(fast.product_W!.u, full.product_W.u);
          if (full.efficiency) close(fast.efficiency!.u, full.efficiency.u);
          expect(full.destruction_W.u).toBeGreaterThan(0);
        }),
        { numRuns: 20, seed: 15 },
      );
    });
  }
});
