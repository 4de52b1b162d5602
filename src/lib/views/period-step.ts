/**
 * The period picker's moves, pure: which period a click on a range or on earlier / later asks for,
 * from the period shown and what the server answered for it (src/lib/views/period.ts).
 * Used by src/components/insight/views/PeriodPicker.tsx.
 */
import type { Period, Range } from './period';

/** A period as the picker and the page's address hold it (local dates of the site's clock). */
export interface PeriodValue {
  range: Range;
  anchor?: string;
  from?: string;
  to?: string;
}

/** What the picker needs of the server's period to step from it. */
export type PeriodSteps = Pick<Period, 'firstDay' | 'lastDay' | 'prevAnchor' | 'nextAnchor' | 'hours'>;

/** A local date (YYYY-MM-DD) moved by whole days, on the calendar (no time zone involved). */
export function shiftDay(day: string, days: number): string {
  const t = new Date(`${day}T00:00:00Z`);
  t.setUTCDate(t.getUTCDate() + days);
  return t.toISOString().slice(0, 10);
}

/**
 * The period one step earlier (dir -1) or later (dir 1): a custom period moves by its own length in
 * days; the others go to the server's previous or next anchor. Null before the server has answered.
 */
export function stepPeriod(value: PeriodValue, info: PeriodSteps | null, dir: -1 | 1): PeriodValue | null {
  if (!info) return null;
  if (value.range === 'custom') {
    const days = Math.round(info.hours / 24);
    return { range: 'custom', from: shiftDay(info.firstDay, dir * days), to: shiftDay(info.lastDay, dir * days) };
  }
  return { range: value.range, anchor: dir < 0 ? info.prevAnchor : info.nextAnchor };
}

/**
 * The period asked for by a click on a range: custom keeps the dates in the form (or the shown
 * period's); the others anchor on the custom period's first day or the current anchor.
 */
export function pickRange(range: Range, value: PeriodValue, info: PeriodSteps | null, from: string, to: string): PeriodValue {
  if (range === 'custom') return { range, from: from || info?.firstDay, to: to || info?.lastDay };
  return { range, anchor: value.range === 'custom' ? (value.from ?? info?.firstDay) : (value.anchor ?? info?.firstDay) };
}
