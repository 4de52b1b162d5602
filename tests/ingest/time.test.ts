import { describe, expect, it } from 'vitest';
import {
  HourClock,
  LocalClock,
  newScan,
  scanDateTime,
  scanTimeOnly,
  wallMsFromScan,
  wallMsFromSerial,
  timeOfDayMs,
} from '~/lib/ingest/index';
import { utc } from './helpers';

const wall = (text: string, order: 'ymd' | 'dmy' | 'mdy') => {
  const s = newScan();
  if (!scanDateTime(text, 0, text.length, s)) return { ok: false as const };
  return { ok: true as const, wallMs: wallMsFromScan(s, order), offset: s.offsetMinutes, meridiem: s.meridiem };
};

describe('date-time text', () => {
  it.each([
    ['2024-03-05 10:15:30', 'ymd', '2024-03-05T10:15:30Z'],
    ['2024-03-05T10:15:30.250', 'ymd', '2024-03-05T10:15:30.250Z'],
    ['2024/03/05 10:15', 'ymd', '2024-03-05T10:15:00Z'],
    ['05.03.2024 10:15', 'dmy', '2024-03-05T10:15:00Z'],
    ['03/05/2024 10:15', 'mdy', '2024-03-05T10:15:00Z'],
    ['5-Mar-2024 10:15', 'mdy', '2024-03-05T10:15:00Z'],
    ['Mar 5 2024 10:15', 'dmy', '2024-03-05T10:15:00Z'],
    ['05.03.24 10:15', 'dmy', '2024-03-05T10:15:00Z'],
    ['03/05/2024 12:00:00 AM', 'mdy', '2024-03-05T00:00:00Z'],
    ['03/05/2024 12:00:00 PM', 'mdy', '2024-03-05T12:00:00Z'],
    ['03/05/2024 1:05 p.m.', 'mdy', '2024-03-05T13:05:00Z'],
    ['2024-03-05', 'ymd', '2024-03-05T00:00:00Z'],
    ['2024-02-29 23:59:59', 'ymd', '2024-02-29T23:59:59Z'],
  ] as const)('%s (%s) is the wall clock %s', (text, order, expected) => {
    const r = wall(text, order);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.wallMs).toBe(utc(expected));
  });

  it.each([
    ['2024-03-05T10:15:00Z', 0],
    ['2024-03-05T10:15:00+01:00', 60],
    ['2024-03-05T10:15:00+0530', 330],
    ['2024-03-05 10:15:00 -05:00', -300],
    ['2024-03-05 10:15:00 UTC', 0],
  ])('%s carries the offset %d minutes', (text, offset) => {
    const r = wall(text, 'ymd');
    expect(r.ok && r.offset).toBe(offset);
  });

  it.each(['2024-02-30 10:00', '2023-02-29 10:00', '13/13/2024 10:00', '2024-03-05 25:00', '2024-03-05 10:61'])(
    '%s is not a valid time',
    (text) => {
      const r = wall(text, 'dmy');
      expect(r.ok ? r.wallMs : NaN).toBeNaN();
    },
  );

  it.each(['Shutdown', '12.5', '10:00', '2024-03-05 10:00 tomorrow', ''])('%j is not date-time text', (text) => {
    expect(wall(text, 'ymd').ok).toBe(false);
  });

  it('reads time-of-day cells on their own', () => {
    const s = newScan();
    expect(scanTimeOnly('23:59:30', 0, 8, s)).toBe(true);
    expect(timeOfDayMs(s)).toBe(((23 * 60 + 59) * 60 + 30) * 1000);
  });

  it('spreadsheet serial days count from 1899-12-30', () => {
    // 45356 days after 1899-12-30 is 2024-03-05 (25569 is 1970-01-01); .5 is noon.
    expect(wallMsFromSerial(45356.5)).toBe(utc('2024-03-05T12:00:00Z'));
    expect(wallMsFromSerial(25569)).toBe(0);
  });
});

describe('LocalClock (order rule for daylight saving)', () => {
  it('reads the repeated autumn hour in Berlin first with summer time, then after the step back with winter time', () => {
    const c = new LocalClock('Europe/Berlin');
    const walls = ['01:45', '02:00', '02:30', '02:45', '02:15', '02:30', '03:00'].map((hm) => utc(`2024-10-27T${hm}:00Z`));
    const got = walls.map((w, i) => new Date(c.toUtc(w, i + 1)).toISOString());
    expect(got).toEqual([
      '2024-10-26T23:45:00.000Z', // 01:45 CEST
      '2024-10-27T00:00:00.000Z', // 02:00 CEST, first pass
      '2024-10-27T00:30:00.000Z',
      '2024-10-27T00:45:00.000Z',
      '2024-10-27T01:15:00.000Z', // 02:15 stepped back: second pass, CET
      '2024-10-27T01:30:00.000Z',
      '2024-10-27T02:00:00.000Z', // 03:00 CET
    ]);
    expect(c.stats.repeatedFirstPassCount).toBe(3);
    expect(c.stats.repeatedSecondPassCount).toBe(2);
    expect(c.stats.repeatedLines).toEqual([2, 3, 4, 5, 6]);
  });

  it('hourly rows: the second 02:00 is the second pass', () => {
    const c = new LocalClock('Europe/Berlin');
    const got = ['01:00', '02:00', '02:00', '03:00'].map((hm, i) => c.toUtc(utc(`2024-10-27T${hm}:00Z`), i + 1));
    expect(got).toEqual([utc('2024-10-26T23:00:00Z'), utc('2024-10-27T00:00:00Z'), utc('2024-10-27T01:00:00Z'), utc('2024-10-27T02:00:00Z')]);
  });

  it('reads a time in the spring gap with the offset before the change and counts it', () => {
    const c = new LocalClock('Europe/Berlin');
    expect(c.toUtc(utc('2024-03-31T02:30:00Z'), 7)).toBe(utc('2024-03-31T01:30:00Z')); // = 03:30 CEST
    expect(c.stats.gapCount).toBe(1);
    expect(c.stats.gapLines).toEqual([7]);
  });

  it('a zone without daylight saving (Asia/Kolkata, +05:30) is a plain shift', () => {
    const c = new LocalClock('Asia/Kolkata');
    expect(c.toUtc(utc('2024-01-10T10:00:00Z'), 1)).toBe(utc('2024-01-10T04:30:00Z'));
  });
});

describe('HourClock (local clock hours)', () => {
  it('Berlin autumn change: the repeated 02:00 hour is two hours with different offsets', () => {
    const clock = new HourClock('Europe/Berlin');
    const starts: [string, number][] = [];
    for (let t = utc('2024-10-26T22:30:00Z'); t < utc('2024-10-27T03:00:00Z'); t += 3_600_000) {
      const h = clock.hourOf(t);
      starts.push([new Date(h.startMs).toISOString(), h.offsetMinutes]);
      expect(h.endMs - h.startMs).toBe(3_600_000);
    }
    expect(starts).toEqual([
      ['2024-10-26T22:00:00.000Z', 120], // 00:00 CEST
      ['2024-10-26T23:00:00.000Z', 120], // 01:00 CEST
      ['2024-10-27T00:00:00.000Z', 120], // 02:00 CEST
      ['2024-10-27T01:00:00.000Z', 60], // 02:00 CET
      ['2024-10-27T02:00:00.000Z', 60], // 03:00 CET
    ]);
  });

  it('Berlin spring change: 01:00 CET is followed by 03:00 CEST', () => {
    const clock = new HourClock('Europe/Berlin');
    const a = clock.hourOf(utc('2024-03-31T00:59:59Z'));
    const b = clock.hourOf(utc('2024-03-31T01:00:00Z'));
    expect([a.startMs, a.endMs, a.offsetMinutes]).toEqual([utc('2024-03-31T00:00:00Z'), utc('2024-03-31T01:00:00Z'), 60]);
    expect([b.startMs, b.endMs, b.offsetMinutes]).toEqual([utc('2024-03-31T01:00:00Z'), utc('2024-03-31T02:00:00Z'), 120]);
  });

  it('Asia/Kolkata hours start at half past the UTC hour', () => {
    const clock = new HourClock('Asia/Kolkata');
    const h = clock.hourOf(utc('2024-01-10T05:00:00Z')); // 10:30 local
    expect([h.startMs, h.endMs, h.offsetMinutes]).toEqual([utc('2024-01-10T04:30:00Z'), utc('2024-01-10T05:30:00Z'), 330]);
  });

  it('an unknown zone is refused', () => {
    expect(() => new HourClock('Mars/Olympus')).toThrow(/not known/);
  });
});
