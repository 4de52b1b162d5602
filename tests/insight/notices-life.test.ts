/**
 * How a drift notice lives through the drift check, on invented hours built as the baseline's
 * expected value plus r sigma (sigma the spread of the residuals of the fit, as in
 * tests/insight/drift.test.ts): the live headline follows a growing shift while the first figure
 * stays; a shift that has gone fades and a later one opens its own notice; a clearly larger shift is
 * not hidden; escalation mails go exactly once per step; a repair gets its verdict.
 */
import { randomUUID } from 'node:crypto';
import { and, asc, eq, sql } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { QUEUES, SendMailPayload } from '~/jobs';
import { db } from '~/server/db/client';
import { driftNotices, driftSettings, noticeEscalations, unitHours, user } from '~/server/db/schema';
import { sendMail } from '~/server/mail';
import { queue } from '~/server/queue';
import { acceptBaseline, fitDraft } from '~/server/services/baselines';
import { checkDrift } from '~/server/services/drift';
import { SAFETY_CAUTION } from '~/lib/caution';
import { closeNotice, getNotice, listNotices, noticeDetail, noticeSettingsFor, setNoticeSettings } from '~/server/services/notices';
import { createSite, createUnit } from '~/server/services/plant';
import { expectClose } from '../support/expect-close';
import { caughtMail, describeIntegration } from '../support/integration';

// Reference hours and their closed-form fit: see tests/insight/drift.test.ts.
const b = 5000 - 24000 / 1150;
const a = 162500 - b * 12.5;
const s = Math.sqrt((96e6 - 576e6 / 1150) / 22);
const HOUR = 3_600_000;
const t0 = Date.UTC(2025, 3, 7, 0);
const after0 = t0 + 24 * HOUR;
const cF = 30 / 3.6e9; // 30 EUR per MWh of destroyed exergy (invented)
const U_W = 3000; // expanded uncertainty of one hour's destruction (invented)
const LOAD = 12;
const hourOf = (i: number) => new Date(after0 + (i - 1) * HOUR);
let leadId: string;

async function makeUnit(label: string) {
  const site = await createSite({ name: `Life site ${label} ${randomUUID().slice(0, 8)}`, timeZone: 'UTC', T0_K: 298.15, p0_Pa: 101325, currency: 'EUR', prices: [] });
  const unit = await createUnit(site.id, { name: `Exchanger ${label} ${randomUUID().slice(0, 6)}`, kind: 'pump' });
  const rows: (typeof unitHours.$inferInsert)[] = [];
  for (let i = 1; i <= 24; i++) {
    rows.push({ unitId: unit.id, hourStart: new Date(t0 + (i - 1) * HOUR), state: 'steady', load: i, T0_K: 293.15, destruction_W: 100_000 + 5000 * i + (i % 2 ? 2000 : -2000), modelVersion: 'test', inputsHash: `r${i}` });
  }
  await db().insert(unitHours).values(rows);
  const draft = await fitDraft(unit.id, { periodFrom: new Date(t0), periodTo: new Date(after0), terms: ['load'] }, leadId);
  await acceptBaseline(draft.id, leadId);
  // The hand-worked series here are set for k = 0.5, h = 5 (the product default h is 8); 24 reference
  // hours are too few for an AR(1) fit, so the CUSUM input is r / s exactly.
  await db().insert(driftSettings).values({ unitId: unit.id, k: 0.5, h: 5, updatedBy: leadId, updatedAt: new Date() });
  return { siteId: site.id, unitId: unit.id, unitName: unit.name };
}

/** Steady hours from..from+rs.length-1 (1-based, consecutive) with normalised residuals rs. */
async function addHours(unitId: string, from: number, rs: number[]) {
  const rows = rs.map((r, j) => {
    const D = a + b * LOAD + r * s;
    return { unitId, hourStart: hourOf(from + j), state: 'steady' as const, load: LOAD, T0_K: 291, destruction_W: D, destruction_U_W: U_W, destructionCost_per_h: cF * D * 3600, modelVersion: 'test', inputsHash: `p${from + j}` };
  });
  for (let i = 0; i < rows.length; i += 500) await db().insert(unitHours).values(rows.slice(i, i + 500));
}
const check = (u: { siteId: string; unitId: string }, fromHour = 1) => checkDrift({ siteId: u.siteId, fromMs: hourOf(fromHour).getTime(), toMs: hourOf(2000).getTime(), unitIds: [u.unitId] });
const notices = (unitId: string) => db().select().from(driftNotices).where(eq(driftNotices.unitId, unitId)).orderBy(asc(driftNotices.onsetHour));
const range = (n: number, f: (i: number) => number, from = 1) => Array.from({ length: n }, (_, j) => f(from + j));

/** Combined k = 2 uncertainty of the mean of n hours: statistical 2 sigma / sqrt(n) and measurement U / sqrt(n). */
const Umean = (n: number) => Math.sqrt((2 * s) ** 2 + U_W ** 2) / Math.sqrt(n);

async function mailQueueDrained(timeoutMs = 15_000) {
  const t = Date.now();
  for (;;) {
    const r = await db().execute<{ n: number }>(sql`select count(*)::int as n from pgboss.job where name = ${QUEUES.sendMail} and state in ('created', 'retry', 'active')`);
    if (r.rows[0]!.n === 0) return;
    if (Date.now() - t > timeoutMs) throw new Error('send-mail jobs still waiting');
    await new Promise((res) => setTimeout(res, 200));
  }
}

describeIntegration('drift notices that live: headline, fading, larger shifts, escalation, repairs', () => {
  beforeAll(async () => {
    const [lead] = await db().select().from(user).where(eq(user.email, 'lead@demo.lossline.test'));
    leadId = lead!.id;
    const boss = await queue();
    await boss.work(QUEUES.sendMail, { pollingIntervalSeconds: 0.5 }, async ([job]) => {
      await sendMail(SendMailPayload.parse(job!.data));
    });
  });

  it('the headline follows a growing shift; the first figure stays in the record', async () => {
    const u = await makeUnit('grow');
    // Hours 1-10 at 2 sigma: C+ = 1.5, 3, 4.5, 6 > 5 with N+ = 4 -> signal at hour 4, onset hour 1.
    await addHours(u.unitId, 1, range(10, () => 2));
    await check(u);
    let [n] = await notices(u.unitId);
    expect(n!.onsetHour.toISOString()).toBe(hourOf(1).toISOString());
    expect(n!.signalHour.toISOString()).toBe(hourOf(4).toISOString());
    expectClose(n!.extra_W, 2 * s, { rtol: 1e-9 });
    expectClose(n!.current_W!, 2 * s, { rtol: 1e-9 });
    // Hours 11-110 grow by 0.02 sigma an hour: r_i = 2 + 0.02 (i - 10).
    await addHours(u.unitId, 11, range(100, (i) => 2 + 0.02 * (i - 10), 11));
    await check(u, 11);
    const all = await notices(u.unitId);
    expect(all).toHaveLength(1); // every later signal is about the size of the current figure: absorbed
    n = all[0];
    // First figure unchanged: 2 sigma over hours 1-4.
    expectClose(n!.extra_W, 2 * s, { rtol: 1e-9 });
    expect(n!.hours).toBe(4);
    // Current: mean of hours 87-110 = 2 + 0.02 (98.5 - 10) = 3.77 sigma; U over 24 hours.
    expectClose(n!.current_W!, 3.77 * s, { rtol: 1e-9 });
    expect(n!.currentHours).toBe(24);
    expectClose(n!.currentU_W!, Umean(24), { rtol: 1e-9 });
    expectClose(n!.currentCost_per_day!, cF * 3.77 * s * 86400, { rtol: 1e-9 });
    // Since onset: (10 x 2 + 100 x 2 + 0.02 x 5050) / 110 = 321 / 110 sigma.
    expectClose(n!.sinceOnset_W!, (321 / 110) * s, { rtol: 1e-9 });
    expect(n!.sinceOnsetHours).toBe(110);
    // 3.77 - 2.918 = 0.85 sigma > sqrt(U24^2 + U110^2) = 0.555 sigma: growing.
    expect(n!.trend).toBe('growing');
    expect(n!.currentExceeds).toBe(true);
    expect(n!.figuresHour!.toISOString()).toBe(hourOf(110).toISOString());
    expect(n!.lastSignalHour.getTime()).toBeGreaterThan(hourOf(100).getTime());
    // 3.77 / 2 < 2: no escalation yet.
    expect(n!.escalationStep).toBe(0);

    const view = await getNotice(n!.id);
    expectClose(view.headline_W, 3.77 * s, { rtol: 1e-9 });
    expect(view.life).toBe('live');
    const d = await noticeDetail(n!.id);
    expect(d.caution).toBe(SAFETY_CAUTION);
    expect(d.chart.span).toBe('hour');
    expect(d.chart.points).toHaveLength(110);
    expect(d.chart.events.map((e) => e.label)).toEqual(['onset', 'signal', 'latest signal']);
  });

  it('a shift that has gone fades; a later signal opens a new notice that names the earlier', async () => {
    const u = await makeUnit('fade');
    // Hours 1-6 at 2 sigma (signal at 4, then C+ = 1.5, 3), hours 7-46 at 0 (C+ falls 0.5 an hour to 0 at hour 12),
    // hours 47-56 at 3 sigma: C+ = 2.5, 5, 7.5 -> signal at hour 49, onset 47.
    await addHours(u.unitId, 1, [...range(6, () => 2), ...range(40, () => 0), ...range(10, () => 3)]);
    await check(u);
    await check(u); // a re-run changes nothing
    const [first, second, ...more] = await notices(u.unitId);
    expect(more).toHaveLength(0);
    // First full day after the signal at hour 4: hours 5-28, mean 2 x 2 / 24 = 0.167 sigma, within U(24) = 0.50 sigma: faded at hour 28.
    expect(first!.fadedSince!.toISOString()).toBe(hourOf(28).toISOString());
    expect(first!.lastSignalHour.toISOString()).toBe(hourOf(4).toISOString());
    expect(second!.onsetHour.toISOString()).toBe(hourOf(47).toISOString());
    expect(second!.signalHour.toISOString()).toBe(hourOf(49).toISOString());
    expect(second!.priorNoticeId).toBe(first!.id);
    expect(second!.priorReason).toBe('after-fade');
    expect((await getNotice(first!.id)).life).toBe('faded');
    expect((await getNotice(second!.id)).life).toBe('live');
    // The list puts the larger current cost first among those not closed.
    const list = await listNotices({ unitId: u.unitId });
    expect(list.map((x) => x.id)).toEqual([second!.id, first!.id]);
  });

  it('a later, clearly larger shift opens its own notice and the earlier is superseded', async () => {
    const u = await makeUnit('larger');
    await addHours(u.unitId, 1, [...range(30, () => 1.5), ...range(12, () => 8)]);
    await check(u);
    const [first, second, ...more] = await notices(u.unitId);
    expect(more).toHaveLength(0);
    expect(first!.supersededBy).toBe(second!.id);
    expect(second!.priorNoticeId).toBe(first!.id);
    expect(second!.priorReason).toBe('larger');
    expect((await getNotice(first!.id)).life).toBe('superseded');
    // the earlier's first figure stays: 1.5 sigma
    expectClose(first!.extra_W, 1.5 * s, { rtol: 1e-9 });
    // the later one's figures count its own hours only (from its onset): the 12 hours at 8 sigma
    expect(second!.onsetHour.toISOString()).toBe(hourOf(31).toISOString());
    expect(second!.currentHours).toBe(12);
    expectClose(second!.current_W!, 8 * s, { rtol: 1e-9 });
  });

  it('the same fault at another duty stays on its notice; a larger one at that duty opens its own', async () => {
    // A shift in proportion to the expected destruction (as fouling does): 20 % on a light load, then the
    // same 20 % at full load (twice the watts: larger in watts, not in proportion), then 50 % at full load.
    const u = await makeUnit('duty');
    const rows = [...range(36, () => 0.2).map((f) => ({ load: 2, f })), ...range(24, () => 0.2).map((f) => ({ load: 24, f })), ...range(24, () => 0.5).map((f) => ({ load: 24, f }))];
    await db()
      .insert(unitHours)
      .values(
        rows.map(({ load, f }, j) => {
          const D = (a + b * load) * (1 + f);
          return { unitId: u.unitId, hourStart: hourOf(1 + j), state: 'steady' as const, load, T0_K: 291, destruction_W: D, destruction_U_W: U_W, destructionCost_per_h: cF * D * 3600, modelVersion: 'test', inputsHash: `d${j}` };
        }),
      );
    await check(u);
    const [first, second, ...more] = await notices(u.unitId);
    expect(more).toHaveLength(0);
    expect(first!.onsetHour.toISOString()).toBe(hourOf(1).toISOString());
    expect(first!.supersededBy).toBe(second!.id);
    expect(second!.priorReason).toBe('larger');
    expect(second!.onsetHour.getTime()).toBeGreaterThanOrEqual(hourOf(61).getTime());
  });

  it('escalation mails go exactly once per step when the cost per day has doubled since the last mail', async () => {
    const u = await makeUnit('escalate');
    expect((await noticeSettingsFor(u.siteId)).escalationMultiple).toBe(2);
    // Hours 1-10 at 2 sigma opens the notice (mailed cost: mean of hours 1-4 = 2 sigma); then a ramp of 0.02 sigma an hour.
    const r = (i: number) => (i <= 10 ? 2 : 2 + 0.02 * (i - 10));
    await addHours(u.unitId, 1, range(380, r));
    const c = (sig: number) => cF * sig * s * 86400;
    // Checks end at hours 10, 140, 200, 380 (the current figure is the mean of the last 24 hours at the end of each):
    //   140: 2 + 0.02 (140 - 21.5) = 4.37 sigma >= 2 x 2 -> step 1, mailed 4.37 sigma
    //   200: 5.57 sigma < 2 x 4.37: nothing
    //   380: 9.17 sigma >= 8.74 sigma -> step 2
    const upTo = (h: number) => checkDrift({ siteId: u.siteId, fromMs: hourOf(1).getTime(), toMs: hourOf(h).getTime(), unitIds: [u.unitId] });
    await db().delete(unitHours).where(and(eq(unitHours.unitId, u.unitId), sql`${unitHours.hourStart} > ${hourOf(10)}`));
    await upTo(10);
    let [n] = await notices(u.unitId);
    expectClose(n!.mailedCost_per_day!, c(2), { rtol: 1e-9 });
    const steps: [number, number][] = [
      [11, 140],
      [141, 200],
      [201, 380],
    ];
    for (const [from, to] of steps) {
      await addHours(u.unitId, from, range(to - from + 1, r, from));
      await check(u, from);
    }
    // again, and three at once: nothing more
    await Promise.all([check(u), check(u), check(u)]);
    [n] = await notices(u.unitId);
    expect((await notices(u.unitId)).length).toBe(1);
    expect(n!.escalationStep).toBe(2);
    expectClose(n!.mailedCost_per_day!, c(2 + 0.02 * (380 - 21.5)), { rtol: 1e-9 });
    const marks = await db().select().from(noticeEscalations).where(eq(noticeEscalations.noticeId, n!.id));
    const recipients = await db().select({ id: user.id, email: user.email }).from(user).where(and(sql`${user.role} in ('planner', 'energy-lead')`, eq(user.deactivated, false)));
    expect(marks).toHaveLength(2 * recipients.length);
    for (const m of marks.filter((x) => x.step === 1)) expectClose(m.cost_per_day, c(2 + 0.02 * (140 - 21.5)), { rtol: 1e-9 });
    for (const m of marks.filter((x) => x.step === 2)) expectClose(m.cost_per_day, c(2 + 0.02 * (380 - 21.5)), { rtol: 1e-9 });

    await mailQueueDrained();
    await new Promise((res) => setTimeout(res, 800));
    const mine = (await caughtMail()).filter((m) => m.subject.includes(u.unitName));
    const grown = mine.filter((m) => m.subject.startsWith('Drift notice grown'));
    expect(grown.filter((m) => m.to.includes('planner@demo.lossline.test'))).toHaveLength(2);
    expect(grown).toHaveLength(2 * recipients.length);
    expect(mine.filter((m) => m.subject.startsWith('Drift notice:') && m.to.includes('planner@demo.lossline.test'))).toHaveLength(1);
    for (const m of grown) {
      expect(m.text).toContain('not an alarm');
      expect(m.text).toContain('licensed engineers');
      expect(m.text).toContain(`/notices/${n!.id}`);
    }

    // An energy lead raises the site's multiple; the setting answers with it.
    expect((await setNoticeSettings(u.siteId, { escalationMultiple: 3 }, leadId)).escalationMultiple).toBe(3);
  });

  it('repaired and back on the line: the verdict after 72 steady hours, with the avoided cost per month', async () => {
    const u = await makeUnit('repair-ok');
    await addHours(u.unitId, 1, range(30, () => 3));
    await check(u);
    const [n] = await notices(u.unitId);
    const closed = await closeNotice(n!.id, leadId, 'Tube bundle cleaned.', { outcome: 'repaired', repairedAt: hourOf(31).toISOString() });
    expect(closed.closeOutcome).toBe('repaired');
    expect(closed.repairedAt).toBe(hourOf(31).toISOString());
    // After the repair: +-0.5 sigma alternating (mean 0). 71 hours: no verdict yet.
    const after = (i: number) => (i % 2 ? 0.5 : -0.5);
    await addHours(u.unitId, 31, range(71, after, 31));
    await check(u, 31);
    expect((await getNotice(n!.id)).verdict).toBeNull();
    await addHours(u.unitId, 102, range(10, after, 102));
    await check(u, 102);
    const v = (await getNotice(n!.id)).verdict!;
    expect(v.hour).toBe(hourOf(102).toISOString());
    expect(v.back).toBe(true);
    // Before: hours 7-30 at 3 sigma; after: hours 31-102, mean 0; avoided 3 sigma.
    expectClose(v.before_W, 3 * s, { rtol: 1e-9 });
    expect(v.afterHours).toBe(72);
    expect(Math.abs(v.after_W)).toBeLessThan(1e-6);
    expectClose(v.avoided_W, 3 * s, { rtol: 1e-9 });
    expectClose(v.avoidedU_W, Math.sqrt(Umean(24) ** 2 + Umean(72) ** 2), { rtol: 1e-9 });
    // IPMVP avoided cost: c_F x avoided x 86 400 s x 30.4375 days.
    expectClose(v.avoidedCost_per_month!, cF * 3 * s * 86400 * 30.4375, { rtol: 1e-9 });
    expect((await notices(u.unitId)).length).toBe(1);
  });

  it('repaired but the shift is still there: the restarted sums signal, a new notice names the earlier, the verdict says so', async () => {
    const u = await makeUnit('repair-no');
    await addHours(u.unitId, 1, range(30, () => 3));
    await check(u);
    const [n] = await notices(u.unitId);
    await closeNotice(n!.id, leadId, 'Valve seat lapped.', { outcome: 'repaired', repairedAt: hourOf(31).toISOString() });
    await addHours(u.unitId, 31, range(80, () => 3, 31));
    await check(u, 31);
    const all = await notices(u.unitId);
    expect(all).toHaveLength(2);
    const later = all[1]!;
    // The sums restart at the repair date: 2.5, 5, 7.5 -> signal at hour 33, onset hour 31.
    expect(later.onsetHour.toISOString()).toBe(hourOf(31).toISOString());
    expect(later.signalHour.toISOString()).toBe(hourOf(33).toISOString());
    expect(later.priorNoticeId).toBe(n!.id);
    expect(later.priorReason).toBe('after-repair');
    const earlier = await getNotice(n!.id);
    expect(earlier.followUpNoticeId).toBe(later.id);
    expect(earlier.verdict!.back).toBe(false);
    expect(Math.abs(earlier.verdict!.avoided_W)).toBeLessThan(1e-6);
  });

  it('closing keeps the old shape and checks the new fields', async () => {
    const u = await makeUnit('close');
    await addHours(u.unitId, 1, range(10, () => 3));
    await check(u);
    const [n] = await notices(u.unitId);
    const bad = await closeNotice(n!.id, leadId, 'x', { outcome: 'repaired' }).catch((e) => e);
    expect(bad.code).toBe('VALIDATION_FAILED');
    const early = await closeNotice(n!.id, leadId, 'x', { outcome: 'repaired', repairedAt: '2020-01-01' }).catch((e) => e);
    expect(early.message).toMatch(/before the shift began/);
    const c = await closeNotice(n!.id, leadId, 'Accepted: new duty.', { outcome: 'new-normal', newNormalFrom: '2025-04-08' });
    expect(c.closeOutcome).toBe('new-normal');
    expect(c.newNormalFrom).toBe(new Date(Date.UTC(2025, 3, 8)).toISOString());
  });
});
