/**
 * A tag's own spread limit and coverage (the model file's tags[], docs/plant-model.md) in the
 * steady-state test of the pure engine: they replace the unit's parameters.spreadLimit and
 * parameters.minCoverage for that tag only, and they are part of the hour's model version.
 * The limits are common practice figures chosen for the test (docs/domain.md section 6).
 */
import { describe, expect, it } from 'vitest';
import { computeUnitHour, type EngineLink, type TagHour } from '~/lib/engine';
import { boilerCase, pumpCase, type EngineCase } from './cases';
import { inputOf, linksOf } from './support';

/** The case's links with the given tags' own limits. */
function withTagLimits(c: EngineCase, limits: Record<string, Pick<EngineLink, 'spreadLimit' | 'minCoverage'>>): EngineLink[] {
  return linksOf(c).map((l) => ({ ...l, ...(limits[l.tagName] ?? {}) }));
}

const hour = (c: EngineCase, change: Record<string, Partial<TagHour>>, limits: Record<string, Pick<EngineLink, 'spreadLimit' | 'minCoverage'>> = {}) =>
  computeUnitHour(inputOf(c, change, { links: withTagLimits(c, limits) }));

/** The pump's flow swinging by `share` of its mean within the hour: (max - min) / mean = share. */
function flowSwing(c: EngineCase, share: number): Record<string, Partial<TagHour>> {
  const flow = c.links.find((l) => l.tag === 'FWP_F')!.reading;
  return { FWP_F: { min: flow * (1 - share / 2), max: flow * (1 + share / 2) } };
}

describe('a tag’s own spread limit', () => {
  it('an hour steady under the unit’s 5 % becomes unsettled under a tighter 3 % of the tag', () => {
    const c = pumpCase();
    const swing = flowSwing(c, 0.04); // 4 % of the mean: inside 5 %, above 3 % (and above the meter's U = 2 % of reading)
    expect(hour(c, swing).state).toBe('steady');
    const tight = hour(c, swing, { FWP_F: { spreadLimit: 0.03 } });
    expect(tight.state).toBe('unsettled');
    expect(tight.reasons).toEqual([expect.objectContaining({ code: 'SPREAD_HIGH', tag: 'FWP_F' })]);
    expect(tight.reasons[0]!.message).toMatch(/3\.0 % of the mean/);
  });

  it('an hour unsettled under the unit’s 5 % becomes steady under a looser 15 % of the tag; the unit’s other tags keep 5 %', () => {
    const c = pumpCase();
    const swing = flowSwing(c, 0.1);
    expect(hour(c, swing).state).toBe('unsettled');
    expect(hour(c, swing, { FWP_F: { spreadLimit: 0.15 } }).state).toBe('steady');
    const p = c.links.find((l) => l.tag === 'FWP_DIS_P')!.reading;
    const both = hour(c, { ...swing, FWP_DIS_P: { min: p * 0.95, max: p * 1.05 } }, { FWP_F: { spreadLimit: 0.15 } });
    expect(both.state).toBe('unsettled');
    expect(both.reasons.map((r) => r.tag)).toEqual(['FWP_DIS_P']);
  });

  it('an O2 tag’s own limit is an absolute spread in fraction, in place of 0.02', () => {
    const c = boilerCase();
    const o2 = c.links.find((l) => l.tag === 'B_STACK_O2')!.reading; // in %
    const swing = { B_STACK_O2: { min: o2 - 0.5, max: o2 + 0.5 } }; // 1 %-point = 0.01 in fraction
    expect(hour(c, swing).state).toBe('steady');
    const tight = hour(c, swing, { B_STACK_O2: { spreadLimit: 0.005 } });
    expect(tight.state).toBe('unsettled');
    expect(tight.reasons).toEqual([expect.objectContaining({ code: 'SPREAD_HIGH', tag: 'B_STACK_O2' })]);
  });
});

describe('a tag’s own coverage rule', () => {
  it('a tag covering 70 % of the hour is suspect under the unit’s 75 % and sound under its own 60 %', () => {
    const c = pumpCase();
    const thin = { FWP_SUC_T: { coveredFraction: 0.7 } };
    const unit = hour(c, thin);
    expect(unit.state).toBe('suspect');
    expect(unit.reasons).toEqual([expect.objectContaining({ code: 'TAG_POOR_COVERAGE', tag: 'FWP_SUC_T' })]);
    expect(hour(c, thin, { FWP_SUC_T: { minCoverage: 0.6 } }).state).toBe('steady');
  });

  it('a tag covering 80 % is sound under the unit’s 75 % and suspect under its own 90 %', () => {
    const c = pumpCase();
    const most = { FWP_KW: { coveredFraction: 0.8 } };
    expect(hour(c, most).state).toBe('steady');
    const own = hour(c, most, { FWP_KW: { minCoverage: 0.9 } });
    expect(own.state).toBe('suspect');
    expect(own.reasons[0]).toEqual(expect.objectContaining({ code: 'TAG_POOR_COVERAGE', tag: 'FWP_KW' }));
    expect(own.reasons[0]!.message).toMatch(/need 90 %/);
  });
});

describe('the model version', () => {
  it('changes with a tag’s own limit, so the hours of a unit that links the tag are computed again', () => {
    const c = pumpCase();
    const plain = hour(c, {});
    const own = hour(c, {}, { FWP_F: { spreadLimit: 0.03 } });
    const other = hour(c, {}, { FWP_F: { spreadLimit: 0.04 } });
    const coverage = hour(c, {}, { FWP_F: { minCoverage: 0.9 } });
    const versions = new Set([plain.modelVersion, own.modelVersion, other.modelVersion, coverage.modelVersion]);
    expect(versions.size).toBe(4);
    expect(own.inputsHash).not.toBe(plain.inputsHash);
  });
});
