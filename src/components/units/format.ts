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
