import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';
import type { MarkShape } from '~/components/StateMark';

/** Baseline statuses in words and shapes; colour is only a third cue. */
export const BASELINE_LOOK: Record<string, { label: string; shape: MarkShape; className: string }> = {
  draft: { label: 'draft', shape: 'ring', className: 'text-ink-faint' },
  active: { label: 'active', shape: 'circle', className: 'text-teal' },
  retired: { label: 'retired', shape: 'bar', className: 'text-slate' },
  discarded: { label: 'discarded', shape: 'triangle', className: 'text-slate' },
};

/** A Guideline 14 check in words and shapes. */
export const CHECK_LOOK = {
  meets: { label: 'meets', shape: 'circle' as MarkShape, className: 'text-teal' },
  outside: { label: 'outside', shape: 'triangle' as MarkShape, className: 'text-copper' },
};

/** A value in percent with one decimal (fractions in). */
export const pct = (v: number | null | undefined) => (v === null || v === undefined || !Number.isFinite(v) ? '–' : (v * 100).toFixed(1));
export const kW = (W: number | null | undefined, digits = 1) => (W === null || W === undefined || !Number.isFinite(W) ? '–' : (W / 1000).toFixed(digits));
export const sig = (v: number | null | undefined, digits = 4) => (v === null || v === undefined || !Number.isFinite(v) ? '–' : Number(v.toPrecision(digits)).toString());

/** An instant as 'yyyy-MM-dd HH:mm' in a time zone. */
export const at = (iso: string | null | undefined, tz: string) => (iso ? format(new TZDate(new Date(iso).getTime(), tz), 'yyyy-MM-dd HH:mm') : '');
/** An instant as 'yyyy-MM-dd' in a time zone. */
export const dayOf = (iso: string, tz: string) => format(new TZDate(new Date(iso).getTime(), tz), 'yyyy-MM-dd');

/** The start of a 'yyyy-MM-dd' day in a time zone, as an ISO instant. */
export function dayStartIso(day: string, tz: string): string | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(day.trim());
  if (!m) return null;
  return new Date(new TZDate(Number(m[1]), Number(m[2]) - 1, Number(m[3]), 0, 0, tz).getTime()).toISOString();
}
/** The end of a 'yyyy-MM-dd' day in a time zone (the next day's start), as an ISO instant. */
export function dayEndIso(day: string, tz: string): string | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(day.trim());
  if (!m) return null;
  return new Date(new TZDate(Number(m[1]), Number(m[2]) - 1, Number(m[3]) + 1, 0, 0, tz).getTime()).toISOString();
}
