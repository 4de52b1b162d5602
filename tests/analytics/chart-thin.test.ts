import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CHART_MAX_POINTS, chartColumns, dayByDay, drawnPoints, thinChart } from '~/lib/analytics/chart-thin';
import { siteMidnight } from '~/lib/site-time';
import type { ChartPoint } from '~/lib/analytics/notice-figures';
import { expectClose } from '../support/expect-close';

const HOUR = 3_600_000;
const T0 = Date.parse('2025-06-02T00:00:00Z');

/** Hourly points with a residual and sum that vary in every digit. */
function hourly(n: number): ChartPoint[] {
  return Array.from({ length: n }, (_, i) => ({
    t: new Date(T0 + i * HOUR).toISOString(),
    hours: 1,
    residual_W: 21_000 * Math.sin(i * 1.7) + 6_300 * Math.cos(i * 0.31),
    cusum: Math.abs(3.3 * Math.sin(i / 7)),
    signal: i % 97 === 50,
  }));
}

describe('thinning a notice chart to what it draws', () => {
  it('keeps every point of a chart that fits (14 days of hours and their margins)', () => {
    const pts = hourly(24 * 20);
    expect(thinChart(pts)).toEqual(pts);
    expect(chartColumns('hour', pts).at_min).toHaveLength(24 * 20);
  });

  it('merges runs of days into at most 500 points: hours-weighted mean, largest sum, any signal (hand-worked)', () => {
    // Three days with 24, 12 and 6 steady hours and max 1 point: one point of 42 hours.
    // Mean residual (self-consistency): (24 * 1000 + 12 * 4000 + 6 * -2000) / 42 = 60000 / 42 = 1428.571... W.
    const days: ChartPoint[] = [
      { t: '2025-01-01T00:00:00.000Z', hours: 24, residual_W: 1000, cusum: 1.5, signal: false },
      { t: '2025-01-02T00:00:00.000Z', hours: 12, residual_W: 4000, cusum: 4.25, signal: true },
      { t: '2025-01-03T00:00:00.000Z', hours: 6, residual_W: -2000, cusum: 0.5, signal: false },
    ];
    const [one] = thinChart(days, 1);
    expect(one!.t).toBe('2025-01-01T00:00:00.000Z');
    expect(one!.hours).toBe(42);
    expectClose(one!.residual_W, 60_000 / 42, { label: 'hours-weighted mean' });
    expect(one!.cusum).toBe(4.25);
    expect(one!.signal).toBe(true);

    // 1,200 days of a long notice: runs of 3 days, 400 points, no hour lost.
    const long = Array.from({ length: 1200 }, (_, i) => ({ t: new Date(T0 + i * 24 * HOUR).toISOString(), hours: 10 + (i % 15), residual_W: 1000 * Math.sin(i), cusum: i % 11, signal: false }));
    const thin = thinChart(long);
    expect(thin.length).toBeLessThanOrEqual(CHART_MAX_POINTS);
    expect(thin).toHaveLength(400);
    expect(thin.reduce((s, p) => s + p.hours, 0)).toBe(long.reduce((s, p) => s + p.hours, 0));
    const cols = chartColumns('day', long);
    expect(cols.perHours).toBe(72);
    expect(cols.at_min[1]).toBe(3 * 24 * 60);
  });

  it('writes the same figures the chart shows from the unrounded points (residual kW and sum to 2 decimals)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ residual_W: fc.double({ min: -5e7, max: 5e7, noNaN: true }), cusum: fc.double({ min: 0, max: 50, noNaN: true }) }), { minLength: 1, maxLength: 40 }),
        (vals) => {
          const pts = vals.map((v, i) => ({ t: new Date(T0 + i * HOUR).toISOString(), hours: 1, residual_W: v.residual_W, cusum: v.cusum, signal: false }));
          const drawn = drawnPoints(chartColumns('hour', pts));
          drawn.forEach((d, i) => {
            // The tooltip writes Number(v).toFixed(2) of kW and of sigma.
            expect(d.residual_kW.toFixed(2)).toBe(normalZero((pts[i]!.residual_W / 1000).toFixed(2)));
            expect(d.cusum.toFixed(2)).toBe(pts[i]!.cusum.toFixed(2));
            expect(d.t_ms).toBe(Date.parse(pts[i]!.t));
          });
        },
      ),
      { numRuns: 300, seed: 13 },
    );
  });

  it('rounds at the ties the way the chart writes them (hand-picked)', () => {
    // 12.345 and 1.005 are stored just below the tie (binary doubles): toFixed(2) writes 12.34 and 1.00.
    const pts = [12_345, 1_005, -4, 2_675].map((w, i) => ({ t: new Date(T0 + i * HOUR).toISOString(), hours: 1, residual_W: w, cusum: [1.005, 0.125, 2.675, 0][i]!, signal: false }));
    const cols = chartColumns('hour', pts);
    expect(cols.residual_kW.map((v) => v.toFixed(2))).toEqual(pts.map((p) => normalZero((p.residual_W / 1000).toFixed(2))));
    expect(cols.cusum.map((v) => v.toFixed(2))).toEqual(pts.map((p) => p.cusum.toFixed(2)));
    expect(Object.is(cols.residual_kW[2], -0)).toBe(false);
  });

  it('carries a chart of 325 hours in a small fraction of the points as objects', () => {
    const pts = hourly(325);
    const cols = chartColumns('hour', pts);
    const before = JSON.stringify(pts).length;
    const after = JSON.stringify(cols).length;
    expect(after).toBeLessThan(before / 3);
    expect(drawnPoints(cols)).toHaveLength(325);
  });

  it('answers an empty chart with no points', () => {
    const cols = chartColumns('hour', []);
    expect(cols.t0).toBe('');
    expect(drawnPoints(cols)).toEqual([]);
  });
});

describe('finding local days hour by hour', () => {
  it('gives every hour of a year with two clock changes the same day as asking each hour (self-consistency)', () => {
    for (const tz of ['Europe/London', 'Asia/Kolkata', 'Australia/Lord_Howe', 'UTC']) {
      let asked = 0;
      const plain = (ms: number) => siteMidnight(ms, tz);
      const cached = dayByDay((ms) => (asked++, plain(ms)));
      const start = Date.parse('2025-01-01T00:00:00Z');
      for (let h = 0; h < 24 * 366; h++) expect(cached(start + h * HOUR)).toBe(plain(start + h * HOUR));
      expect(asked, tz).toBeLessThanOrEqual(2 * 367);
    }
  });
});

/** The chart never writes "-0.00": rounding to zero is written "0.00". */
const normalZero = (s: string) => (s === '-0.00' ? '0.00' : s);
