import { describe, expect, it } from 'vitest';
import { niceTicks, timeTicks } from '~/components/insight/views/TrendCharts';

describe('chart axes', () => {
  it('self-consistency: round ticks cover every value in about five steps of 1, 2, 2.5 or 5 x 10^n', () => {
    // 74.55 .. 78.75: span 4.2, a quarter 1.05 -> the first of 1, 2, 2.5, 5 not below it is 2; 74 .. 80.
    expect(niceTicks([74.55, 78.75, null])).toEqual({ domain: [74, 80], ticks: [74, 76, 78, 80] });
    // 612 .. 655: a quarter of 43 is 10.75 -> step 20; 600 .. 660.
    expect(niceTicks([612, 655])!.ticks).toEqual([600, 620, 640, 660]);
    // 0.12 .. 0.9: a quarter of 0.78 is 0.195 -> step 0.2; 0 .. 1.
    expect(niceTicks([0.12, 0.9])!.ticks).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(niceTicks([null, undefined])).toBeNull();
    const flat = niceTicks([400, 400])!;
    expect(flat.domain[0]).toBeLessThan(400);
    expect(flat.domain[1]).toBeGreaterThan(400);
  });

  it('tzdata: a Kolkata day is ticked every three hours from local midnight (18:30 UTC the day before)', () => {
    const from = Date.parse('2024-03-09T18:30:00Z');
    const { ticks, pattern } = timeTicks(from, from + 24 * 3_600_000, 'Asia/Kolkata');
    expect(pattern).toBe('HH:mm');
    expect(ticks).toHaveLength(9);
    expect(new Date(ticks[1]!).toISOString()).toBe('2024-03-09T21:30:00.000Z');
    // A year is ticked at the first of each local month: 1 April 2024 00:00 in Kolkata = 31 March 18:30 UTC.
    const y = timeTicks(Date.parse('2023-12-31T18:30:00Z'), Date.parse('2024-12-31T18:30:00Z'), 'Asia/Kolkata');
    expect(new Date(y.ticks[3]!).toISOString()).toBe('2024-03-31T18:30:00.000Z');
  });
});
