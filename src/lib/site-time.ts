/**
 * Instants in the site's own clock: every page, mail, report and island writes times through these,
 * in the IANA zone of the site (sites.time_zone), with @date-fns/tz. Pure; no I/O.
 *
 * An instant is UTC milliseconds, a Date or an ISO string; a local day is 'yyyy-MM-dd'; a wall time
 * is 'yyyy-MM-ddTHH:mm' as a datetime-local input gives it.
 */
import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';
import type { Weekday } from './plant/idle';

export type Instant = number | string | Date;

const msOf = (t: Instant): number => (typeof t === 'number' ? t : typeof t === 'string' ? Date.parse(t) : t.getTime());

/** Default pattern: the site's date and minute, '2024-03-04 13:00'. */
export const SITE_STAMP = 'yyyy-MM-dd HH:mm';

/** An instant written in the site's clock (date-fns pattern). */
export function siteStamp(t: Instant, timeZone: string, pattern = SITE_STAMP): string {
  return format(new TZDate(msOf(t), timeZone), pattern);
}

/** An instant in the site's clock followed by the zone it is in: '2024-03-04 13:00 (Europe/Berlin)'. */
export function siteStampWithZone(t: Instant, timeZone: string): string {
  return `${siteStamp(t, timeZone)} (${timeZone})`;
}

/** The site's local date of an instant, 'yyyy-MM-dd'. */
export function siteDay(t: Instant, timeZone: string): string {
  return siteStamp(t, timeZone, 'yyyy-MM-dd');
}

/** The instant [ms] of a local wall time on site; null when the text is no date (time optional). */
export function siteWallTime(local: string, timeZone: string): number | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2}))?$/.exec(local.trim());
  if (!m) return null;
  const ms = new TZDate(Number(m[1]), Number(m[2]) - 1, Number(m[3]), Number(m[4] ?? 0), Number(m[5] ?? 0), timeZone).getTime();
  return Number.isNaN(ms) ? null : ms;
}

/** The start [ms] of a local day on site, plus `days` whole local days (23 or 25 hours across a clock change). */
export function siteDayStart(day: string, timeZone: string, days = 0): number | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(day);
  if (!m) return null;
  const ms = new TZDate(Number(m[1]), Number(m[2]) - 1, Number(m[3]) + days, 0, 0, timeZone).getTime();
  return Number.isNaN(ms) ? null : ms;
}

/** The start [ms] of the site's local day holding an instant. */
export function siteMidnight(t: Instant, timeZone: string): number {
  return new TZDate(msOf(t), timeZone).setHours(0, 0, 0, 0);
}

/** Now as a wall time on site, for a datetime-local input. */
export function siteNowWall(timeZone: string, nowMs = Date.now()): string {
  return siteStamp(nowMs, timeZone, "yyyy-MM-dd'T'HH:mm");
}

const formats = new Map<string, Intl.DateTimeFormat>();
const SHORT_DAYS: Record<string, Weekday> = { Mon: 'mon', Tue: 'tue', Wed: 'wed', Thu: 'thu', Fri: 'fri', Sat: 'sat', Sun: 'sun' };

/** Day of the week and hour (0-23) of an instant in a time zone. */
export function localDayHour(ms: number, timeZone: string): { day: Weekday; hour: number } {
  let f = formats.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', { timeZone, weekday: 'short', hour: '2-digit', hourCycle: 'h23' });
    formats.set(timeZone, f);
  }
  let day: Weekday = 'mon';
  let hour = 0;
  for (const p of f.formatToParts(new Date(ms))) {
    if (p.type === 'weekday') day = SHORT_DAYS[p.value] ?? 'mon';
    if (p.type === 'hour') hour = Number(p.value) % 24;
  }
  return { day, hour };
}
