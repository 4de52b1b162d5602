import { afterEach, describe, expect, it, vi } from 'vitest';
import { DIGEST_CRON, digestDayDue, digestTimeWords, digestZoneOf } from '~/lib/digest-time';
import { siteDay, siteStamp } from '~/lib/site-time';

const HOUR = 3_600_000;

/**
 * The job as the worker runs it: every hour on the hour (DIGEST_CRON), with a fake clock; a person's
 * digest is "sent" when the run's local day is due and not yet marked, as sendNoticeDigests does.
 * Returns each local day sent with the local time of the run that sent it.
 */
function runHourly(timeZone: string, fromIso: string, hours: number, skip: (ms: number) => boolean = () => false) {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date(fromIso));
  const marked = new Map<string, string>();
  for (let i = 0; i < hours; i++) {
    const now = Date.now();
    if (!skip(now)) {
      const day = digestDayDue(timeZone);
      if (day !== null && !marked.has(day)) marked.set(day, siteStamp(now, timeZone, 'yyyy-MM-dd HH:mm'));
    }
    vi.setSystemTime(now + HOUR);
  }
  return marked;
}

/** Every local day whose 06:00 to 12:00 lies wholly inside [from, from + hours). */
function daysCovered(timeZone: string, fromIso: string, hours: number): string[] {
  const out = new Set<string>();
  const from = Date.parse(fromIso);
  for (let t = from + 24 * HOUR; t < from + (hours - 24) * HOUR; t += HOUR) out.add(siteDay(t, timeZone));
  return [...out];
}

afterEach(() => vi.useRealTimers());

describe('the daily digest arrives at 06:00 in the zone of the first site', () => {
  it('the job runs every hour on the hour', () => {
    expect(DIGEST_CRON).toBe('0 * * * *');
  });

  // Zones from the IANA tz database: UTC; Pacific/Honolulu UTC-10 all year; Europe/London UTC+0, summer
  // time (UTC+1) from the last Sunday of March 01:00 UTC to the last Sunday of October 01:00 UTC;
  // America/New_York UTC-5, UTC-4 from the second Sunday of March to the first Sunday of November;
  // Asia/Kolkata UTC+5:30; Pacific/Chatham UTC+12:45 / +13:45; Australia/Lord_Howe UTC+10:30 with a
  // half-hour summer shift to +11; Pacific/Kiritimati UTC+14.
  const ZONES = ['UTC', 'Pacific/Honolulu', 'Europe/London', 'America/New_York', 'Asia/Kolkata', 'Pacific/Chatham', 'Australia/Lord_Howe', 'Pacific/Kiritimati'];

  // A whole year where the clocks change (both changes inside it), 40 days elsewhere.
  const SPAN: Record<string, number> = { 'Europe/London': 366, 'America/New_York': 366, 'Pacific/Chatham': 366, 'Australia/Lord_Howe': 366 };
  it.each(ZONES)('%s: one digest on every local day run, in the hour from 06:00 local', (zone) => {
    const from = '2025-01-01T00:00:00Z';
    const hours = (SPAN[zone] ?? 40) * 24;
    const sent = runHourly(zone, from, hours);
    const days = daysCovered(zone, from, hours);
    expect(days.length).toBeGreaterThan((SPAN[zone] ?? 40) - 3);
    for (const d of days) {
      const at = sent.get(d);
      expect(at, `${zone}: no digest on ${d}`).toBeDefined();
      // On the local day itself, between 06:00 and 06:59 (06:30 or 06:45 in zones off the whole hour).
      expect(at!.slice(0, 10)).toBe(d);
      expect(at!.slice(11, 13), `${zone} ${d} sent at ${at}`).toBe('06');
    }
    // A map keyed by local day: never twice on one day; and nothing outside the days run.
    expect(sent.size).toBeLessThanOrEqual(days.length + 2);
  });

  it('London: on the days the clocks change the digest still comes at 06:00 local (05:00 UTC in summer, 06:00 UTC in winter)', () => {
    // 30 March 2025: 01:00 UTC becomes 02:00 BST; 26 October 2025: 01:00 UTC becomes 01:00 GMT (IANA tz database).
    const spring = runHourly('Europe/London', '2025-03-29T00:00:00Z', 72);
    expect(spring.get('2025-03-29')).toBe('2025-03-29 06:00');
    expect(spring.get('2025-03-30')).toBe('2025-03-30 06:00');
    expect(spring.get('2025-03-31')).toBe('2025-03-31 06:00');
    // 06:00 BST on 30 March is 05:00 UTC.
    vi.useRealTimers();
    expect(digestDayDue('Europe/London', '2025-03-30T05:00:00Z')).toBe('2025-03-30');
    expect(digestDayDue('Europe/London', '2025-03-30T04:00:00Z')).toBeNull();
    const autumn = runHourly('Europe/London', '2025-10-25T00:00:00Z', 72);
    expect([...autumn.keys()]).toEqual(['2025-10-25', '2025-10-26', '2025-10-27']);
    expect(autumn.get('2025-10-26')).toBe('2025-10-26 06:00');
  });

  it('New York: the 23-hour and the 25-hour day each get exactly one digest', () => {
    // 9 March 2025 02:00 EST -> 03:00 EDT; 2 November 2025 02:00 EDT -> 01:00 EST (IANA tz database).
    const spring = runHourly('America/New_York', '2025-03-08T05:00:00Z', 71);
    expect([...spring.entries()]).toEqual([
      ['2025-03-08', '2025-03-08 06:00'],
      ['2025-03-09', '2025-03-09 06:00'],
      ['2025-03-10', '2025-03-10 06:00'],
    ]);
    const autumn = runHourly('America/New_York', '2025-11-01T04:00:00Z', 73);
    expect([...autumn.entries()]).toEqual([
      ['2025-11-01', '2025-11-01 06:00'],
      ['2025-11-02', '2025-11-02 06:00'],
      ['2025-11-03', '2025-11-03 06:00'],
    ]);
  });

  it('Honolulu gets it at 06:00 there (16:00 UTC), not at 20:00 the evening before', () => {
    expect(digestDayDue('Pacific/Honolulu', '2025-06-04T06:00:00Z')).toBeNull(); // 20:00 on 3 June in Honolulu
    expect(digestDayDue('Pacific/Honolulu', '2025-06-04T16:00:00Z')).toBe('2025-06-04'); // 06:00 on 4 June
  });

  it('a run missed at 06:00 is made up later the same morning; none in the afternoon', () => {
    // The worker is down from 05:00 to 08:59 UTC each day: in London (GMT in January) the digest comes at 09:00.
    const down = (ms: number) => {
      const h = new Date(ms).getUTCHours();
      return h >= 5 && h < 9;
    };
    const sent = runHourly('Europe/London', '2025-01-10T00:00:00Z', 48, down);
    expect(sent.get('2025-01-10')).toBe('2025-01-10 09:00');
    expect(sent.get('2025-01-11')).toBe('2025-01-11 09:00');
    // Down the whole morning: that day is left out rather than mailed at 15:00.
    const allMorning = runHourly('Europe/London', '2025-01-10T00:00:00Z', 24, (ms) => new Date(ms).getUTCHours() < 12);
    expect(allMorning.size).toBe(0);
    vi.useRealTimers();
    expect(digestDayDue('Europe/London', '2025-01-10T11:59:00Z')).toBe('2025-01-10');
    expect(digestDayDue('Europe/London', '2025-01-10T12:00:00Z')).toBeNull();
    expect(digestDayDue('Europe/London', '2025-01-10T05:59:00Z')).toBeNull();
  });

  it('the zone is that of the first of the sites as listed; the words name it and the site', () => {
    const z = digestZoneOf([
      { name: 'Anchor Bay', timeZone: 'Pacific/Honolulu' },
      { name: 'Zeeland', timeZone: 'Europe/Amsterdam' },
    ]);
    expect(z).toEqual({ timeZone: 'Pacific/Honolulu', siteName: 'Anchor Bay' });
    expect(digestTimeWords(z)).toContain('06:00 Pacific/Honolulu time (the zone of Anchor Bay, the first of your sites)');
    expect(digestTimeWords(z)).not.toContain('UTC');
    expect(digestZoneOf([])).toBeNull();
    expect(digestTimeWords(null)).toMatch(/no site yet, so none is sent/);
  });
});
