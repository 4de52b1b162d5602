import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';

/** Numbers for the tables: fixed decimals, an en dash for nothing. */
export function fmt(v: number | null | undefined, digits = 1, scale = 1): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '–';
  const text = (v * scale).toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });
  return /^-[0.,]*$/.test(text) ? text.slice(1) : text; // a rounded zero shows without its sign
}

/** An instant as the site's clock shows it: 2024-03-01 10:00. */
export function siteTime(iso: string, timeZone: string, pattern = 'yyyy-MM-dd HH:mm'): string {
  return format(new TZDate(new Date(iso).getTime(), timeZone), pattern);
}

/** The instant a site-local calendar day (yyyy-MM-dd) starts, as ISO. */
export function siteDayStart(day: string, timeZone: string): string {
  const [y, m, d] = day.split('-').map(Number);
  return new Date(new TZDate(y!, m! - 1, d!, timeZone).getTime()).toISOString();
}

/** The site-local calendar day (yyyy-MM-dd) of an instant. */
export function siteDay(iso: string, timeZone: string): string {
  return siteTime(iso, timeZone, 'yyyy-MM-dd');
}
