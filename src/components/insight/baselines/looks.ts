import { fixed, significant } from '~/lib/format';
import { siteDay, siteDayStart, siteStamp, siteStampWithZone } from '~/lib/site-time';
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
export const pct = (v: number | null | undefined) => fixed(v === null || v === undefined ? v : v * 100, 1, { none: '–' });
/** A power [W] in kW. */
export const kW = (W: number | null | undefined, digits = 1) => fixed(W === null || W === undefined ? W : W / 1000, digits, { none: '–' });
/** A number to `digits` significant figures, never in e-notation (src/lib/format.ts). */
export const sig = (v: number | null | undefined, digits = 4) => significant(v, digits, { none: '–' });

/** An instant as 'yyyy-MM-dd HH:mm' in a time zone. */
export const at = (iso: string | null | undefined, tz: string) => (iso ? siteStamp(iso, tz) : '');
/** An instant as 'yyyy-MM-dd HH:mm (Zone/Name)' in a time zone: for a time that stands alone in a sentence or cell. */
export const atZ = (iso: string | null | undefined, tz: string) => (iso ? siteStampWithZone(iso, tz) : '');
/** An instant as 'yyyy-MM-dd' in a time zone. */
export const dayOf = (iso: string, tz: string) => siteDay(iso, tz);

const isoOf = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());
/** The start of a 'yyyy-MM-dd' day in a time zone, as an ISO instant. */
export const dayStartIso = (day: string, tz: string): string | null => isoOf(siteDayStart(day.trim(), tz));
/** The end of a 'yyyy-MM-dd' day in a time zone (the next day's start), as an ISO instant. */
export const dayEndIso = (day: string, tz: string): string | null => isoOf(siteDayStart(day.trim(), tz, 1));
