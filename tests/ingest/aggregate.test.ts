import { describe, expect, it } from 'vitest';
import { CellStatus, createHourAggregator } from '~/lib/ingest/index';
import type { TagHour, TagOptions } from '~/lib/ingest/index';
import { expectClose } from '../support/expect-close';
import { hourOf, ingestFixture, referenceStats, utc } from './helpers';
import { at } from '../support/present';

/** Feeds [ISO time, value] samples of one tag and returns its hours. */
function aggregate(samples: [string, number | string][], options: { timeZone?: string; tag?: Partial<TagOptions>; maxGapSeconds?: number } = {}): TagHour[] {
  const hours: TagHour[] = [];
  const agg = createHourAggregator({
    timeZone: options.timeZone ?? 'UTC',
    maxGapSeconds: options.maxGapSeconds,
    tagOptions: () => options.tag ?? {},
    onHour: (h) => hours.push(h),
  });
  const k = agg.tagIndex('B1.XT-100');
  for (const [iso, v] of samples) {
    if (typeof v === 'number') agg.addSample(k, utc(iso), v, CellStatus.Ok);
    else agg.addSample(k, utc(iso), NaN, v === '' ? CellStatus.Blank : v === 'bad' ? CellStatus.BadQuality : CellStatus.Text);
  }
  agg.flush();
  return hours;
}

const t = (hm: string) => `2024-03-05T${hm}:00Z`;

describe('createHourAggregator: statistics against hand-worked values', () => {
  it('wide fixture, 15-minute samples: trapezoid mean, time-weighted spread, extremes, first and last', () => {
    const { hours } = ingestFixture('wide-units.csv', { timeZone: 'UTC' });
    const h = hourOf(hours, 'B1.FT-101', '2024-03-05T10:00:00Z');
    // 50,52,54,50 at :00,:15,:30,:45 and 48 at 11:00. Trapezoids of 15 min: 51, 53, 52, 49 -> mean 205/4 = 51.25.
    expect(h.mean).toBe(51.25);
    expect(h.meanMethod).toBe('time-weighted');
    // (1/T)∫x² over each linear piece is (a²+ab+b²)/3: 2601.333, 2809.333, 2705.333, 2401.333 -> 2629.3333;
    // minus 51.25² = 2626.5625 gives 2.7708333 -> spread 1.664582.
    expectClose(h.stdDev!, Math.sqrt(2629.3333333333333 - 51.25 * 51.25), { rtol: 1e-12 });
    const ref = referenceStats([[utc(t('10:00')), 50], [utc(t('10:15')), 52], [utc(t('10:30')), 54], [utc(t('10:45')), 50], [utc(t('11:00')), 48]], utc(t('10:00')), utc(t('11:00')), 'linear');
    expectClose(h.mean!, ref.mean, { rtol: 1e-9 });
    expectClose(h.stdDev!, ref.std, { rtol: 1e-6 });
    expect(h).toMatchObject({ min: 50, max: 54, first: 50, last: 50, sampleCount: 4, coveredSeconds: 3600, coveredFraction: 1, flatline: false });
    // the 11:00 sample alone: nothing covered, so the mean of its samples
    expect(hourOf(hours, 'B1.FT-101', '2024-03-05T11:00:00Z')).toMatchObject({ mean: 48, meanMethod: 'samples', coveredSeconds: 0, sampleCount: 1 });
  });

  it('a segment across the hour boundary is split there, each hour gets its share', () => {
    // 0 at 10:50 and 120 at 11:10 (gap 20 min, bridged with maxGap 30 min): the line is 60 at 11:00.
    const hours = aggregate([[t('10:50'), 0], [t('11:10'), 120]], { maxGapSeconds: 1800 });
    expect(hours.map((h) => [new Date(h.hourStartMs).toISOString(), h.mean, h.coveredSeconds, h.min, h.max])).toEqual([
      ['2024-03-05T10:00:00.000Z', 30, 600, 0, 0], // mean of 0..60; extremes of the samples inside
      ['2024-03-05T11:00:00.000Z', 90, 600, 120, 120], // mean of 60..120
    ]);
  });

  it('a gap longer than maxGapSeconds is not bridged', () => {
    const hours = aggregate([[t('10:00'), 1], [t('10:20'), 2]]); // 20 min > 15 min default
    expect(hours).toHaveLength(1);
    expect(hours[0]).toMatchObject({ coveredSeconds: 0, meanMethod: 'samples', mean: 1.5, sampleCount: 2 });
  });

  it('an hour with no sample but crossed by a bridged segment is emitted, covered by interpolation', () => {
    const hours = aggregate([[t('09:30'), 0], [t('11:30'), 120]], { maxGapSeconds: 3 * 3600 });
    const mid = hours.find((h) => h.hourStartMs === utc(t('10:00')))!;
    // line from 0 at 09:30 to 120 at 11:30 is 30 at 10:00 and 90 at 11:00: mean 60, extremes 30 and 90
    expect(mid).toMatchObject({ mean: 60, coveredSeconds: 3600, sampleCount: 0, min: 30, max: 90, first: null });
  });

  it('status tags hold the previous value (step), analog tags interpolate', () => {
    const samples: [string, number][] = [[t('10:00'), 0], [t('10:15'), 1], [t('10:45'), 0], [t('11:00'), 0]];
    const step = at(aggregate(samples, { tag: { kind: 'status', maxGapSeconds: 1800 } }), 0, 'hours');
    // held: 0 for 15 min, 1 for 30 min, 0 for 15 min -> mean 0.5, spread 0.5
    expect(step.mean).toBe(0.5);
    expect(step.stdDev).toBe(0.5);
    const linear = at(aggregate(samples, { maxGapSeconds: 1800 }), 0, 'hours');
    // linear: 0->1 over 15 min (0.5), 1->0 over 30 min (0.5), 0->0 over 15 min (0) -> (7.5 + 15 + 0) / 60 = 0.375
    expect(linear.mean).toBe(0.375);
    const ref = referenceStats(samples.map(([iso, v]) => [utc(iso), v]), utc(t('10:00')), utc(t('11:00')), 'step', 1_800_000);
    expectClose(step.mean!, ref.mean, { rtol: 1e-12 });
    expectClose(step.stdDev!, ref.std, { rtol: 1e-12 });
    // with the default 15 min gap the 30 min hold is not bridged: only the two 0 stretches remain
    expect(aggregate(samples, { tag: { kind: 'status' } })[0]).toMatchObject({ mean: 0, coveredSeconds: 1800 });
  });

  it('rejected samples are counted in their hour and break the signal; blanks are no samples', () => {
    const hours = aggregate([[t('10:00'), 10], [t('10:05'), 'Shutdown'], [t('10:10'), 20], [t('10:15'), ''], [t('10:20'), 30], [t('10:25'), 'bad'], [t('10:30'), 40]]);
    // drawn: 10:10->10:20 only (20->30, 10 min); 10:00->10:10 crosses 'Shutdown', 10:20->10:30 crosses 'bad'
    expect(hours[0]).toMatchObject({ mean: 25, coveredSeconds: 600, sampleCount: 4, nonNumericCount: 1, badQualityCount: 1, min: 10, max: 40 });
  });

  it('values outside [validMin, validMax] are counted as out of range and not used', () => {
    const hours = aggregate([[t('10:00'), 10], [t('10:10'), 9999], [t('10:20'), 20], [t('10:30'), 30]], { tag: { validMin: 0, validMax: 1000 } });
    expect(hours[0]).toMatchObject({ outOfRangeCount: 1, sampleCount: 3, max: 30, mean: 25, coveredSeconds: 600 });
  });

  it('duplicates: the later sample wins; out-of-order samples are dropped and counted', () => {
    const { hours } = ingestFixture('duplicate-times.csv', { timeZone: 'UTC' });
    const h = hours[0];
    // 50 at 10:00, 70 at 10:10 (replacing 60), 99 at 10:05 dropped, 80 at 10:20:
    // (60*600 + 75*600) / 1200 = 67.5
    expect(h).toMatchObject({ mean: 67.5, duplicateCount: 1, outOfOrderCount: 1, sampleCount: 3, min: 50, max: 80, coveredSeconds: 1200 });
  });

  it('flatline: an unchanged value longer than the limit flags the hour where the run passes it', () => {
    const samples: [string, number][] = [];
    for (let m = 0; m <= 180; m += 10) samples.push([new Date(utc(t('00:00')) + m * 60_000).toISOString(), 5]);
    const hours = aggregate(samples, { tag: { flatlineLimitSeconds: 7200 } });
    // runs measured at the samples: hour 0 up to 00:50 (3000 s), hour 1 up to 01:50 (6600 s), hour 2 up to 02:50 (10200 s)
    expect(hours.map((h) => [h.maxUnchangedSeconds, h.flatline])).toEqual([
      [3000, false],
      [6600, false],
      [10200, true],
      [10800, true],
    ]);
    // a gap longer than maxGap restarts the run
    const broken = aggregate([[t('00:00'), 5], [t('00:10'), 5], [t('02:00'), 5], [t('02:10'), 5]], { tag: { flatlineLimitSeconds: 1000 } });
    expect(broken.map((h) => h.flatline)).toEqual([false, false]);
  });

  it('UTC+05:30 (Asia/Kolkata): hours are the site clock hours, starting at hh:30 UTC', () => {
    const { hours } = ingestFixture('kolkata.csv', { timeZone: 'Asia/Kolkata' });
    // samples 100..180 every 10 min from 09:50 to 11:10 local, rising 1 per minute
    expect(hours.map((h) => [new Date(h.hourStartMs).toISOString(), h.mean, h.coveredSeconds, h.utcOffsetMinutes])).toEqual([
      ['2024-01-10T03:30:00.000Z', 105, 600, 330], // 09:00 local: 09:50-10:00, 100->110
      ['2024-01-10T04:30:00.000Z', 140, 3600, 330], // 10:00 local: 110->170
      ['2024-01-10T05:30:00.000Z', 175, 600, 330], // 11:00 local: 11:00-11:10, 170->180
    ]);
  });

  it('Berlin autumn: the repeated 02:00 hour is two distinct hours', () => {
    const { hours } = ingestFixture('dst-autumn-berlin.csv', { timeZone: 'Europe/Berlin' });
    // values 1..10 every 15 min from 01:45 CEST (23:45Z) to 03:00 CET (02:00Z)
    expect(hours.map((h) => [new Date(h.hourStartMs).toISOString(), h.utcOffsetMinutes, h.mean, h.coveredSeconds, h.sampleCount])).toEqual([
      ['2024-10-26T23:00:00.000Z', 120, 1.5, 900, 1], // 01:00 CEST: 1->2 over 15 min
      ['2024-10-27T00:00:00.000Z', 120, 4, 3600, 4], // 02:00 CEST: 2..6 -> (2.5+3.5+4.5+5.5)/4
      ['2024-10-27T01:00:00.000Z', 60, 8, 3600, 4], // 02:00 CET: 6..10
      ['2024-10-27T02:00:00.000Z', 60, 10, 0, 1], // 03:00 CET: the last sample alone
    ]);
  });

  it('Berlin spring: 01:00 CET is followed by 03:00 CEST', () => {
    const { hours, result } = ingestFixture('dst-spring-berlin.csv', { timeZone: 'Europe/Berlin' });
    // 10 at 00:30Z, 11 at 00:45Z, 12 at 01:00Z (02:00 read in winter time), 13 at 01:15Z, 14 at 01:30Z
    expect(hours.map((h) => [new Date(h.hourStartMs).toISOString(), h.utcOffsetMinutes, h.mean, h.coveredSeconds])).toEqual([
      ['2024-03-31T00:00:00.000Z', 60, 11, 1800], // (10.5 + 11.5) / 2
      ['2024-03-31T01:00:00.000Z', 120, 13, 1800], // (12.5 + 13.5) / 2
    ]);
    expect(result.report.warnings.map((w) => w.code)).toEqual(['DST_GAP']);
  });

  it('status words through the whole pipeline', () => {
    const { hours } = ingestFixture('status-words.csv', { timeZone: 'UTC' });
    const ft = hourOf(hours, 'B1.FT-101', '2024-03-05T10:00:00Z');
    expect(ft).toMatchObject({ sampleCount: 2, nonNumericCount: 4, coveredSeconds: 0, mean: 51, meanMethod: 'samples' });
    const tt = hourOf(hours, 'B1.TT-102', '2024-03-05T10:00:00Z');
    // drawn: 10:00->10:05 (480->481); 'Bad' at 10:10 breaks; 10:20->10:25->10:30 (483->484->485)
    expectClose(tt.mean!, (480.5 * 300 + 483.5 * 300 + 484.5 * 300) / 900, { rtol: 1e-12 });
    expect(tt).toMatchObject({ coveredSeconds: 900, nonNumericCount: 1, sampleCount: 5, min: 480, max: 485 });
  });

  it('long layout with quality through the whole pipeline', () => {
    const { hours } = ingestFixture('long-quality.csv', { timeZone: 'UTC' });
    // FT-101: 50, 51 (drawn, 10 min), 9999 bad (breaks), 53 uncertain, 'Shutdown' (breaks)
    expect(hourOf(hours, 'B1.FT-101', '2024-03-05T10:00:00Z')).toMatchObject({
      mean: 50.5, coveredSeconds: 600, sampleCount: 3, uncertainCount: 1, badQualityCount: 1, nonNumericCount: 1, min: 50, max: 53,
    });
    // TT-102: 480, quality 0 (bad), 482 uncertain: nothing drawn, mean of 480 and 482
    expect(hourOf(hours, 'B1.TT-102', '2024-03-05T10:00:00Z')).toMatchObject({ mean: 481, meanMethod: 'samples', badQualityCount: 1, uncertainCount: 1 });
  });

  it('gives the same hours whatever the byte chunks (one byte at a time)', () => {
    for (const name of ['wide-units.csv', 'utf16le-bom.csv', 'latin1.csv', 'quoted.csv', 'long-quality.csv']) {
      const whole = ingestFixture(name, { timeZone: 'Europe/Berlin' }).hours;
      expect(ingestFixture(name, { timeZone: 'Europe/Berlin', chunkBytes: 1 }).hours, name).toEqual(whole);
    }
  });

  it('holds memory per tag only: a long random series matches the brute-force reference hour by hour', () => {
    let seed = 7;
    const rand = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const points: [number, number][] = [];
    let time = utc(t('00:00'));
    for (let i = 0; i < 400; i++) {
      points.push([time, Math.round(rand() * 1000) / 10]);
      time += Math.floor(1 + rand() * 20) * 60_000; // 1..20 min steps, some beyond the 15 min gap
    }
    const hours = aggregate(points.map(([ms, v]) => [new Date(ms).toISOString(), v]));
    for (const h of hours) {
      if (h.coveredSeconds === 0) continue;
      const ref = referenceStats(points, h.hourStartMs, h.hourEndMs, 'linear');
      expectClose(h.coveredSeconds, ref.coveredSeconds, { rtol: 0, atol: 0, label: `covered ${h.hourStartMs}` });
      expectClose(h.mean!, ref.mean, { rtol: 1e-9, label: `mean ${new Date(h.hourStartMs).toISOString()}` });
      expectClose(h.stdDev!, ref.std, { rtol: 1e-4, atol: 1e-6, label: `std ${new Date(h.hourStartMs).toISOString()}` });
    }
    expect(hours.filter((h) => h.coveredSeconds > 0).length).toBeGreaterThan(50);
  });
});
