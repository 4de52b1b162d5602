/**
 * The steady-state test's all-clear (src/lib/engine/steady-fast.ts) against the full test
 * (src/lib/analytics/steady.ts classifyHour through the engine's hourState): on every unit kind of the
 * engine bench (tests/engine/cases.ts), hours with random spreads, coverage, sample and status-word
 * counts, out-of-range samples, frozen tags and loads must give the same row (state, reasons, figures)
 * through the planned hour (which takes the quick test) as through the full mapping (which does not).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeUnitHour, type TagHour, type UnitHourResult } from '~/lib/engine';
import { ALL_CASES } from './cases';
import { hoursOf, inputOf } from './support';

const row = (r: UnitHourResult) => {
  const { detail: _d, ...rest } = Object.getOwnPropertyDescriptors(r);
  return Object.fromEntries(Object.entries(rest).map(([k, d]) => [k, d.value]));
};

/** Per tag: spread as a share of the mean (often near the limits), and now and then one flaw. */
const tagMove = fc.record({
  spread: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 0.12, noNaN: true }), fc.constantFrom(0.05, 0.1, 0.02)),
  useStd: fc.boolean(),
  flaw: fc.oneof({ weight: 6, arbitrary: fc.constant('none') }, { weight: 1, arbitrary: fc.constantFrom('flat', 'coverage', 'samples', 'status', 'range', 'zero') }),
});

describe('the quick steady-state test against the full one', () => {
  for (const c of ALL_CASES()) {
    it(`${c.id}: same state and reasons at random hours`, () => {
      const base = inputOf(c);
      computeUnitHour(base); // the first hour of the link set keeps the plan
      const states = new Set<string>();
      fc.assert(
        fc.property(fc.array(tagMove, { minLength: c.links.length, maxLength: c.links.length }), fc.oneof(fc.constant(1), fc.double({ min: 0.001, max: 1.1, noNaN: true })), fc.boolean(), (moves, load, calm) => {
          const hours = hoursOf(c);
          c.links.forEach((l, i) => {
            const m = moves[i]!;
            const th = hours.get(l.tag)!;
            const isLoad = l.quantity === 'massFlow' || l.quantity === 'power' || l.quantity === 'standardVolumeFlow';
            const mean = isLoad ? th.mean! * load : th.mean!;
            // a calm hour: no flaws, spreads up to the default limit (5 % of the mean) and at it
            const spread = calm ? Math.min(m.spread, 0.05) : m.spread;
            const flaw = calm ? 'none' : m.flaw;
            const half = (Math.abs(mean) * spread) / 2;
            const t: TagHour = m.useStd
              ? { ...th, mean, min: null, max: null, std: 2 * half }
              : { ...th, mean, min: mean - half, max: mean + half };
            if (flaw === 'flat') t.flatline = true;
            if (flaw === 'coverage') t.coveredFraction = 0.5;
            if (flaw === 'samples') t.samples = 1;
            if (flaw === 'status') t.nonNumeric = Math.ceil(t.samples / 5);
            if (flaw === 'range') t.outOfRange = 1;
            if (flaw === 'zero') t.samples = 0;
            hours.set(l.tag, t);
          });
          const fast = computeUnitHour({ ...base, tagHours: hours });
          const full = computeUnitHour({ ...base, links: [...base.links], tagHours: hours });
          expect(row(fast)).toEqual(row(full));
          states.add(full.state);
        }),
        { numRuns: 80, seed: 21 },
      );
      // the hours reach the quick test's both answers
      expect(states.has('steady')).toBe(true);
      expect(states.size).toBeGreaterThan(1);
    });
  }
});
