import { describe, expect, it } from 'vitest';
import { aggregateSamples, createHourAggregator, mergeHours, tagHourKey, createRowReader, createSampleEmitter, teeSinks } from '~/lib/ingest/index';
import type { RowReader, Sample, TagHour } from '~/lib/ingest/index';
import { fixtureProfile, fixtureText, utc } from './helpers';
import { at as item } from '../support/present';

const at = (hm: string) => utc(`2024-03-05T${hm}:00Z`);
const series = (tag: string, from: string, to: string, stepMin: number, value: number): Sample[] => {
  const out: Sample[] = [];
  for (let t = at(from); t <= at(to); t += stepMin * 60_000) out.push({ tag, timeMs: t, value });
  return out;
};

describe('aggregateSamples', () => {
  it('recomputes an hour from one set of stored samples', () => {
    const hours = aggregateSamples(series('B1.FT-101', '10:00', '11:00', 10, 7), { timeZone: 'UTC' });
    expect(hours.map((h) => [h.hourStartMs, h.mean, h.coveredSeconds])).toEqual([
      [at('10:00'), 7, 3600],
      [at('11:00'), 7, 0],
    ]);
  });

  it('the newer upload wins inside the span it covers; older samples elsewhere are kept', () => {
    const older = { priority: 1, samples: series('B1.FT-101', '10:00', '11:00', 10, 10) };
    const newer = { priority: 2, samples: series('B1.FT-101', '10:20', '10:40', 10, 20) };
    const hours = aggregateSamples([older, newer], { timeZone: 'UTC', toMs: at('11:00') });
    // kept: 10 at 10:00, 10:10 (older); 20 at 10:20, 10:30, 10:40 (newer); 10 at 10:50, 11:00 (older)
    // trapezoids of 10 min: 10, 15, 20, 20, 15, 10 -> 90 / 6 = 15
    expect(hours).toHaveLength(1);
    expect(hours[0]).toMatchObject({ mean: 15, sampleCount: 6, min: 10, max: 20, coveredSeconds: 3600, duplicateCount: 0 });
  });

  it('samples of two files are pooled by time; the newer value wins only at the same instant', () => {
    const older = { priority: 1, samples: series('B1.FT-101', '10:00', '11:00', 10, 10) };
    const newer = { priority: 2, samples: [...series('B1.FT-101', '10:05', '10:25', 10, 40), { tag: 'B1.FT-101', timeMs: at('10:30'), value: 70 }] };
    const { hours, contributors } = mergeHours([older, newer], { timeZone: 'UTC', toMs: at('11:00') });
    // kept: 10 @10:00, 40 @10:05, 10 @10:10, 40 @10:15, 10 @10:20, 40 @10:25, 70 @10:30 (newer wins), 10 @10:40, 10 @10:50, 10 @11:00
    // 5-min trapezoids 10:00-10:30: 25 x5 (area 125), then 40->70 (5 min: 275); 10:30-10:40 70->10 (400); 10:40-11:00 10 (200)
    // mean = (5*25*5 + 275 + 400 + 200) / 60 = 1500 / 60 = 25
    expect(hours).toHaveLength(1);
    expect(hours[0]).toMatchObject({ mean: 25, sampleCount: 9, min: 10, max: 70, first: 10, last: 10, coveredSeconds: 3600 });
    expect(contributors.get(tagHourKey('B1.FT-101', at('10:00')))).toEqual([2, 1]);
  });

  it('an hour whose older samples were all replaced has the newer file as its only contributor', () => {
    const older = { priority: 1, samples: series('B1.FT-101', '10:00', '10:50', 10, 10) };
    const newer = { priority: 2, samples: series('B1.FT-101', '10:00', '10:50', 10, 11) };
    const { hours, contributors } = mergeHours([older, newer], { timeZone: 'UTC' });
    expect(item(hours, 0, 'hours').mean).toBe(11);
    expect(contributors.get(tagHourKey('B1.FT-101', at('10:00')))).toEqual([2]);
  });

  it("a newer file's rejected cell does not erase an older reading at the same instant", () => {
    const older = { priority: 1, samples: series('B1.FT-101', '10:00', '10:50', 10, 10) };
    const newer = { priority: 2, samples: [{ tag: 'B1.FT-101', timeMs: at('10:20'), value: null, raw: '1e308' }, { tag: 'B1.FT-101', timeMs: at('10:30'), value: 30 }] };
    const { hours } = mergeHours([older, newer], { timeZone: 'UTC' });
    // kept: 10 @10:00, 10:10, 10:20 (older: the newer cell was rejected), 30 @10:30 (newer), 10 @10:40, 10:50
    expect(hours[0]).toMatchObject({ sampleCount: 6, nonNumericCount: 0, max: 30 });
  });

  it('an explicit span drops older samples even where the newer source has none', () => {
    const older = { priority: 1, samples: series('B1.FT-101', '10:00', '11:00', 10, 10) };
    const newer = { priority: 2, spanStartMs: at('10:00'), spanEndMs: at('10:35'), samples: series('B1.FT-101', '10:00', '10:30', 10, 30) };
    const hours = aggregateSamples([older, newer], { timeZone: 'UTC', fromMs: at('10:00'), toMs: at('11:00') });
    // kept: 30 at 10:00..10:30 (newer), 10 at 10:40, 10:50 (older; 10:40 is outside the span)
    // pieces: 30,30,30 (30 min) then 10:30->10:40 30->10 (20), 10:40->10:50 (10), 10:50->11:00 (10)
    // mean = (30*30 + 20*10 + 10*10 + 10*10) / 60 = 1300 / 60
    expect(item(hours, 0, 'hours').mean).toBeCloseTo(1300 / 60, 12);
  });

  it('keeps tags apart, sorts hours by tag, and reads null values and quality', () => {
    const samples: Sample[] = [
      { tag: 'B1.TT-102', timeMs: at('10:00'), value: 480 },
      { tag: 'B1.TT-102', timeMs: at('10:10'), value: null, raw: 'Shutdown' },
      { tag: 'B1.FT-101', timeMs: at('10:00'), value: 5, quality: '192' },
      { tag: 'B1.FT-101', timeMs: at('10:10'), value: 6, quality: 'Bad' },
      { tag: 'B1.FT-101', timeMs: at('10:20'), value: null },
    ];
    const hours = aggregateSamples(samples, { timeZone: 'UTC' });
    expect(hours.map((h) => [h.tag, h.sampleCount, h.nonNumericCount, h.badQualityCount])).toEqual([
      ['B1.FT-101', 1, 0, 1],
      ['B1.TT-102', 1, 1, 0],
    ]);
  });
});

describe('createSampleEmitter and teeSinks', () => {
  it('stored samples re-aggregate to exactly the hours of the streaming pass', () => {
    for (const name of ['status-words.csv', 'long-quality.csv', 'duplicate-times.csv', 'dst-autumn-berlin.csv']) {
      const samples: Sample[] = [];
      const streamed: TagHour[] = [];
      const agg = createHourAggregator({ timeZone: 'Europe/Berlin', onHour: (h) => streamed.push(h) });
      let reader: RowReader | null = null;
      const store = createSampleEmitter((s) => samples.push(s), { cellText: (k) => reader!.cellText(k) });
      reader = createRowReader(fixtureProfile(name), { timeZone: 'Europe/Berlin', sink: teeSinks(agg, store) });
      reader.push(fixtureText(name));
      reader.end();
      agg.flush();
      const again = aggregateSamples(samples, { timeZone: 'Europe/Berlin' });
      const order = (a: TagHour, b: TagHour) => a.tag.localeCompare(b.tag) || a.hourStartMs - b.hourStartMs;
      expect(again.sort(order), name).toEqual(streamed.sort(order));
    }
  });

  it('keeps the text of rejected cells', () => {
    const samples: Sample[] = [];
    let reader: RowReader | null = null;
    const sink = createSampleEmitter((s) => samples.push(s), { cellText: (k) => reader!.cellText(k) });
    reader = createRowReader(fixtureProfile('status-words.csv'), { timeZone: 'UTC', sink });
    reader.push(fixtureText('status-words.csv'));
    reader.end();
    expect(samples.filter((s) => s.value === null).map((s) => s.raw)).toEqual(['Shutdown', 'I/O Timeout', 'Bad', '#N/A', 'Shutdown']);
  });
});
