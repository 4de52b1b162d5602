import { fixed, withU } from '~/lib/format';
import { siteDay as dayOf, siteDayStart as dayStartMs, siteStamp } from '~/lib/site-time';

/** Numbers for the tables: fixed decimals, an en dash for nothing, never "-0.0" (src/lib/format.ts). */
export function fmt(v: number | null | undefined, digits = 1, scale = 1): string {
  return fixed(v === null || v === undefined ? v : v * scale, digits, { none: '–' });
}

/** A value and its U in the tables, at the decimals U asks for: "71.3 ± 1.2". */
export function fmtU(v: number | null | undefined, U: number | null | undefined, digits = 1, scale = 1): string {
  return withU(v === null || v === undefined ? v : v * scale, U === null || U === undefined ? U : U * scale, { decimals: digits, none: '–' });
}

/** An instant as the site's clock shows it: 2024-03-01 10:00. */
export const siteTime = (iso: string, timeZone: string, pattern?: string): string => siteStamp(iso, timeZone, pattern);

/** The instant a site-local calendar day (yyyy-MM-dd) starts, as ISO. */
export function siteDayStart(day: string, timeZone: string): string {
  return new Date(dayStartMs(day, timeZone) ?? Number.NaN).toISOString();
}

/** The site-local calendar day (yyyy-MM-dd) of an instant. */
export const siteDay = (iso: string, timeZone: string): string => dayOf(iso, timeZone);

/** An hour's start as the address writes it (?hour=2026-05-12T10:00Z): short, readable, exact to the minute. */
export const hourInAddress = (iso: string): string => `${new Date(iso).toISOString().slice(0, 16)}Z`;

/** The hour named by the address as a full ISO instant, or null when the text is no instant. */
export function hourFromAddress(text: string | null | undefined): string | null {
  // A zone is required (Z or an offset): a bare wall time would be read in the reader's own zone.
  if (!text || text.length > 40 || !/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}.*(Z|[+-]\d{2}:?\d{2})$/.test(text)) return null;
  const ms = Date.parse(text);
  return Number.isFinite(ms) ? new Date(ms).toISOString() : null;
}
