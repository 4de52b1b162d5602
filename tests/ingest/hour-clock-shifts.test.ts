/**
 * HourClock where the clock shifts inside a local hour (the bisection steps of src/lib/ingest/time.ts).
 * Transitions from the IANA time zone database (tzdata, as Node's ICU carries it):
 * - Australia/Lord_Howe moves by 30 minutes: 2025-10-05 02:00 +10:30 -> 02:30 +11:00 (15:30Z), and
 *   2026-04-05 02:00 +11:00 -> 01:30 +10:30 (15:00Z);
 * - America/Caracas on 2016-05-01 at 02:30 -04:30 -> 03:00 -04:00 (07:00Z).
 * The expected spans follow by hand from those instants: a local hour is cut where the offset changes.
 */
import { describe, expect, it } from 'vitest';
import { HourClock } from '~/lib/ingest/time';

const at = (iso: string) => Date.parse(iso);
const span = (tz: string, iso: string) => {
  const s = new HourClock(tz).hourOf(at(iso));
  return { start: new Date(s.startMs).toISOString(), end: new Date(s.endMs).toISOString(), offsetMinutes: s.offsetMinutes };
};

describe('HourClock across a shift inside a local hour', () => {
  it('starts the hour at the shift when the new offset begins mid-hour (Lord Howe, spring)', () => {
    expect(span('Australia/Lord_Howe', '2025-10-04T15:45:00Z')).toEqual({ start: '2025-10-04T15:30:00.000Z', end: '2025-10-04T16:00:00.000Z', offsetMinutes: 660 });
    expect(span('Australia/Lord_Howe', '2025-10-04T15:10:00Z')).toEqual({ start: '2025-10-04T14:30:00.000Z', end: '2025-10-04T15:30:00.000Z', offsetMinutes: 630 });
  });

  it('starts the hour at the shift when the clock goes back by half an hour (Lord Howe, autumn)', () => {
    expect(span('Australia/Lord_Howe', '2026-04-04T15:10:00Z')).toEqual({ start: '2026-04-04T15:00:00.000Z', end: '2026-04-04T15:30:00.000Z', offsetMinutes: 630 });
    expect(span('Australia/Lord_Howe', '2026-04-04T14:40:00Z')).toEqual({ start: '2026-04-04T14:00:00.000Z', end: '2026-04-04T15:00:00.000Z', offsetMinutes: 660 });
  });

  it('ends the hour at the shift when the old offset stops mid-hour (Caracas 2016)', () => {
    expect(span('America/Caracas', '2016-05-01T06:45:00Z')).toEqual({ start: '2016-05-01T06:30:00.000Z', end: '2016-05-01T07:00:00.000Z', offsetMinutes: -270 });
    expect(span('America/Caracas', '2016-05-01T07:10:00Z')).toEqual({ start: '2016-05-01T07:00:00.000Z', end: '2016-05-01T08:00:00.000Z', offsetMinutes: -240 });
  });
});
