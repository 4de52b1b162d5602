/**
 * Periods of the trend, ledger, flow and report views, in the site's own clock: a "day" is the site's
 * local day (in Asia/Kolkata it starts at 18:30 UTC the day before), a week runs Monday to Monday, a
 * month and a year are calendar ones; a custom period runs from the start of its first local day to
 * the end of its last. Daylight-saving days are 23 or 25 hours long, as the clock on site says.
 *
 * Pure: no I/O. Instants are UTC milliseconds; periods are half-open [fromMs, toMs).
 */
import { TZDate } from '@date-fns/tz';
import { addDays, addMonths, addWeeks, addYears, format, startOfDay, startOfMonth, startOfWeek, startOfYear } from 'date-fns';
import { z } from 'zod';
import { DAY_MS, HOUR_MS } from '../time';

export const RANGES = ['day', 'week', 'month', 'year', 'custom'] as const;
export type Range = (typeof RANGES)[number];

/** Longest custom period [days]: a little over a year, so one request stays small. */
export const CUSTOM_MAX_DAYS = 400;

const localDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Give a date as yyyy-MM-dd (the site’s local date).');

/** The period part of a view's query string. */
export const PeriodQuery = z
  .object({
    range: z.enum(RANGES).default('week'),
    /** A local date inside the period (day, week, month, year); today on site when left out. */
    anchor: localDate.optional(),
    /** Custom period: first and last local day, both included. */
    from: localDate.optional(),
    to: localDate.optional(),
  })
  .superRefine((q, ctx) => {
    if (q.range === 'custom' && (!q.from || !q.to)) {
      ctx.addIssue({ code: 'custom', path: ['from'], message: 'A custom period needs both from and to (yyyy-MM-dd).' });
    }
  });
export type PeriodQuery = z.infer<typeof PeriodQuery>;

export interface Period {
  range: Range;
  timeZone: string;
  fromMs: number;
  toMs: number;
  /** Start and end as ISO instants (UTC). */
  from: string;
  to: string;
  /** Local date of the period's first day, and of its last day (included). */
  firstDay: string;
  lastDay: string;
  /** How people on site would name it: "Mon 4 Mar 2024", "Week of 4 Mar 2024", "March 2024", "2024". */
  label: string;
  /** Anchors of the period before and after (same range). For custom: the same length shifted. */
  prevAnchor: string;
  nextAnchor: string;
  /** Length of the period [h] (23 or 25 on daylight-saving days). */
  hours: number;
}

/** A query string as an object for PeriodQuery (only the keys it knows). */
export function periodParams(url: URL): Record<string, string> {
  const out: Record<string, string> = {};
  for (const k of ['range', 'anchor', 'from', 'to']) {
    const v = url.searchParams.get(k);
    if (v !== null && v !== '') out[k] = v;
  }
  return out;
}

function atLocalDay(date: string, timeZone: string): TZDate {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  const t = new TZDate(y, m - 1, d, timeZone);
  if (Number.isNaN(t.getTime()) || format(t, 'yyyy-MM-dd') !== date) throw new RangeError(`${date} is not a calendar date`);
  return t;
}

const day = (t: Date) => format(t, 'yyyy-MM-dd');

type CalendarRange = Exclude<Range, 'custom'>;

/** Each calendar range: where it starts around an anchor, one step of it, and how people name it. */
const CALENDAR: Record<CalendarRange, { startOf: (d: TZDate) => TZDate; add: (d: TZDate, n: number) => TZDate; label: (start: TZDate) => string }> = {
  day: { startOf: (d) => startOfDay(d), add: (d, n) => addDays(d, n), label: (s) => format(s, 'EEE d MMM yyyy') },
  week: { startOf: (d) => startOfWeek(d, { weekStartsOn: 1 }), add: (d, n) => addWeeks(d, n), label: (s) => `Week of ${format(s, 'd MMM yyyy')}` },
  month: { startOf: (d) => startOfMonth(d), add: (d, n) => addMonths(d, n), label: (s) => format(s, 'MMMM yyyy') },
  year: { startOf: (d) => startOfYear(d), add: (d, n) => addYears(d, n), label: (s) => format(s, 'yyyy') },
};

interface Bounds {
  start: TZDate;
  end: TZDate;
  label: string;
  prev: Date;
  next: Date;
}

function calendarBounds(range: CalendarRange, anchor: TZDate): Bounds {
  const c = CALENDAR[range];
  const start = c.startOf(anchor);
  const end = c.add(start, 1);
  return { start, end, label: c.label(start), prev: c.add(start, -1), next: end };
}

function customBounds(q: PeriodQuery, timeZone: string): Bounds {
  const start = atLocalDay(q.from!, timeZone);
  const last = atLocalDay(q.to!, timeZone);
  if (last.getTime() < start.getTime()) throw new RangeError('The custom period ends before it starts.');
  const end = addDays(last, 1);
  const days = Math.round((end.getTime() - start.getTime()) / DAY_MS);
  if (days > CUSTOM_MAX_DAYS) throw new RangeError(`A custom period may span at most ${CUSTOM_MAX_DAYS} days; this one spans ${days}.`);
  return { start, end, label: `${format(start, 'd MMM yyyy')} – ${format(last, 'd MMM yyyy')}`, prev: addDays(start, -days), next: end };
}

/**
 * The period a query asks for, in the site's time zone.
 * @param nowMs "now" [ms since epoch], for the default anchor (today on site)
 * @throws RangeError for a date that is not on the calendar, a custom period that ends before it starts
 *         or one longer than CUSTOM_MAX_DAYS
 */
export function resolvePeriod(q: PeriodQuery, timeZone: string, nowMs = Date.now()): Period {
  const anchor = q.anchor ? atLocalDay(q.anchor, timeZone) : startOfDay(new TZDate(nowMs, timeZone));
  const { start, end, label, prev, next } = q.range === 'custom' ? customBounds(q, timeZone) : calendarBounds(q.range, anchor);
  return {
    range: q.range,
    timeZone,
    fromMs: start.getTime(),
    toMs: end.getTime(),
    from: new Date(start.getTime()).toISOString(),
    to: new Date(end.getTime()).toISOString(),
    firstDay: day(start),
    lastDay: day(addDays(end, -1)),
    label,
    prevAnchor: day(prev),
    nextAnchor: day(next),
    hours: Math.round((end.getTime() - start.getTime()) / HOUR_MS),
  };
}

/** A calendar month 'yyyy-MM' of the site as a period. */
export function monthPeriod(month: string, timeZone: string): Period {
  if (!/^\d{4}-(0[1-9]|1[0-2])$/.test(month)) throw new RangeError('Give the month as yyyy-MM.');
  return resolvePeriod({ range: 'month', anchor: `${month}-01` }, timeZone);
}


/** First and last computed hour of a site or unit: their starts [ms since epoch]. */
export interface DataSpan {
  firstMs: number;
  lastMs: number;
}

/** Why a view opened on the period it shows (for the words beside the period). */
export type PeriodChoice = 'asked' | 'latest-full' | 'latest-partial' | 'now';

/**
 * The period a view opens on when the query names none: the latest FULL period of the range that has
 * data, i.e. the calendar day, week, month or year that ends with the latest computed hour. When the
 * latest hour does not close its calendar period (files arrive in batches: the demo plant's last week
 * holds 17 of its 168 hours), the period before it is shown, as long as some data reaches into it;
 * only when none does is the partial period holding the latest hour shown. Without data: today.
 *
 * @param span first and last computed hour, null when there is none
 * @param nowMs "now" [ms since epoch], used only when there is no data
 */
export function defaultPeriod(range: Exclude<Range, 'custom'>, timeZone: string, span: DataSpan | null, nowMs = Date.now()): { period: Period; choice: PeriodChoice } {
  if (!span) return { period: resolvePeriod({ range }, timeZone, nowMs), choice: 'now' };
  const holding = resolvePeriod({ range }, timeZone, span.lastMs);
  if (span.lastMs + HOUR_MS >= holding.toMs) return { period: holding, choice: 'latest-full' };
  const before = resolvePeriod({ range, anchor: holding.prevAnchor }, timeZone);
  if (span.firstMs < before.toMs) return { period: before, choice: 'latest-full' };
  return { period: holding, choice: 'latest-partial' };
}

/** The period of a view's query: the one asked for, or the default of defaultPeriod. */
export function periodFor(q: PeriodQuery, timeZone: string, span: DataSpan | null, nowMs = Date.now()): { period: Period; choice: PeriodChoice } {
  if (q.anchor || q.range === 'custom') return { period: resolvePeriod(q, timeZone, nowMs), choice: 'asked' };
  return defaultPeriod(q.range, timeZone, span, nowMs);
}
