import { randomInt, randomUUID } from 'node:crypto';
import { asc, eq, sql } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { QUEUES, SendMailPayload } from '~/jobs';
import { SAFETY_CAUTION } from '~/lib/caution';
import { db } from '~/server/db/client';
import { driftNotices, noticeDigests, noticeMails, personSites, sites, unitHours, user } from '~/server/db/schema';
import { siteWallTime } from '~/lib/site-time';
import { sendMail } from '~/server/mail';
import { queue } from '~/server/queue';
import { acceptBaseline, fitDraft } from '~/server/services/baselines';
import { checkDrift } from '~/server/services/drift';
import {
  acknowledgeNotice,
  closeNotice,
  getNotice,
  listNotices,
  noticeDetail,
  noticePreferencesFor,
  sendNoticeDigests,
  setNoticePreferences,
} from '~/server/services/notices';
import { createSite, createUnit } from '~/server/services/plant';
import { expectClose } from '../support/expect-close';
import { caughtMail, describeIntegration, waitForMail } from '../support/integration';

const HOUR = 3_600_000;
const t0 = Date.UTC(2025, 6, 1, 0);
let leadId: string;
let plannerId: string;

/**
 * A unit whose reference hours follow destruction = 100 kW + 5 kW/MW x +- 2 kW (x = 1..24 MW; s as
 * worked in tests/insight/baselines.test.ts), then three steady hours 60 kW above the line: about
 * 29 s each, so the CUSUM (k = 0.5, h = 5) is over h from the first (C+ = 28.5) and signals at the
 * third, when the shift has lasted SUSTAINED_HOURS = 3 hours (C+ = 85.5, N+ = 3, onset the first).
 * The hours carry no cost of their own; the site has a fuel price of 36 EUR/MWh (LHV) and an
 * electricity price of 90 EUR/MWh: a compressor's fuel is electric power (docs/domain.md section 3).
 */
async function unitWithNotice(label: string, extraHourU_W: number | null = 4000, timeZone = 'Europe/Madrid') {
  const site = await createSite({
    name: `Notice site ${label} ${randomUUID().slice(0, 8)}`,
    timeZone,
    T0_K: 298.15,
    p0_Pa: 101325,
    currency: 'EUR',
    prices: [
      { name: 'gas', kind: 'fuel', price_per_MWh: 36, currency: 'EUR' },
      { name: 'grid', kind: 'electricity', price_per_MWh: 90, currency: 'EUR' },
    ],
  });
  const unit = await createUnit(site.id, { name: `Air compressor ${randomUUID().slice(0, 6)}`, kind: 'compressor' });
  const rows: (typeof unitHours.$inferInsert)[] = [];
  for (let i = 1; i <= 24; i++) {
    rows.push({ unitId: unit.id, hourStart: new Date(t0 + (i - 1) * HOUR), state: 'steady', load: i, T0_K: 293.15, destruction_W: 100_000 + 5000 * i + (i % 2 ? 2000 : -2000), modelVersion: 't', inputsHash: `r${i}` });
  }
  const b = 5000 - 24000 / 1150;
  const a = 162500 - b * 12.5;
  for (let j = 0; j < 3; j++) {
    rows.push({ unitId: unit.id, hourStart: new Date(t0 + (30 + j) * HOUR), state: 'steady', load: 10, T0_K: 293.15, destruction_W: a + b * 10 + 60_000, destruction_U_W: extraHourU_W, modelVersion: 't', inputsHash: `drift${j}` });
  }
  await db().insert(unitHours).values(rows);
  const draft = await fitDraft(unit.id, { periodFrom: new Date(t0), periodTo: new Date(t0 + 24 * HOUR), terms: ['load'] }, leadId);
  await acceptBaseline(draft.id, leadId);
  await checkDrift({ siteId: site.id, fromMs: t0, toMs: t0 + 33 * HOUR });
  const opened = await db().select({ id: driftNotices.id }).from(driftNotices).where(eq(driftNotices.unitId, unit.id));
  expect(opened).toHaveLength(1);
  return { siteId: site.id, unitId: unit.id, unitName: unit.name, noticeId: opened[0]!.id };
}

describeIntegration('drift notices: figures, seen and closed, the daily digest', () => {
  beforeAll(async () => {
    const [lead] = await db().select().from(user).where(eq(user.email, 'lead@demo.lossline.test'));
    const [planner] = await db().select().from(user).where(eq(user.email, 'planner@demo.lossline.test'));
    leadId = lead!.id;
    plannerId = planner!.id;
    const boss = await queue();
    await boss.work(QUEUES.sendMail, { pollingIntervalSeconds: 0.5 }, async ([job]) => {
      await sendMail(SendMailPayload.parse(job!.data));
    });
  });

  it('a compressor notice whose hours carry no cost is priced at the electricity price (SPECO: its fuel is power), with the caution and chart rows', async () => {
    const u = await unitWithNotice('cost');
    const n = await getNotice(u.noticeId);
    expect(n.status).toBe('open');
    expect(n.statusWord).toBe('open');
    expect(n.hours).toBe(3);
    // The hour is 60 kW above the fitted line at x = 10 (the line is the baseline itself).
    expectClose(n.extra_W, 60_000, { rtol: 1e-9 });
    // Hand-worked: c_F = 90 EUR/MWh / 3.6e9 J/MWh (electricity, exergy factor 1, docs/domain.md section 2);
    // per day: c_F * 60 000 W * 86 400 s = 0.06 MW * 24 h * 90 EUR/MWh = 129.6 EUR/day (not the gas price).
    expectClose(n.extraCost_per_day!, 129.6, { rtol: 1e-9 });
    expect(n.costBasis).toMatch(/electricity 'grid'/);
    // Three hours, U = 4000 W each: U of their mean 4000 / sqrt(3) = 2309.4 W; the 60 kW shift exceeds it.
    expectClose(n.shiftU_W!, 4000 / Math.sqrt(3), { rtol: 1e-9 });
    expect(n.exceedsUncertainty).toBe(true);
    expect(n.url).toBe(`${process.env.PUBLIC_BASE_URL}/notices/${n.id}`);
    // Period [2025-07-01 00:00Z, 2025-07-02 00:00Z) is 02:00 to 01:59 the next day in Madrid (UTC+2).
    expect(n.baselineLabel).toBe('Baseline v1 (2025-07-01 to 2025-07-02)');
    const d = await noticeDetail(u.noticeId);
    expect(d.caution).toBe(SAFETY_CAUTION);
    expect(d.caution).toMatch(/not an alarm/);
    expect(d.caution).toMatch(/not a protective or control system/);
    expect(d.caution).toMatch(/depend on the instruments/);
    expect(d.caution).toMatch(/site's procedures, local codes and the judgement of licensed engineers/);
    expect(d.series).toHaveLength(3);
    expect(d.series[0]!.residual_W).toBeCloseTo(60_000, 6);
  });

  it('open -> seen -> closed with a comment; no second acknowledgement, no close without a comment; open ones listed first', async () => {
    const u = await unitWithNotice('flow', null);
    expect((await getNotice(u.noticeId)).exceedsUncertainty).toBeNull();
    const other = await unitWithNotice('flow-2');
    await closeNotice(other.noticeId, leadId, 'Filter changed.');

    const seen = await acknowledgeNotice(u.noticeId, plannerId, 'Looking at it');
    expect([seen.status, seen.statusWord, seen.acknowledgedBy, seen.acknowledgeComment]).toEqual(['acknowledged', 'seen', 'Pia Planner', 'Looking at it']);
    const again = await acknowledgeNotice(u.noticeId, plannerId).catch((e) => e);
    expect(again.code).toBe('CONFLICT');
    const empty = await closeNotice(u.noticeId, plannerId, '   ').catch((e) => e);
    expect(empty.code).toBe('VALIDATION_FAILED');

    const list = await listNotices({ limit: 100_000 }); // every notice: other test files leave hundreds
    const rank = (id: string) => list.findIndex((n) => n.id === id);
    expect(rank(u.noticeId)).toBeGreaterThanOrEqual(0);
    expect(rank(u.noticeId)).toBeLessThan(rank(other.noticeId));
    expect(list.slice(0, rank(other.noticeId)).every((n) => n.status !== 'closed')).toBe(true);

    const closed = await closeNotice(u.noticeId, plannerId, 'Intercooler cleaned.');
    expect([closed.status, closed.closedBy, closed.closeComment]).toEqual(['closed', 'Pia Planner', 'Intercooler cleaned.']);
    expect((await closeNotice(u.noticeId, plannerId, 'twice').catch((e) => e)).code).toBe('CONFLICT');
    expect((await listNotices({ status: 'not-closed' })).some((n) => n.id === u.noticeId)).toBe(false);
  });

  it('the daily digest goes once a day, at 06:00 in the zone of the first site, to those who opted in, listing the notices not closed, with the caution', async () => {
    const u = await unitWithNotice('digest');
    await setNoticePreferences(plannerId, { dailyDigest: true });
    await setNoticePreferences(leadId, { dailyDigest: false });
    // The demo planner is on every site: the zone of the first site by name is theirs.
    const prefs = await noticePreferencesFor(plannerId);
    const [firstSite] = await db().select({ name: sites.name, timeZone: sites.timeZone }).from(sites).orderBy(asc(sites.name)).limit(1);
    expect(prefs.timeZone).toBe(firstSite!.timeZone);
    expect(prefs.sendsAt).toContain(`06:00 ${firstSite!.timeZone} time (the zone of ${firstSite!.name}`);
    // An invented day far ahead, so repeated local runs do not meet an earlier digest's marker.
    const dayText = new Date(Date.UTC(2300, 0, 1) + randomInt(0, 300_000) * 86_400_000).toISOString().slice(0, 10);
    const six = siteWallTime(`${dayText}T06:00`, firstSite!.timeZone)!;
    expect(await sendNoticeDigests(new Date(six - HOUR))).not.toContain('planner@demo.lossline.test');
    const first = await sendNoticeDigests(new Date(six));
    expect(first).toContain('planner@demo.lossline.test');
    expect(first).not.toContain('lead@demo.lossline.test');
    expect(await sendNoticeDigests(new Date(six + 3 * HOUR))).toEqual([]);
    const marks = await db().select().from(noticeDigests).where(eq(noticeDigests.day, dayText));
    expect(marks.map((m) => m.userId)).toEqual([plannerId]);

    const mail = await waitForMail('planner@demo.lossline.test', dayText);
    expect(mail.text).toContain(u.unitName);
    expect(mail.text).toContain(`/notices/${u.noticeId}`);
    expect(mail.text).toContain('not an alarm');
    await new Promise((r) => setTimeout(r, 1500));
    expect((await caughtMail()).filter((m) => m.to.includes('planner@demo.lossline.test') && m.subject.includes(dayText))).toHaveLength(1);
    await setNoticePreferences(plannerId, { dailyDigest: false });

    const open = await db().select({ n: sql<number>`count(*)::int` }).from(driftNotices).where(sql`${driftNotices.status} <> 'closed'`);
    expect(mail.subject).toContain(`${open[0]!.n} drift notice`);
  });

  /** A planner narrowed to one site (its zone is theirs), opted in to the digest; removed by the returned function. */
  async function narrowedPlanner(siteId: string, label: string) {
    const id = `${label}-${randomUUID()}`;
    const email = `${id}@example.test`;
    await db().insert(user).values({ id, name: `Planner ${label}`, email, role: 'planner', allSites: false });
    await db().insert(personSites).values({ userId: id, siteId });
    await setNoticePreferences(id, { dailyDigest: true });
    return { id, email, remove: () => db().delete(user).where(eq(user.id, id)) };
  }

  it("a planner of a site in Honolulu gets the digest at 06:00 there, dated by that day, not at 20:00 the evening before", async () => {
    const u = await unitWithNotice('honolulu', 4000, 'Pacific/Honolulu');
    const p = await narrowedPlanner(u.siteId, 'hnl');
    try {
      expect((await noticePreferencesFor(p.id)).sendsAt).toContain('06:00 Pacific/Honolulu time');
      // Pacific/Honolulu is UTC-10 with no summer time (IANA tz database): 06:00 UTC is 20:00 the day
      // before there, 16:00 UTC is 06:00. An invented far day keeps each run's marker fresh.
      const runDay = Date.UTC(2300, 0, 1) + randomInt(0, 300_000) * 86_400_000;
      const day = new Date(runDay).toISOString().slice(0, 10);
      expect(await sendNoticeDigests(new Date(runDay + 6 * HOUR))).not.toContain(p.email);
      expect(await sendNoticeDigests(new Date(runDay + 16 * HOUR))).toContain(p.email);
      const mail = await waitForMail(p.email, day);
      expect(mail.subject).toContain(`(${day} (Pacific/Honolulu))`);
      expect(mail.text).toContain(`not yet closed on ${day} (Pacific/Honolulu):`);
      expect(mail.text).toContain(u.unitName);
    } finally {
      await p.remove();
    }
  });

  it('run every hour across both clock changes in New York, a planner there gets one digest each local day, at 06:00 local', async () => {
    const u = await unitWithNotice('new-york', 4000, 'America/New_York');
    const p = await narrowedPlanner(u.siteId, 'nyc');
    try {
      // 2031 (IANA tz database rules): 9 March 02:00 EST -> 03:00 EDT (a 23-hour day), 2 November
      // 02:00 EDT -> 01:00 EST (a 25-hour day). Every hour on the hour, as the job is scheduled.
      for (const [day, hours, sixUtc] of [
        ['2031-03-09', 23, '2031-03-09T10:00:00Z'],
        ['2031-11-02', 25, '2031-11-02T11:00:00Z'],
      ] as const) {
        const start = siteWallTime(`${day}T00:00`, 'America/New_York')!;
        const sentAt: string[] = [];
        for (let h = 0; h < hours; h++) {
          if ((await sendNoticeDigests(new Date(start + h * HOUR))).includes(p.email)) sentAt.push(new Date(start + h * HOUR).toISOString());
        }
        expect(sentAt, day).toEqual([new Date(sixUtc).toISOString()]);
        await waitForMail(p.email, `(${day} (America/New_York))`);
      }
      await new Promise((r) => setTimeout(r, 1500));
      const theirs = (await caughtMail()).filter((m) => m.to.includes(p.email));
      expect(theirs.map((m) => m.subject.match(/\((\d{4}-\d{2}-\d{2}) \(America\/New_York\)\)/)?.[1]).sort()).toEqual(['2031-03-09', '2031-11-02']);
    } finally {
      await p.remove();
    }
  });

  it('mails a notice only to people who may use its site; the digest lists only their sites', async () => {
    // A planner narrowed to another site (user.all_sites = false, one person_sites row).
    const other = await createSite({ name: `Other site ${randomUUID().slice(0, 8)}`, timeZone: 'UTC', T0_K: 298.15, p0_Pa: 101325, currency: 'EUR', prices: [] });
    const narrowId = `narrow-${randomUUID()}`;
    await db().insert(user).values({ id: narrowId, name: 'Narrowed planner', email: `${narrowId}@example.test`, role: 'planner', allSites: false });
    await db().insert(personSites).values({ userId: narrowId, siteId: other.id });
    try {
      const u = await unitWithNotice('narrowed');
      const mailed = await db().select({ userId: noticeMails.userId }).from(noticeMails).where(eq(noticeMails.noticeId, u.noticeId));
      expect(mailed.map((m) => m.userId)).toContain(plannerId);
      expect(mailed.map((m) => m.userId)).not.toContain(narrowId);
      await setNoticePreferences(narrowId, { dailyDigest: true });
      const sent = await sendNoticeDigests(new Date(Date.UTC(2031, 0, 2, 6))); // 06:00 on the other site (UTC): their digest is due
      // Nothing is open on the narrowed planner's own site: no digest for them.
      expect(sent).not.toContain(`${narrowId}@example.test`);
    } finally {
      await db().delete(user).where(eq(user.id, narrowId));
    }
  });
});
