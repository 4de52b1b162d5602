/**
 * Per-unit rules on unit hours, beside the drift check: a unit declared normally idle that runs, and
 * a unit whose cost of destruction per day or exergy efficiency crosses a limit an energy lead set.
 * Either, for more than a set number of consecutive clock hours, opens a notice of its own kind
 * (src/server/services/unit-rules.ts). Pure: hours in, runs out; the site's clock through Intl.
 *
 * Which hours count (docs/domain.md section 9):
 * - idle rule: an hour inside the declared idle time (and, when the declaration names units, in
 *   which those units all run) whose state is steady or unsettled: the unit ran when it should not;
 * - cost limit: a steady or unsettled hour whose destruction cost, times 24, is above the limit;
 * - efficiency limit: a steady hour whose exergy efficiency is below the limit (an unsettled hour's
 *   efficiency is not a steady-state figure, docs/domain.md section 2).
 * Any other hour, a missing hour included, ends a run: a notice needs hours that say the unit ran.
 */
import type { HourState } from '../hour-states';
import type { NormallyIdle, Weekday } from '../plant/idle';
import { localDayHour } from '../site-time';

export { localDayHour };
import { DEFAULT_RULE_HOURS, WEEKDAYS } from '../plant/idle';
import { HOUR_MS } from '../time';
import { upTo, type NumberStyle } from '../format';


export type RuleHourState = HourState;

export interface RuleHour {
  hourStartMs: number;
  state: RuleHourState;
  destruction_W: number | null;
  /** Cost of the hour's destruction [currency per hour]. */
  destructionCost_per_h: number | null;
  efficiency: number | null;
}

/** An energy lead's limits for a unit; either may be left out. */
export interface UnitLimits {
  /** Cost of destruction per day above which an hour crosses [currency/day]. */
  maxCost_per_day?: number | null;
  /** Exergy efficiency below which a steady hour crosses [-]. */
  minEfficiency?: number | null;
  /** Consecutive hours (more than this many) that open a notice [h]. */
  hours?: number | null;
}

export type CrossedLimit = 'cost' | 'efficiency';

/** A run of consecutive hours that broke a rule for more than the set number of hours. */
export interface RuleRun {
  /** First hour of the run (its start, UTC ms). */
  fromMs: number;
  /** Last hour of the run (its start, UTC ms). */
  lastMs: number;
  hours: number;
  /** The hour at which the run passed the set number of hours: the notice's signal hour. */
  signalMs: number;
  /** Mean exergy destruction over the run's hours that have one [W]. */
  meanDestruction_W: number | null;
  /** Mean destruction cost per hour, times 24, over the hours that carry a cost [currency/day]; null when none does. */
  cost_per_day: number | null;
  /** Mean exergy efficiency over the run's hours that have one [-]. */
  meanEfficiency: number | null;
  /** Limit rule only: which limits the run's hours crossed. */
  crossed: CrossedLimit[];
}

// ---- the site's clock (localDayHour lives in src/lib/site-time.ts) -------------------------------

const clockHour = (hhmm: string) => Number(hhmm.slice(0, 2));
const previousDay = (d: Weekday): Weekday => WEEKDAYS[(WEEKDAYS.indexOf(d) + 6) % 7]!;

/** True when the hour starting at `hourStartMs` lies in the declaration's idle time (schedule only). */
export function inIdleTime(decl: NormallyIdle, hourStartMs: number, timeZone: string): boolean {
  if (decl.when === 'always') return true;
  const { day, hour } = localDayHour(hourStartMs, timeZone);
  return decl.when.some((w) => {
    const from = clockHour(w.from ?? '00:00');
    const to = clockHour(w.to ?? '24:00');
    const on = (d: Weekday) => !w.days || w.days.includes(d);
    if (from < to) return on(day) && hour >= from && hour < to;
    // over midnight (or a whole day from `from` when to = from)
    return (on(day) && hour >= from) || (on(previousDay(day)) && hour < to);
  });
}

// ---- runs ---------------------------------------------------------------------------------------------

const running = (s: RuleHourState) => s === 'steady' || s === 'unsettled';

const mean = (xs: number[]) => (xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : null);

/**
 * Runs of consecutive clock hours (each hour one hour after the last) whose `crossing` is set, kept
 * when longer than `minHours`. Hours must be in time order, one per hour start.
 */
export function longRuns(hours: readonly RuleHour[], crossing: (h: RuleHour) => CrossedLimit[] | boolean, minHours: number): RuleRun[] {
  const out: RuleRun[] = [];
  let run: { hours: RuleHour[]; crossed: Set<CrossedLimit> } | null = null;
  const close = () => {
    if (run && run.hours.length > minHours) {
      const hs = run.hours;
      const costed = hs.filter((h) => h.destructionCost_per_h !== null && Number.isFinite(h.destructionCost_per_h));
      const meanCost_per_h = mean(costed.map((h) => h.destructionCost_per_h!));
      out.push({
        fromMs: hs[0]!.hourStartMs,
        lastMs: hs[hs.length - 1]!.hourStartMs,
        hours: hs.length,
        signalMs: hs[minHours]!.hourStartMs,
        meanDestruction_W: mean(hs.filter((h) => h.destruction_W !== null).map((h) => h.destruction_W!)),
        cost_per_day: meanCost_per_h === null ? null : meanCost_per_h * 24,
        meanEfficiency: mean(hs.filter((h) => h.efficiency !== null).map((h) => h.efficiency!)),
        crossed: [...run.crossed].sort(),
      });
    }
    run = null;
  };
  let prevMs = -Infinity;
  for (const h of hours) {
    const c = crossing(h);
    const hit = Array.isArray(c) ? c.length > 0 : c;
    if (!hit || h.hourStartMs !== prevMs + HOUR_MS) close();
    if (hit) {
      run ??= { hours: [], crossed: new Set() };
      run.hours.push(h);
      if (Array.isArray(c)) for (const x of c) run.crossed.add(x);
    }
    prevMs = h.hourStartMs;
  }
  close();
  return out;
}

/**
 * The idle rule: runs of more than `decl.hours` (default 3) consecutive hours in which a unit declared
 * normally idle ran (steady or unsettled) inside its idle time. `othersRunning(hourStartMs)` says
 * whether the units named in `whileRunning` all ran that hour (not asked when none are named).
 */
export function idleRuns(
  hours: readonly RuleHour[],
  decl: NormallyIdle,
  timeZone: string,
  othersRunning: (hourStartMs: number) => boolean = () => true,
): RuleRun[] {
  const n = decl.hours ?? DEFAULT_RULE_HOURS;
  const named = (decl.whileRunning?.length ?? 0) > 0;
  return longRuns(hours, (h) => running(h.state) && inIdleTime(decl, h.hourStartMs, timeZone) && (!named || othersRunning(h.hourStartMs)), n);
}

/** Which of the limits an hour crosses (none when no limit is set). */
export function crossedLimits(h: RuleHour, limits: UnitLimits): CrossedLimit[] {
  const out: CrossedLimit[] = [];
  if (limits.maxCost_per_day != null && running(h.state) && h.destructionCost_per_h !== null && h.destructionCost_per_h * 24 > limits.maxCost_per_day) out.push('cost');
  if (limits.minEfficiency != null && h.state === 'steady' && h.efficiency !== null && h.efficiency < limits.minEfficiency) out.push('efficiency');
  return out;
}

/** The limit rule: runs of more than `limits.hours` (default 3) consecutive hours that cross a limit. */
export function limitRuns(hours: readonly RuleHour[], limits: UnitLimits): RuleRun[] {
  if (limits.maxCost_per_day == null && limits.minEfficiency == null) return [];
  return longRuns(hours, (h) => crossedLimits(h, limits), limits.hours ?? DEFAULT_RULE_HOURS);
}

/**
 * The words of a crossed limit for a notice: "cost of destruction above GBP 400 per day", the limit as
 * set (at most 2 decimals of money, 1 of a percentage), in `style`'s separators (src/lib/format.ts;
 * thin-space grouping and a decimal point by default).
 */
export function limitText(which: CrossedLimit, limits: UnitLimits, currency: string, style: NumberStyle = {}): string {
  if (which === 'cost') return `cost of destruction above ${currency} ${upTo(limits.maxCost_per_day, 2, style)} per day`;
  return `exergy efficiency below ${upTo(limits.minEfficiency! * 100, 1, style)} %`;
}
