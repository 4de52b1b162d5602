/**
 * The live figures of a drift notice, from the residuals of a unit's steady hours against its
 * baseline (measured minus expected exergy destruction, in W). Pure: numbers in, numbers out; the
 * drift check (src/server/services/drift.ts) feeds it the saved drift rows.
 *
 * - The size of a shift over a window of steady hours is the mean residual of those hours. Its
 *   expanded (k = 2) uncertainty combines two parts in quadrature (JCGM 100:2008, 5.1.2):
 *     statistical: 2 sigma / sqrt(n_eff), sigma the spread of the residuals of the baseline's fit and
 *       n_eff = n (1 - phi) / (1 + phi) the effective number of independent hours when the residuals
 *       follow an AR(1) process with lag-one autocorrelation phi (the large-n variance of the mean of
 *       an AR(1) series; e.g. Box, Jenkins & Reinsel, Time Series Analysis, 4th ed., 2008, ch. 3;
 *       ASHRAE Guideline 14-2014, Annex B, uses the same n' for savings uncertainty). phi = 0 when
 *       the baseline does not carry one.
 *     measurement: U_hour / sqrt(n), U_hour the mean expanded uncertainty of one hour's destruction
 *       (GUM, 4.2.3, the mean of n readings), only when every hour carries one.
 *   "Beyond measurement uncertainty" compares |mean| with the measurement part alone (as the notice
 *   always did); "within its uncertainty of zero" uses the combined figure.
 * - The current size is the mean of the last CURRENT_WINDOW_HOURS (24) steady hours; the size since
 *   onset is the mean from the notice's onset to the latest hour.
 * - Trend (rule stated here): the current size minus the size since onset, signed in the notice's
 *   direction, against the combined uncertainty of the two, sqrt(U_cur^2 + U_onset^2) (conservative:
 *   the windows overlap). Above it: growing; below minus it: receding; otherwise steady.
 * - Faded: see fadedAt. Clearly larger: see clearlyLarger. Repair verdict: see repairVerdict.
 */
import { DAY_S, HOUR_MS } from '../time';
import type { NoticeTrend } from '../notice-view';

/** Steady hours of the current figure (the last day of steady operation); common practice. */
export const CURRENT_WINDOW_HOURS = 24;
/** Steady hours after a repair before its verdict is given (default); common practice. */
export const VERIFY_HOURS = 72;
/** A later signal opens its own notice when it is at least this many times the open notice's current size (and clearly apart from it). */
export const LARGER_FACTOR = 1.5;
/**
 * ... and above it by more than this many times the combined uncertainty of the two: the hours of a
 * signal are picked by the stopping rule, so one margin is not enough. Simulated (independent hours,
 * k = 0.5 sigma, h = 5 sigma, restart after each signal, 3-hour rule; see docs/notices.md): with a margin of 1, 0.6-0.9 % of the re-signals of one persistent 2-3 sigma shift looked
 * larger; with 1.5, none in 200 000 hours of 0.75, 1, 2 or 3 sigma, while a jump from 2 to 4 sigma
 * opened its own notice within 10 hours in 90 % of runs and one from 1.5 to 8 sigma within 4 hours in
 * all. Smaller jumps show in the live headline and the escalation mail.
 */
export const LARGER_MARGIN = 1.5;
/** Days in an average month (365.25 / 12), for the avoided cost per month. */
export const DAYS_PER_MONTH = 365.25 / 12;

export type Direction = 'up' | 'down';
export type Trend = NoticeTrend;

/** One steady hour as the drift check saved it. */
export interface ResidualHour {
  hourStart_ms: number;
  /** Measured minus expected destruction [W]. */
  residual_W: number;
  /** Expanded (k = 2) uncertainty of the hour's destruction [W]; null when not known. */
  hourU_W: number | null;
  /** CUSUM sums after the hour (before a restart) [sigma]. */
  cPlus?: number;
  cMinus?: number;
  /** The sums crossed the decision limit at this hour. */
  signal?: 'up' | 'down' | 'both' | null;
}

/** The size of a shift over a window of steady hours. */
export interface ShiftFigure {
  hours: number;
  /** First and last hour of the window (hour starts, ms). */
  fromMs: number | null;
  toMs: number | null;
  /** Mean residual [W]. */
  mean_W: number;
  /** Combined expanded (k = 2) uncertainty of the mean [W]. */
  U_W: number;
  /** Statistical part, 2 sigma / sqrt(n_eff) [W]. */
  statU_W: number;
  /** Measurement part, U_hour / sqrt(n) [W]; null when some hour has no uncertainty. */
  measU_W: number | null;
  /** Effective number of independent hours [-]. */
  nEff: number;
  /** |mean| > measU_W; null when the measurement part is not known. */
  exceedsMeasurement: boolean | null;
}

/** Effective number of independent hours of n AR(1) residuals with lag-one autocorrelation phi. */
export function effectiveHours(n: number, phi = 0): number {
  if (!(n >= 0)) throw new RangeError(`n = ${n} must be >= 0`);
  const p = Number.isFinite(phi) ? Math.min(Math.max(phi, -0.99), 0.99) : 0;
  return (n * (1 - p)) / (1 + p);
}

/**
 * The mean shift of a window of hours with its uncertainty.
 * @param hours the window's steady hours (any order)
 * @param sigma_W spread of the residuals of the baseline's fit [W], > 0
 * @param phi lag-one autocorrelation of the residuals [-]; 0 when not known
 */
export function shiftFigure(hours: readonly ResidualHour[], sigma_W: number, phi = 0): ShiftFigure {
  if (!(sigma_W > 0)) throw new RangeError(`sigma_W = ${sigma_W} must be > 0`);
  const n = hours.length;
  if (n === 0) return { hours: 0, fromMs: null, toMs: null, mean_W: 0, U_W: Infinity, statU_W: Infinity, measU_W: null, nEff: 0, exceedsMeasurement: null };
  let sum = 0;
  let sumU = 0;
  let allU = true;
  let from = Infinity;
  let to = -Infinity;
  for (const h of hours) {
    sum += h.residual_W;
    if (h.hourU_W === null || !Number.isFinite(h.hourU_W)) allU = false;
    else sumU += h.hourU_W;
    from = Math.min(from, h.hourStart_ms);
    to = Math.max(to, h.hourStart_ms);
  }
  const mean_W = sum / n;
  const nEff = effectiveHours(n, phi);
  const statU_W = (2 * sigma_W) / Math.sqrt(nEff);
  const measU_W = allU ? sumU / n / Math.sqrt(n) : null;
  const U_W = Math.sqrt(statU_W ** 2 + (measU_W ?? 0) ** 2);
  return { hours: n, fromMs: from, toMs: to, mean_W, U_W, statU_W, measU_W, nEff, exceedsMeasurement: measU_W === null ? null : Math.abs(mean_W) > measU_W };
}

const sign = (d: Direction) => (d === 'up' ? 1 : -1);

/** Growing, steady or receding: the current size against the size since onset (rule in the file's head). */
export function trendOf(current: ShiftFigure, sinceOnset: ShiftFigure, direction: Direction): Trend {
  if (current.hours === 0 || sinceOnset.hours === 0) return 'steady';
  const d = sign(direction) * (current.mean_W - sinceOnset.mean_W);
  const U = Math.sqrt(current.U_W ** 2 + sinceOnset.U_W ** 2);
  return d > U ? 'growing' : d < -U ? 'receding' : 'steady';
}

export interface LiveFigures {
  current: ShiftFigure;
  sinceOnset: ShiftFigure;
  trend: Trend;
}

/**
 * The live figures of a notice at its latest hour.
 * @param sinceOnset the steady hours from the notice's onset to the latest hour, in time order
 */
export function liveFigures(sinceOnset: readonly ResidualHour[], sigma_W: number, phi: number, direction: Direction, window = CURRENT_WINDOW_HOURS): LiveFigures {
  const current = shiftFigure(sinceOnset.slice(-window), sigma_W, phi);
  const all = shiftFigure(sinceOnset, sigma_W, phi);
  return { current, sinceOnset: all, trend: trendOf(current, all, direction) };
}

/** Cost per day of a shift [currency/day] and its uncertainty, at c_F [currency/J] (SPECO, Cdot_D = c_F Xdot_D). */
export function costPerDay(f: Pick<ShiftFigure, 'mean_W' | 'U_W'>, cF_per_J: number | null): { cost_per_day: number | null; costU_per_day: number | null } {
  if (cF_per_J === null || !Number.isFinite(cF_per_J)) return { cost_per_day: null, costU_per_day: null };
  return { cost_per_day: cF_per_J * f.mean_W * DAY_S, costU_per_day: Number.isFinite(f.U_W) ? cF_per_J * f.U_W * DAY_S : null };
}

/**
 * When a notice's shift has gone. Rule: the first hour T after the notice's last signal such that the
 * CURRENT_WINDOW_HOURS steady hours ending at T (all after the last signal) hold no signal in the
 * notice's direction, and either the sum in that direction was at zero at every one of them, or their
 * mean is within its (combined) uncertainty of zero on the notice's side (direction x mean <= U).
 * @param afterLastSignal steady hours after the notice's latest signal, in time order
 * @returns the hour start (ms) of T, or null while the shift is still there
 */
export function fadedAt(afterLastSignal: readonly ResidualHour[], sigma_W: number, phi: number, direction: Direction, window = CURRENT_WINDOW_HOURS): number | null {
  const s = sign(direction);
  let lastSignal = -1;
  for (let i = 0; i < afterLastSignal.length; i++) {
    const h = afterLastSignal[i]!;
    if (h.signal === direction || h.signal === 'both') lastSignal = i;
    if (i - lastSignal < window) continue;
    const win = afterLastSignal.slice(i - window + 1, i + 1);
    const atZero = win.every((w) => (direction === 'up' ? w.cPlus : w.cMinus) === 0);
    const f = shiftFigure(win, sigma_W, phi);
    if (atZero || s * f.mean_W <= f.U_W) return h.hourStart_ms;
  }
  return null;
}

/**
 * Whether a new signal's shift clearly exceeds an open notice's current size, so that it opens a
 * notice of its own (which names the earlier) instead of being absorbed. The hours from a signal's
 * onset to its crossing are picked by the stopping rule: their mean is at least (k + h/N) sigma even
 * when the shift has not changed (N the hours from onset to signal). Rule: with base = the larger of
 * the current size and that floor (in the notice's direction), the new size is at least
 * LARGER_FACTOR times the base and above it by more than LARGER_MARGIN sqrt(U_new^2 + U_cur^2).
 *
 * With the expected destruction of both windows given, the new size must also be LARGER_FACTOR times
 * the base in proportion to its window's expected destruction: the same fault at another duty. A
 * fouled exchanger destroys more at full load than on a light weekend; Monday's full-load hours
 * against a weekend's current figure are the same fault, not a larger one (and a fixed extra that
 * looks large in proportion on a light load is held back by the size in watts).
 * @param floor_W (k + h/N) sigma [W]; 0 to compare with the current size alone
 * @param expected mean expected destruction of the signal's hours and of the current window [W]
 */
export function clearlyLarger(signal: ShiftFigure, current: ShiftFigure, direction: Direction, floor_W = 0, expected?: DutyPair): boolean {
  if (signal.hours === 0 || current.hours === 0) return false;
  const s = sign(direction);
  const a = s * signal.mean_W;
  const base = Math.max(s * current.mean_W, floor_W, 0);
  const larger = a >= LARGER_FACTOR * base && a - base > LARGER_MARGIN * Math.sqrt(signal.U_W ** 2 + current.U_W ** 2);
  if (!larger || !expected || !(expected.signal_W > 0) || !(expected.current_W > 0)) return larger;
  return a / expected.signal_W >= LARGER_FACTOR * (base / expected.current_W);
}

/** Mean expected destruction of a signal's hours and of the current window [W]: the duty each size was measured at. */
export interface DutyPair {
  signal_W: number;
  current_W: number;
}

export interface RepairVerdict {
  /** The reporting period's mean residual is within its uncertainty of the expected value (or below it). */
  back: boolean;
  /** Shift before the repair (the current size at the repair date). */
  before: ShiftFigure;
  /** The reporting period (the first VERIFY_HOURS steady hours from the repair date). */
  after: ShiftFigure;
  /** Avoided extra destruction: the shift before minus the residual after, in the notice's direction [W]. */
  avoided_W: number;
  avoidedU_W: number;
  /** Avoided cost per month (DAYS_PER_MONTH days) and its uncertainty [currency/month]; null without a cost rate. */
  avoidedCost_per_month: number | null;
  avoidedCostU_per_month: number | null;
}

/**
 * The verdict on a repair, in the sense of IPMVP (avoided energy = adjusted baseline minus reporting
 * period): the adjusted baseline is the unit's expected destruction plus the shift measured before
 * the repair, so the avoided extra destruction is shift_before - mean residual after. Its
 * uncertainty combines both figures' uncertainties in quadrature. Back within the expected band
 * when direction x (mean residual after) <= U(after).
 */
export function repairVerdict(before: ShiftFigure, after: ShiftFigure, direction: Direction, cF_per_J: number | null): RepairVerdict {
  const s = sign(direction);
  const back = s * after.mean_W <= after.U_W;
  const avoided_W = s * (before.mean_W - after.mean_W);
  const avoidedU_W = Math.sqrt(before.U_W ** 2 + after.U_W ** 2);
  const k = cF_per_J === null || !Number.isFinite(cF_per_J) ? null : cF_per_J * DAY_S * DAYS_PER_MONTH;
  return {
    back,
    before,
    after,
    avoided_W,
    avoidedU_W,
    avoidedCost_per_month: k === null ? null : k * avoided_W,
    avoidedCostU_per_month: k === null ? null : k * avoidedU_W,
  };
}

/** One point of a notice's chart: an hour, or a day of hours over long spans. */
export interface ChartPoint {
  /** Start of the hour or of the local day (ISO). */
  t: string;
  /** Steady hours in the point. */
  hours: number;
  /** Mean residual [W]. */
  residual_W: number;
  /** Largest sum in the notice's direction within the point [sigma]. */
  cusum: number;
  /** The sums crossed the decision limit in the notice's direction within the point. */
  signal: boolean;
}

/** Above this many hours a chart is drawn per day. */
export const CHART_DAILY_ABOVE_HOURS = 24 * 14;

/**
 * The chart series of a notice: hourly points, or daily points (mean residual, largest sum, any
 * signal) when the span is longer than CHART_DAILY_ABOVE_HOURS.
 * @param dayOf maps an hour start (ms) to its local day's start (ms)
 */
export function chartSeries(hours: readonly ResidualHour[], direction: Direction, dayOf: (ms: number) => number): { span: 'hour' | 'day'; points: ChartPoint[] } {
  const c = (h: ResidualHour) => (direction === 'up' ? h.cPlus : h.cMinus) ?? 0;
  const sig = (h: ResidualHour) => h.signal === direction || h.signal === 'both';
  const spanH = hours.length ? (hours[hours.length - 1]!.hourStart_ms - hours[0]!.hourStart_ms) / HOUR_MS : 0;
  if (spanH <= CHART_DAILY_ABOVE_HOURS) {
    return { span: 'hour', points: hours.map((h) => ({ t: new Date(h.hourStart_ms).toISOString(), hours: 1, residual_W: h.residual_W, cusum: c(h), signal: sig(h) })) };
  }
  const days = new Map<number, { n: number; sum: number; cMax: number; signal: boolean }>();
  for (const h of hours) {
    const d = dayOf(h.hourStart_ms);
    const e = days.get(d) ?? { n: 0, sum: 0, cMax: 0, signal: false };
    e.n++;
    e.sum += h.residual_W;
    e.cMax = Math.max(e.cMax, c(h));
    e.signal ||= sig(h);
    days.set(d, e);
  }
  return {
    span: 'day',
    points: [...days.entries()].sort((a, b) => a[0] - b[0]).map(([d, e]) => ({ t: new Date(d).toISOString(), hours: e.n, residual_W: e.sum / e.n, cusum: e.cMax, signal: e.signal })),
  };
}
