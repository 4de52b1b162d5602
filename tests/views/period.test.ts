import { describe, expect, it } from 'vitest';
import { PeriodQuery, monthPeriod, resolvePeriod } from '~/lib/views/period';

/**
 * Periods in the site's clock. Offsets from the IANA time zone database (tzdata):
 * Asia/Kolkata is UTC+05:30 all year; Europe/Berlin is UTC+01:00, and UTC+02:00 from
 * 2024-03-31 01:00 UTC to 2024-10-27 01:00 UTC (EU summer time rule, Directive 2000/84/EC).
 */
describe('periods in the site time zone', () => {
  it('tzdata: a day in Asia/Kolkata starts at 18:30 UTC the day before', () => {
    const p = resolvePeriod({ range: 'day', anchor: '2024-03-10' }, 'Asia/Kolkata');
    expect(p.from).toBe('2024-03-09T18:30:00.000Z');
    expect(p.to).toBe('2024-03-10T18:30:00.000Z');
    expect(p.hours).toBe(24);
    expect(p.label).toBe('Sun 10 Mar 2024');
    expect([p.prevAnchor, p.nextAnchor]).toEqual(['2024-03-09', '2024-03-11']);
  });

  it('tzdata: the spring-forward day in Europe/Berlin has 23 hours, the autumn one 25', () => {
    const spring = resolvePeriod({ range: 'day', anchor: '2024-03-31' }, 'Europe/Berlin');
    expect([spring.from, spring.to, spring.hours]).toEqual(['2024-03-30T23:00:00.000Z', '2024-03-31T22:00:00.000Z', 23]);
    const autumn = resolvePeriod({ range: 'day', anchor: '2024-10-27' }, 'Europe/Berlin');
    expect([autumn.from, autumn.to, autumn.hours]).toEqual(['2024-10-26T22:00:00.000Z', '2024-10-27T23:00:00.000Z', 25]);
  });

  it('self-consistency: a week runs Monday to Monday around its anchor; month and year are calendar ones', () => {
    // 2024-03-06 is a Wednesday; its week starts on Monday 2024-03-04 (ISO 8601 weeks).
    const w = resolvePeriod({ range: 'week', anchor: '2024-03-06' }, 'UTC');
    expect([w.from, w.to, w.firstDay, w.lastDay, w.hours]).toEqual(['2024-03-04T00:00:00.000Z', '2024-03-11T00:00:00.000Z', '2024-03-04', '2024-03-10', 168]);
    // March in Berlin: 31 days less the hour skipped on the 31st = 743 hours.
    const m = resolvePeriod({ range: 'month', anchor: '2024-03-15' }, 'Europe/Berlin');
    expect([m.from, m.to, m.hours, m.label]).toEqual(['2024-02-29T23:00:00.000Z', '2024-03-31T22:00:00.000Z', 743, 'March 2024']);
    // 2024 is a leap year: 366 days; in Kolkata it starts at 2023-12-31 18:30 UTC.
    const y = resolvePeriod({ range: 'year', anchor: '2024-07-01' }, 'Asia/Kolkata');
    expect([y.from, y.hours, y.label]).toEqual(['2023-12-31T18:30:00.000Z', 366 * 24, '2024']);
    expect(monthPeriod('2024-02', 'UTC').hours).toBe(29 * 24);
  });

  it('self-consistency: a custom period includes its last local day, and refuses one that ends before it starts', () => {
    const c = resolvePeriod({ range: 'custom', from: '2024-01-30', to: '2024-02-02' }, 'America/Chicago');
    // Chicago is UTC-06:00 in winter: local midnight of 30 Jan is 06:00 UTC; four days = 96 h.
    expect([c.from, c.to, c.hours]).toEqual(['2024-01-30T06:00:00.000Z', '2024-02-03T06:00:00.000Z', 96]);
    expect(() => resolvePeriod({ range: 'custom', from: '2024-02-02', to: '2024-01-30' }, 'UTC')).toThrow(/ends before/);
    expect(() => resolvePeriod({ range: 'day', anchor: '2024-02-30' }, 'UTC')).toThrow(/not a calendar date/);
    expect(PeriodQuery.safeParse({ range: 'custom', from: '2024-01-01' }).success).toBe(false);
    expect(PeriodQuery.safeParse({ range: 'fortnight' }).success).toBe(false);
  });

  it('self-consistency: without an anchor the period is the one holding "now" on site', () => {
    // 2024-06-15 20:00 UTC is already 16 June in Kolkata (01:30 local).
    const p = resolvePeriod({ range: 'day' }, 'Asia/Kolkata', Date.parse('2024-06-15T20:00:00Z'));
    expect(p.firstDay).toBe('2024-06-16');
  });
});
