/**
 * What a notice's chart draws, and no more, for the page that draws it. The chart shows each point's
 * time, its residual in kW and its cumulative sum in sigma, each to two decimals (axis, tooltip); it
 * needs neither more digits, nor each point's own ISO text, nor the fields it does not draw (the
 * signals are the dated marks). Pure: points in, columns out.
 *
 * - Thinning: above `max` points, runs of consecutive points merge into one (hours-weighted mean
 *   residual, largest sum, any signal, hours added), so a chart never carries more points than it
 *   has room to draw; below it nothing merges.
 * - Columns: times as whole minutes after the first point, residuals in kW and sums rounded to the two
 *   decimals the chart writes (10 W and 0.01 sigma: every figure shown is the same as from the
 *   unrounded values, self-consistency checked in tests/analytics/chart-thin.test.ts).
 */
import type { ChartPoint } from './notice-figures';
import { MINUTE_MS } from '../time';

/** At most this many points reach a notice's chart (a plot about 1,000 px wide draws no more). */
export const CHART_MAX_POINTS = 500;


/** A chart's points as columns, in the units and to the decimals the chart shows. */
export interface ChartColumns {
  /** What one point stands for: an hour, or `perHours` hours of local days. */
  span: 'hour' | 'day';
  /** Hours each point covers at most (1 for hourly points, 24 for days, 24 n after thinning). */
  perHours: number;
  /** Start of the first point (ISO); empty when there is none. */
  t0: string;
  /** Start of each point, whole minutes after t0. */
  at_min: number[];
  /** Mean residual of the point [kW], to 2 decimals. */
  residual_kW: number[];
  /** Largest sum in the notice's direction within the point [sigma], to 2 decimals. */
  cusum: number[];
}

/** A point of the chart as the island draws it. */
export interface DrawnPoint {
  t_ms: number;
  residual_kW: number;
  cusum: number;
}

/**
 * Rounded to the 2 decimals the chart writes, as toFixed rounds (so 12.345, stored as 12.3449..., stays
 * 12.34), never -0 (so "-0.00" is never written).
 */
const two = (v: number) => Number(v.toFixed(2)) + 0;

/** At most `max` points: runs of ceil(n / max) consecutive points merge into one. */
export function thinChart(points: readonly ChartPoint[], max = CHART_MAX_POINTS): ChartPoint[] {
  if (points.length <= max) return [...points];
  const run = Math.ceil(points.length / max);
  const out: ChartPoint[] = [];
  for (let i = 0; i < points.length; i += run) {
    const part = points.slice(i, i + run);
    const hours = part.reduce((s, p) => s + p.hours, 0);
    out.push({
      t: part[0]!.t,
      hours,
      residual_W: hours > 0 ? part.reduce((s, p) => s + p.residual_W * p.hours, 0) / hours : part.reduce((s, p) => s + p.residual_W, 0) / part.length,
      cusum: Math.max(...part.map((p) => p.cusum)),
      signal: part.some((p) => p.signal),
    });
  }
  return out;
}

/** The points the chart draws as columns: thinned to `max`, rounded to what the chart shows. */
export function chartColumns(span: 'hour' | 'day', points: readonly ChartPoint[], max = CHART_MAX_POINTS): ChartColumns {
  const thin = thinChart(points, max);
  const run = points.length > max ? Math.ceil(points.length / max) : 1;
  const t0 = thin.length ? new Date(thin[0]!.t).toISOString() : '';
  const t0ms = t0 ? Date.parse(t0) : 0;
  return {
    span,
    perHours: (span === 'hour' ? 1 : 24) * run,
    t0,
    at_min: thin.map((p) => Math.round((Date.parse(p.t) - t0ms) / MINUTE_MS)),
    residual_kW: thin.map((p) => two(p.residual_W / 1000)),
    cusum: thin.map((p) => two(p.cusum)),
  };
}

/** The columns back as points to draw. */
export function drawnPoints(c: ChartColumns): DrawnPoint[] {
  const t0 = c.t0 ? Date.parse(c.t0) : 0;
  return c.at_min.map((m, i) => ({ t_ms: t0 + m * MINUTE_MS, residual_kW: c.residual_kW[i]!, cusum: c.cusum[i]! }));
}

/**
 * `dayOf` (an instant [ms] to the start of its local day [ms]) asked once per day instead of once per
 * hour, for instants in rising order (a day is 23 to 25 hours long, so start + 30 h lies in the next).
 */
export function dayByDay(dayOf: (ms: number) => number): (ms: number) => number {
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  return (ms) => {
    if (ms >= lo && ms < hi) return lo;
    lo = dayOf(ms);
    hi = dayOf(lo + 30 * 60 * MINUTE_MS);
    return lo;
  };
}
