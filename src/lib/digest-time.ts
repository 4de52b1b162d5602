/**
 * When a person's daily digest of notices is due: at 06:00 in the morning of the zone of their first
 * listed site (the first of the sites they may use, in the order of the site list: by name). The job
 * runs every hour; a person's digest goes in the first run from 06:00 on their clock, once per local
 * day (the marker is that day). A run missed at 06:00 (worker down) is made up by a later run of the
 * same morning, until noon; after that the day is left out rather than mailed in the afternoon.
 * Daylight-saving changes happen at night, so 06:00 to noon exists on every local day and nothing is
 * skipped or sent twice across them (tests/insight/digest-time.test.ts).
 *
 * Pure: no I/O.
 */
import { siteDay, siteStamp, type Instant } from './site-time';

/** The local hour from which the digest is due. */
export const DIGEST_HOUR = 6;
/** The local hour from which a morning's digest not yet sent is left out. */
export const DIGEST_LAST_HOUR = 12;
/** The job's schedule (cron, UTC): every hour on the hour. Zones off the whole hour get it at 06:30 or 06:45. */
export const DIGEST_CRON = '0 * * * *';

export interface DigestZone {
  timeZone: string;
  /** The site whose zone it is. */
  siteName: string;
}

/**
 * The zone of a person's digest: that of the first of their sites as the site list gives them (by
 * name, the database's order: listSites); null without a site.
 */
export function digestZoneOf(sites: readonly { name: string; timeZone: string }[]): DigestZone | null {
  const first = sites[0];
  return first ? { timeZone: first.timeZone, siteName: first.name } : null;
}

/**
 * The local day whose digest a run at `now` sends in `timeZone`, or null when it is not the morning
 * there (before 06:00 or from noon). The caller sends once per (person, day).
 */
export function digestDayDue(timeZone: string, now: Instant = Date.now()): string | null {
  const hour = Number(siteStamp(now, timeZone, 'H'));
  return hour >= DIGEST_HOUR && hour < DIGEST_LAST_HOUR ? siteDay(now, timeZone) : null;
}

/** The setting's words: when the digest arrives, in the person's zone, with the site it comes from. */
export function digestTimeWords(zone: DigestZone | null): string {
  if (!zone) return 'The digest is sent at 06:00 in the time zone of your first site; you have no site yet, so none is sent.';
  return `The digest is sent each morning at about 06:00 ${zone.timeZone} time (the zone of ${zone.siteName}, the first of your sites), once a day, while notices are not closed.`;
}
