/**
 * The spread rule as the engine applies it (src/lib/engine/compute.ts): the link's declared
 * uncertainty and range reach classifyHour, so a flow meter read near the bottom of its range is not
 * held to a spread its instrument cannot resolve. Invented hours of the engine tests' feed pump.
 */
import { describe, expect, it } from 'vitest';
import { computeUnitHour } from '~/lib/engine';
import { pumpCase } from '../engine/cases';
import { inputOf, linksOf } from '../engine/support';

describe('the engine passes each link instrument to the spread rule', () => {
  const c = pumpCase();
  const flow = c.links.find((l) => l.tag === 'FWP_F')!.reading; // t/h
  // the hour's flow swings +-3 % (max - min = 6 % of the mean, above the 5 % spreadLimit)
  const swing = { FWP_F: { min: flow * 0.97, max: flow * 1.03 } };

  it('no range on record: 6 % is above the 5 % limit (the meter resolves 2 x 1 % of reading)', () => {
    const r = computeUnitHour(inputOf(c, swing));
    expect(r.state).toBe('unsettled');
    expect(r.reasons).toEqual([expect.objectContaining({ code: 'SPREAD_HIGH', tag: 'FWP_F' })]);
    expect(r.reasons[0]!.message).toMatch(/a spread at the limit counts as settled/);
  });

  it('the same reading at a fortieth of a 0-40x range: the meter resolves 2 x 1 % of a tenth of its span = 8 %, so the hour is steady', () => {
    const links = linksOf(c).map((l) => (l.tagName === 'FWP_F' ? { ...l, validMin: 0, validMax: 40 * flow } : l));
    const r = computeUnitHour(inputOf(c, swing, { links }));
    expect(r.reasons.filter((x) => x.code === 'SPREAD_HIGH')).toEqual([]);
    expect(r.state).toBe('steady');
    // a swing of 10 % is more than that: unsettled again
    const wide = computeUnitHour(inputOf(c, { FWP_F: { min: flow * 0.95, max: flow * 1.05 } }, { links }));
    expect(wide.state).toBe('unsettled');
  });
});
