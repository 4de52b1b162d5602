/**
 * The unit-rules check on a real database (src/server/services/unit-rules.ts): a let-down valve
 * declared normally idle while its turbine runs, invented hours, one notice of kind 'idle', its mails
 * queued once per person however often the check runs, closed only by a person; and a limit notice.
 */
import { randomUUID } from 'node:crypto';
import { and, eq, sql } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { QUEUES, SendMailPayload } from '~/jobs';
import { db } from '~/server/db/client';
import { driftNotices, noticeMails, unitHours, user } from '~/server/db/schema';
import { sendMail } from '~/server/mail';
import { queue } from '~/server/queue';
import { closeNotice, getNotice, listNotices, noticeDetail } from '~/server/services/notices';
import { createSite, createUnit, updateUnit } from '~/server/services/plant';
import { checkUnitRules, setUnitLimits, unitLimitsFor } from '~/server/services/unit-rules';
import { expectClose } from '../support/expect-close';
import { describeIntegration, waitForMail } from '../support/integration';

const HOUR = 3_600_000;
const t0 = Date.UTC(2025, 9, 6, 0); // Monday
let leadId: string;

type Hour = typeof unitHours.$inferInsert;
const hour = (unitId: string, i: number, state: Hour['state'], extra: Partial<Hour> = {}): Hour => ({
  unitId,
  hourStart: new Date(t0 + i * HOUR),
  state,
  modelVersion: 't',
  inputsHash: `${unitId}-${i}`,
  ...extra,
});

async function plant(label: string) {
  const site = await createSite({ name: `Rules site ${label} ${randomUUID().slice(0, 8)}`, timeZone: 'UTC', T0_K: 298.15, p0_Pa: 101325, currency: 'EUR', prices: [] });
  const tg = await createUnit(site.id, { name: 'TG', kind: 'turbine' });
  const prv = await createUnit(site.id, { name: 'PRV', kind: 'let-down-valve' });
  await updateUnit(site.id, prv.id, { normallyIdle: { when: 'always', whileRunning: ['TG'] } });
  return { siteId: site.id, siteName: site.name, tgId: tg.id, prvId: prv.id };
}

async function recipients(): Promise<number> {
  const r = await db().select({ n: sql<number>`count(*)::int` }).from(user).where(and(sql`${user.role} in ('planner', 'energy-lead')`, eq(user.deactivated, false)));
  return r[0]!.n;
}

async function mailJobs(noticeId: string): Promise<number> {
  const r = await db().execute(sql`select count(*)::int as n from pgboss.job where name = ${QUEUES.sendMail} and data->>'text' like ${'%' + noticeId + '%'}`);
  return (r.rows[0] as { n: number }).n;
}

describeIntegration('unit rules: a unit that should be idle, a limit', () => {
  beforeAll(async () => {
    const [lead] = await db().select().from(user).where(eq(user.email, 'lead@demo.lossline.test'));
    leadId = lead!.id;
    const boss = await queue();
    await boss.work(QUEUES.sendMail, { pollingIntervalSeconds: 0.5 }, async ([job]) => {
      await sendMail(SendMailPayload.parse(job!.data));
    });
  });

  it('opens one idle notice with its cost per day, mails each person once, and a re-run changes nothing', async () => {
    const p = await plant('idle');
    const rows: Hour[] = [];
    // TG runs hours 0-23 except hour 15 (stopped); PRV runs 5-12 (8 h, 200 kW, 10 EUR/h) and 14-16
    for (let i = 0; i < 24; i++) rows.push(hour(p.tgId, i, i === 15 ? 'idle' : 'steady', { destruction_W: 1e6, destructionCost_per_h: 50 }));
    for (let i = 0; i < 24; i++) {
      const on = (i >= 5 && i <= 12) || (i >= 14 && i <= 16);
      rows.push(hour(p.prvId, i, on ? (i === 7 ? 'unsettled' : 'steady') : 'idle', on ? { destruction_W: 150_000 + (i % 2) * 100_000, destructionCost_per_h: 10 } : {}));
    }
    await db().insert(unitHours).values(rows);

    const first = await checkUnitRules({ siteId: p.siteId, fromMs: t0, toMs: t0 + 24 * HOUR });
    const opened = first.flatMap((c) => c.opened);
    expect(opened).toHaveLength(1);
    const n = await getNotice(opened[0]!);
    expect([n.kind, n.kindWord, n.unitId, n.status, n.direction]).toEqual(['idle', 'running while idle', p.prvId, 'open', 'up']);
    // the run is hours 5-12: 8 hours; signal at the fourth (hour 8); 14-16 is 3 hours, and hour 15 has TG stopped anyway
    expect(n.onsetHour).toBe(new Date(t0 + 5 * HOUR).toISOString());
    expect(n.signalHour).toBe(new Date(t0 + 8 * HOUR).toISOString());
    expect(n.lastSignalHour).toBe(new Date(t0 + 12 * HOUR).toISOString());
    expect(n.hours).toBe(8);
    // destruction alternates 250 and 150 kW over 8 hours: mean 200 kW; 10 EUR/h -> 240 EUR/day
    expectClose(n.extra_W, 200_000, { rtol: 1e-12 });
    expectClose(n.extraCost_per_day!, 240, { rtol: 1e-12 });
    expect(n.ruleText).toBe('normally idle always, while TG runs');
    expect(n.ruleHours).toBe(3);
    const people = await recipients();
    expect(people).toBeGreaterThan(0);
    expect(await db().select().from(noticeMails).where(eq(noticeMails.noticeId, n.id))).toHaveLength(people);
    expect(await mailJobs(n.id)).toBe(people);

    // again over the same hours, and a check sent for the turbine only (the valve waits for it): nothing new
    for (const payload of [{ siteId: p.siteId, fromMs: t0, toMs: t0 + 24 * HOUR }, { siteId: p.siteId, fromMs: t0 + 10 * HOUR, toMs: t0 + 24 * HOUR, unitIds: [p.tgId] }]) {
      const again = await checkUnitRules(payload);
      expect(again.flatMap((c) => c.opened)).toEqual([]);
    }
    expect(await db().select().from(driftNotices).where(eq(driftNotices.unitId, p.prvId))).toHaveLength(1);
    expect(await mailJobs(n.id)).toBe(people);
    expect(await getNotice(n.id)).toEqual(n);

    const mail = await waitForMail('planner@demo.lossline.test', `Running while it should be idle: PRV at ${p.siteName}`);
    expect(mail.text).toContain(`/notices/${n.id}`);
    expect(mail.text).toContain('EUR 240');
    expect(mail.text).toContain('not an alarm');
    expect(mail.text).toContain("site's procedures, local codes and the judgement of licensed engineers");
    expect(mail.text).toContain('stays open until a person closes it');

    // its page shows the caution, speaking of this notice
    const detail = await noticeDetail(n.id);
    expect(detail.caution).toContain('a notice is not an alarm');
    expect(detail.caution).toContain("site's procedures, local codes and the judgement of licensed engineers");

    // the list shows it beside drift notices
    expect((await listNotices({ unitId: p.prvId })).map((x) => x.kind)).toEqual(['idle']);
  });

  it('stays open while the unit keeps running; after a person closes it, only new running opens a new one', async () => {
    const p = await plant('close');
    const run = (from: number, to: number) => {
      const rows: Hour[] = [];
      for (let i = from; i <= to; i++) rows.push(hour(p.tgId, i, 'steady'), hour(p.prvId, i, 'steady', { destruction_W: 100_000, destructionCost_per_h: 4 }));
      return rows;
    };
    await db().insert(unitHours).values(run(0, 5));
    const [id] = (await checkUnitRules({ siteId: p.siteId, fromMs: t0, toMs: t0 + 6 * HOUR })).flatMap((c) => c.opened);
    expect(id).toBeDefined();
    // a day later the valve still runs: the same notice moves on, no second one
    await db().insert(unitHours).values(run(6, 30));
    expect((await checkUnitRules({ siteId: p.siteId, fromMs: t0 + 6 * HOUR, toMs: t0 + 31 * HOUR })).flatMap((c) => c.opened)).toEqual([]);
    const moved = await getNotice(id!);
    expect(moved.status).toBe('open');
    expect(moved.lastSignalHour).toBe(new Date(t0 + 30 * HOUR).toISOString());
    expect(moved.hours).toBe(31);

    await closeNotice(id!, leadId, 'Valve seat lapped.');
    expect((await checkUnitRules({ siteId: p.siteId, fromMs: 0, toMs: t0 + 31 * HOUR })).flatMap((c) => c.opened)).toEqual([]);
    // three more hours running are not more than three; the fourth opens a new notice from hour 31
    await db().insert(unitHours).values(run(31, 33));
    expect((await checkUnitRules({ siteId: p.siteId, fromMs: t0 + 31 * HOUR, toMs: t0 + 34 * HOUR })).flatMap((c) => c.opened)).toEqual([]);
    await db().insert(unitHours).values(run(34, 34));
    const [second] = (await checkUnitRules({ siteId: p.siteId, fromMs: t0 + 34 * HOUR, toMs: t0 + 35 * HOUR })).flatMap((c) => c.opened);
    expect(second).toBeDefined();
    expect((await getNotice(second!)).onsetHour).toBe(new Date(t0 + 31 * HOUR).toISOString());
    expect((await getNotice(id!)).status).toBe('closed');
  });

  it('a limit on the cost of destruction per day opens a limit notice that names the limit; settings are checked', async () => {
    const p = await plant('limit');
    const rows: Hour[] = [];
    // 5 EUR/h = 120 EUR/day, above a 100 EUR/day limit, for 6 steady hours; efficiency 0.8
    for (let i = 0; i < 6; i++) rows.push(hour(p.tgId, i, 'steady', { destruction_W: 400_000, destructionCost_per_h: 5, efficiency: 0.8 }));
    await db().insert(unitHours).values(rows);
    expect((await unitLimitsFor(p.tgId)).maxCost_per_day).toBeNull();
    const bad = await setUnitLimits(p.tgId, { maxCost_per_day: -1, minEfficiency: null, hours: 3 }, leadId).catch((e) => e);
    expect(bad).toBeInstanceOf(Error);
    const limits = await setUnitLimits(p.tgId, { maxCost_per_day: 100, minEfficiency: 0.7, hours: 3 }, leadId);
    expect([limits.maxCost_per_day, limits.minEfficiency, limits.hours, limits.currency]).toEqual([100, 0.7, 3, 'EUR']);
    const opened = (await checkUnitRules({ siteId: p.siteId, fromMs: t0, toMs: t0 + 6 * HOUR })).flatMap((c) => c.opened);
    expect(opened).toHaveLength(1);
    const n = await getNotice(opened[0]!);
    expect([n.kind, n.unitId, n.hours, n.ruleCrossed]).toEqual(['limit', p.tgId, 6, ['cost']]);
    expect(n.ruleText).toBe('cost of destruction above EUR 100 per day');
    expectClose(n.extraCost_per_day!, 120, { rtol: 1e-12 });
    expectClose(n.meanEfficiency!, 0.8, { rtol: 1e-12 });
    expect((await checkUnitRules({ siteId: p.siteId, fromMs: t0, toMs: t0 + 6 * HOUR })).flatMap((c) => c.opened)).toEqual([]);
    await waitForMail('lead@demo.lossline.test', `Limit crossed: TG at ${p.siteName}`);
  });

});
