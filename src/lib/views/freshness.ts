/**
 * How fresh a site's figures are: the latest computed hour, how long ago it ended, and whether that
 * is old enough (over STALE_AFTER_MS) that every page of the site must say so, so that nobody reads
 * last year's figures as today's. Pure; no I/O.
 */
import { formatDistanceStrict } from 'date-fns';
import { siteStamp } from '../site-time';
import { DAY_MS, HOUR_MS } from '../time';

/** Latest data older than this is called out on every page of the site [ms]. */
export const STALE_AFTER_MS = DAY_MS;

export interface Freshness {
  /** Start of the latest computed hour (ISO, UTC); null when the site has none. */
  lastHourStart: string | null;
  /** That hour in the site's clock with its zone: '2025-05-18 23:00–24:00 (Europe/London)'. */
  lastHourText: string | null;
  /** How long ago that hour ended, in words: '11 months ago'. */
  ago: string | null;
  /** True when the hour ended more than STALE_AFTER_MS before now. */
  stale: boolean;
  /** The sentence a page shows: 'Latest data: 11 months ago (hour 2025-05-18 23:00–24:00, Europe/London).' */
  text: string;
}

/**
 * @param lastMs start of the latest computed hour [ms since epoch], null when there is none
 * @param nowMs now [ms since epoch]
 */
export function freshness(lastMs: number | null, timeZone: string, nowMs = Date.now()): Freshness {
  if (lastMs === null) return { lastHourStart: null, lastHourText: null, ago: null, stale: false, text: 'No computed hours yet.' };
  const endMs = lastMs + HOUR_MS;
  const end = siteStamp(endMs, timeZone, 'HH:mm');
  const lastHourText = `${siteStamp(lastMs, timeZone)}–${end === '00:00' ? '24:00' : end} (${timeZone})`;
  const ago = endMs >= nowMs ? 'in the current hour' : formatDistanceStrict(endMs, nowMs, { addSuffix: true, roundingMethod: 'floor' });
  return {
    lastHourStart: new Date(lastMs).toISOString(),
    lastHourText,
    ago,
    stale: nowMs - endMs > STALE_AFTER_MS,
    text: `Latest data: ${ago} (hour ${lastHourText}).`,
  };
}
