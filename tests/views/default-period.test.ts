import { describe, expect, it } from 'vitest';
import { defaultPeriod, periodFor } from '~/lib/views/period';
import { freshness, STALE_AFTER_MS } from '~/lib/views/freshness';
import { DAY_MS, HOUR_MS } from '~/lib/time';

/**
 * The period a view opens on: the latest full calendar period with data, not the one holding the
 * latest hour. Offsets from the IANA time zone database (tzdata): Europe/London is UTC+00:00 in
 * winter and UTC+01:00 from 2025-03-30 01:00 UTC to 2025-10-26 01:00 UTC.
 */
const ms = (iso: string) => Date.parse(iso);

describe('the default period of a view', () => {
  it('self-consistency: a week whose latest hour is Monday 16:00 opens on the week before, all 168 hours', () => {
    // 2025-05-19 is a Monday; data runs from April to 16:00-17:00 UTC on that Monday (17 hours of the week).
    const span = { firstMs: ms('2025-04-01T00:00:00Z'), lastMs: ms('2025-05-19T16:00:00Z') };
    const { period, choice } = defaultPeriod('week', 'UTC', span);
    expect(choice).toBe('latest-full');
    expect([period.firstDay, period.lastDay, period.hours]).toEqual(['2025-05-12', '2025-05-18', 168]);
  });

  it('self-consistency: a month with five days of data opens on the month before; a closed month opens on itself', () => {
    const span = { firstMs: ms('2025-01-01T00:00:00Z'), lastMs: ms('2025-05-05T10:00:00Z') };
    const m = defaultPeriod('month', 'Europe/London', span);
    expect([m.period.label, m.choice]).toEqual(['April 2025', 'latest-full']);
    // 23:00 UTC on 31 May is the last hour of May in London (BST, UTC+1).
    const closed = defaultPeriod('month', 'Europe/London', { ...span, lastMs: ms('2025-05-31T22:00:00Z') });
    expect([closed.period.label, closed.choice]).toEqual(['May 2025', 'latest-full']);
  });

  it('self-consistency: the year and the day follow the same rule', () => {
    const span = { firstMs: ms('2024-01-01T00:00:00Z'), lastMs: ms('2025-05-19T16:00:00Z') };
    expect(defaultPeriod('year', 'UTC', span).period.label).toBe('2024');
    expect(defaultPeriod('day', 'UTC', span).period.firstDay).toBe('2025-05-18');
  });

  it('self-consistency: with no data before the partial period, the partial period holding the latest hour is shown', () => {
    const span = { firstMs: ms('2025-05-20T00:00:00Z'), lastMs: ms('2025-05-21T05:00:00Z') };
    const { period, choice } = defaultPeriod('week', 'UTC', span);
    expect([period.firstDay, choice]).toEqual(['2025-05-19', 'latest-partial']);
  });

  it('self-consistency: no data opens on now; an anchor or a custom period is taken as asked', () => {
    const now = ms('2026-12-02T12:00:00Z');
    const none = defaultPeriod('week', 'UTC', null, now);
    expect([none.period.firstDay, none.choice]).toEqual(['2026-11-30', 'now']);
    const span = { firstMs: ms('2025-04-01T00:00:00Z'), lastMs: ms('2025-05-19T16:00:00Z') };
    const asked = periodFor({ range: 'week', anchor: '2025-05-19' }, 'UTC', span, now);
    expect([asked.period.firstDay, asked.choice]).toEqual(['2025-05-19', 'asked']);
    expect(periodFor({ range: 'custom', from: '2025-05-01', to: '2025-05-02' }, 'UTC', span, now).choice).toBe('asked');
    expect(periodFor({ range: 'week' }, 'UTC', span, now).period.firstDay).toBe('2025-05-12');
  });
});

describe('freshness of a site’s figures', () => {
  it('self-consistency: an hour that ended more than a day ago is stale, and the words say how long ago in the site clock', () => {
    const last = ms('2025-12-31T23:00:00Z');
    const f = freshness(last, 'Europe/London', ms('2026-12-02T12:00:00Z'));
    expect(f.stale).toBe(true);
    expect(f.ago).toBe('11 months ago');
    expect(f.text).toBe('Latest data: 11 months ago (hour 2025-12-31 23:00–24:00 (Europe/London)).');
  });

  it('self-consistency: the boundary is one day after the hour ended', () => {
    const last = ms('2026-12-01T10:00:00Z');
    const end = last + HOUR_MS;
    expect(STALE_AFTER_MS).toBe(DAY_MS);
    expect(freshness(last, 'UTC', end + DAY_MS).stale).toBe(false);
    expect(freshness(last, 'UTC', end + DAY_MS + 1).stale).toBe(true);
    expect(freshness(null, 'UTC').stale).toBe(false);
  });
});
