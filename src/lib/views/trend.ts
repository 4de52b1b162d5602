/**
 * A unit's trend: the shapes the API answers with (one definition for the server,
 * src/server/services/views.ts, and the islands that draw it, src/components/insight/views) and the
 * pure steps that shape unit hours into them. No I/O: the service reads the hours and the baseline's
 * band and hands them over.
 *
 * Only steady hours feed figures (lines, means); unsettled, idle and suspect hours are counted and
 * shaded as context. Periods longer than HOURLY_LIMIT_h are drawn per local day.
 */
import { CONTEXT_STATES, zeroStateCounts, type ContextState, type HourState, type StateCounts } from '../hour-states';
import { HOUR_MS } from '../time';
import { siteDay } from '../site-time';
import { resolvePeriod, type Period, type PeriodChoice } from './period';
import type { Freshness } from './freshness';

export type { HourState, StateCounts } from '../hour-states';

/** The baseline's prediction for one hour with its k = 2 band. Efficiency [-], destruction [W]. */
export interface ExpectedHour {
  efficiency: number | null;
  efficiencyLo: number | null;
  efficiencyHi: number | null;
  destruction_W: number | null;
  destructionLo_W: number | null;
  destructionHi_W: number | null;
}

/** A drift notice as the time axis and the report show it. */
export interface NoticeMark {
  id: string;
  unitId: string;
  unitName: string;
  direction: 'up' | 'down';
  status: 'open' | 'acknowledged' | 'closed';
  onsetMs: number;
  signalMs: number;
  hours: number;
  /** Mean measured minus expected destruction [W]. */
  extra_W: number;
  /** Uncertainty of that mean shift [W]; null when unknown. */
  shiftU_W: number | null;
  exceedsUncertainty: boolean | null;
  extraCost_per_day: number | null;
  currency: string;
}

/** One point of a trend: an hour (or a local day for long periods). Null figures break the line. */
export interface TrendPoint {
  /** Start of the hour or local day [ms]. */
  t: number;
  /** Hours of each state in the bucket. */
  states: StateCounts;
  /** Mean over the bucket's steady hours; null when it has none. Efficiency [-], destruction [W]. */
  efficiency: number | null;
  efficiency_U: number | null;
  destruction_W: number | null;
  destruction_U_W: number | null;
  load: number | null;
  T0_K: number | null;
  /** The baseline's prediction for the steady hours (mean over the bucket), with its k = 2 band. */
  expected: ExpectedHour | null;
  /** An hour's state and its first reasons (hourly buckets only). */
  state?: HourState | null;
  reasons?: string[];
}

/**
 * A run of hours of one non-steady state, shaded on the charts (for day buckets: a run of days most
 * of whose hours with data were of that state).
 */
export interface ContextSpan {
  state: ContextState;
  fromMs: number;
  toMs: number;
  hours: number;
}

/** The baseline named on every chart. */
export interface BaselineInfo {
  id: string;
  version: number;
  /** 'Baseline v3 (2026-01-05 to 2026-02-01)', dates in the site's time zone. */
  label: string;
  loadUnit: string | null;
  hasEfficiency: boolean;
  meetsGuideline14: boolean;
  /** CV(RMSE) of the fits [-]. */
  efficiencyCvRmse: number | null;
  destructionCvRmse: number;
  /** Why the fit is not to be trusted (too few hours, too little spread of load; src/lib/analytics/fit-trust.ts); empty when trusted. */
  trustWarnings?: string[];
}

/** A steady hour against load, for the scatter (efficiency null for dissipative units). */
export interface ScatterPoint {
  t: number;
  load: number;
  efficiency: number | null;
  efficiency_U: number | null;
  destruction_W: number | null;
}

/** The baseline's curve at one load with its k = 2 band. */
export interface CurvePoint {
  load: number;
  efficiency: number | null;
  lo: number | null;
  hi: number | null;
  destruction_W: number | null;
  dLo_W: number | null;
  dHi_W: number | null;
}

export interface TrendSummary {
  steadyHours: number;
  efficiencyMean: number | null;
  efficiencyMean_U: number | null;
  destructionMean_W: number | null;
  destructionMean_U_W: number | null;
  expectedEfficiencyMean: number | null;
  expectedDestructionMean_W: number | null;
}

/** GET /api/units/:unitId/trend. */
export interface TrendAnswer {
  unit: { id: string; name: string; kind: string; kindLabel: string };
  site: { id: string; name: string; timeZone: string; currency: string };
  period: Period;
  /** Why the view opened on this period (the asked one, or the latest full one with data). */
  opened: PeriodChoice;
  /** How fresh the site's figures are. */
  freshness: Freshness;
  bucket: 'hour' | 'day';
  points: TrendPoint[];
  context: ContextSpan[];
  stateHours: StateCounts;
  /** Hours of the period with no unit hour at all (no data or not computed). */
  missingHours: number;
  summary: TrendSummary;
  loadUnit: string | null;
  /** Steady hours for the scatter against load. */
  scatter: ScatterPoint[];
  /** The baseline's curve over the load range at the period's mean ambient temperature, with its k = 2 band. */
  curve: CurvePoint[];
  baseline: BaselineInfo | null;
  notices: NoticeMark[];
}

// ---- shaping -----------------------------------------------------------------------------------

/** Periods longer than this many hours are drawn per local day instead of per hour. */
export const HOURLY_LIMIT_h = 62 * 24;

/** One unit hour as the trend reads it. */
export interface TrendHour {
  hourStart: Date;
  state: HourState;
  reasons: readonly { message: string }[];
  load: number | null;
  T0_K: number | null;
  efficiency: number | null;
  efficiency_U: number | null;
  destruction_W: number | null;
  destruction_U_W: number | null;
}

/** Mean of numbers, nulls left out; null when none is left. */
export function meanOf(xs: readonly (number | null)[]): number | null {
  const v = xs.filter((x): x is number => x !== null);
  return v.length ? v.reduce((a, b) => a + b, 0) / v.length : null;
}

/** Hours of each state. */
export function countStates(rows: readonly { state: HourState }[]): StateCounts {
  const c = zeroStateCounts();
  for (const r of rows) c[r.state] += 1;
  return c;
}

/** Runs of consecutive hours of the same non-steady state (hours in time order). */
export function contextRuns(rows: readonly TrendHour[]): ContextSpan[] {
  const out: ContextSpan[] = [];
  for (const r of rows) {
    if (r.state === 'steady') continue;
    const t = r.hourStart.getTime();
    const last = out[out.length - 1];
    if (last && last.state === r.state && last.toMs === t) {
      last.toMs = t + HOUR_MS;
      last.hours += 1;
    } else out.push({ state: r.state, fromMs: t, toMs: t + HOUR_MS, hours: 1 });
  }
  return out;
}

/** Every hour of the period, with the hour's figures when it is steady (null breaks the line). */
export function hourlyPoints(rows: readonly TrendHour[], period: Pick<Period, 'fromMs' | 'toMs'>, expectedAt: ReadonlyMap<number, ExpectedHour>): TrendPoint[] {
  const byHour = new Map(rows.map((r) => [r.hourStart.getTime(), r]));
  const points: TrendPoint[] = [];
  for (let t = period.fromMs; t < period.toMs; t += HOUR_MS) {
    const r = byHour.get(t);
    const states = zeroStateCounts();
    if (r) states[r.state] = 1;
    const steady = r?.state === 'steady';
    points.push({
      t,
      states,
      state: r?.state ?? null,
      reasons: r ? r.reasons.slice(0, 2).map((x) => x.message) : [],
      efficiency: steady ? r.efficiency : null,
      efficiency_U: steady ? r.efficiency_U : null,
      destruction_W: steady ? r.destruction_W : null,
      destruction_U_W: steady ? r.destruction_U_W : null,
      load: r?.load ?? null,
      T0_K: r?.T0_K ?? null,
      expected: steady ? (expectedAt.get(t) ?? null) : null,
    });
  }
  return points;
}

/** The mean of several hours' expected bands. */
export function meanExpected(xs: readonly ExpectedHour[]): ExpectedHour {
  const m = (f: (e: ExpectedHour) => number | null) => meanOf(xs.map(f));
  return {
    efficiency: m((e) => e.efficiency),
    efficiencyLo: m((e) => e.efficiencyLo),
    efficiencyHi: m((e) => e.efficiencyHi),
    destruction_W: m((e) => e.destruction_W),
    destructionLo_W: m((e) => e.destructionLo_W),
    destructionHi_W: m((e) => e.destructionHi_W),
  };
}

/** One point per local day of the period: the means of its steady hours. */
export function dailyPoints(rows: readonly TrendHour[], period: Period, expectedAt: ReadonlyMap<number, ExpectedHour>): TrendPoint[] {
  const groups = new Map<string, TrendHour[]>();
  for (const r of rows) {
    const key = siteDay(r.hourStart.getTime(), period.timeZone);
    const g = groups.get(key) ?? [];
    g.push(r);
    groups.set(key, g);
  }
  const points: TrendPoint[] = [];
  let day = resolvePeriod({ range: 'day', anchor: period.firstDay }, period.timeZone);
  while (day.fromMs < period.toMs) {
    const g = groups.get(day.firstDay) ?? [];
    const s = g.filter((r) => r.state === 'steady');
    const pick = (f: (r: TrendHour) => number | null) => meanOf(s.map(f));
    const ex = s.map((r) => expectedAt.get(r.hourStart.getTime())).filter((e): e is ExpectedHour => !!e);
    points.push({
      t: day.fromMs,
      states: countStates(g),
      efficiency: pick((r) => r.efficiency),
      efficiency_U: pick((r) => r.efficiency_U),
      destruction_W: pick((r) => r.destruction_W),
      destruction_U_W: pick((r) => r.destruction_U_W),
      load: pick((r) => r.load),
      T0_K: pick((r) => r.T0_K),
      expected: ex.length ? meanExpected(ex) : null,
    });
    day = resolvePeriod({ range: 'day', anchor: day.nextAnchor }, period.timeZone);
  }
  return points;
}

/**
 * Per local day, hourly runs would be slivers: a day is shaded by its most frequent non-steady
 * state when most of its hours with data are not steady; neighbouring days of one state join.
 */
export function dayShading(points: readonly TrendPoint[], toMs: number): ContextSpan[] {
  const out: ContextSpan[] = [];
  points.forEach((p, i) => {
    const end = points[i + 1]?.t ?? toMs;
    const other = CONTEXT_STATES.map((s) => [s, p.states[s]] as const).sort((a, b) => b[1] - a[1]);
    const notSteady = other.reduce((a, [, n]) => a + n, 0);
    if (notSteady === 0 || notSteady <= p.states.steady) return;
    const state = other[0]![0];
    const last = out[out.length - 1];
    const hours = p.states.steady + notSteady;
    if (last && last.state === state && last.toMs === p.t) {
      last.toMs = end;
      last.hours += hours;
    } else out.push({ state, fromMs: p.t, toMs: end, hours });
  });
  return out;
}

/** Means over the steady hours and over their expected band. */
export function trendSummary(steady: readonly TrendHour[], expected: readonly ExpectedHour[]): TrendSummary {
  return {
    steadyHours: steady.length,
    efficiencyMean: meanOf(steady.map((r) => r.efficiency)),
    efficiencyMean_U: meanOf(steady.map((r) => r.efficiency_U)),
    destructionMean_W: meanOf(steady.map((r) => r.destruction_W)),
    destructionMean_U_W: meanOf(steady.map((r) => r.destruction_U_W)),
    expectedEfficiencyMean: meanOf(expected.map((e) => e.efficiency)),
    expectedDestructionMean_W: meanOf(expected.map((e) => e.destruction_W)),
  };
}

/** Steady hours with a load and a figure, for the scatter against load. */
export function scatterOf(steady: readonly TrendHour[]): ScatterPoint[] {
  return steady
    .filter((r) => r.load !== null && (r.efficiency !== null || r.destruction_W !== null))
    .map((r) => ({ t: r.hourStart.getTime(), load: r.load!, efficiency: r.efficiency, efficiency_U: r.efficiency_U, destruction_W: r.destruction_W }));
}

/** n + 1 evenly spaced loads over the points' load range, where a baseline's curve is drawn; none below two points. */
export function curveLoads(scatter: readonly { load: number }[], n = 24): number[] {
  if (scatter.length < 2) return [];
  const loads = scatter.map((s) => s.load);
  const lo = Math.min(...loads);
  const hi = Math.max(...loads);
  return Array.from({ length: n + 1 }, (_, i) => lo + ((hi - lo) * i) / n);
}

/** The curve's points from the expected band at each load. */
export function curveOf(loads: readonly number[], expected: readonly (ExpectedHour | null)[]): CurvePoint[] {
  return loads.map((load, i) => {
    const e = expected[i];
    return {
      load,
      efficiency: e?.efficiency ?? null,
      lo: e?.efficiencyLo ?? null,
      hi: e?.efficiencyHi ?? null,
      destruction_W: e?.destruction_W ?? null,
      dLo_W: e?.destructionLo_W ?? null,
      dHi_W: e?.destructionHi_W ?? null,
    };
  });
}

/** Points and shading of a period: per hour up to HOURLY_LIMIT_h, else per local day. */
export function trendSeries(rows: readonly TrendHour[], period: Period, expectedAt: ReadonlyMap<number, ExpectedHour>) {
  if (period.hours > HOURLY_LIMIT_h) {
    const points = dailyPoints(rows, period, expectedAt);
    return { bucket: 'day' as const, points, context: dayShading(points, period.toMs) };
  }
  return { bucket: 'hour' as const, points: hourlyPoints(rows, period, expectedAt), context: contextRuns(rows) };
}
