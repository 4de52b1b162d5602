import { randomUUID } from 'node:crypto';
import { and, asc, eq, sql } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { QUEUES, SendMailPayload } from '~/jobs';
import { db } from '~/server/db/client';
import { baselines, driftNotices, driftPoints, noticeMails, unitHours, user } from '~/server/db/schema';
import { sendMail } from '~/server/mail';
import { queue } from '~/server/queue';
import { acceptBaseline, fitDraft } from '~/server/services/baselines';
import { checkDrift, driftSettingsFor, setDriftSettings } from '~/server/services/drift';
import { closeNotice, getNotice, mailNoticeOpened } from '~/server/services/notices';
import { createSite, createUnit } from '~/server/services/plant';
import { expectClose } from '../support/expect-close';
import { caughtMail, describeIntegration, waitForMail } from '../support/integration';

/**
 * Reference hours as in tests/insight/baselines.test.ts (closed-form simple linear regression):
 * destruction 100 kW + 5 kW/MW x + (+-2 kW), x = 1..24 MW, so expected(x) = a + b x with
 * b = 5000 - 24000/1150 W/MW, a = 162 500 - 12.5 b W, s = sqrt((96e6 - 576e6/1150)/22) W.
 * Hours after the period are built as expected(x) + r s, so the CUSUM sees exactly r.
 */
const b = 5000 - 24000 / 1150;
const a = 162500 - b * 12.5;
const s = Math.sqrt((96e6 - 576e6 / 1150) / 22);
const HOUR = 3_600_000;
const t0 = Date.UTC(2025, 2, 3, 0);
const after0 = t0 + 24 * HOUR;
/** Price of the unit's destroyed exergy carried by the hours: 30 EUR/MWh = 30 / 3.6e9 EUR/J (invented). */
const cF = 30 / 3.6e9;
/** Expanded uncertainty of one hour's destruction (invented). */
const U_W = 3000;

/**
 * Hand-worked tabular CUSUM, k = 0.5, h = 5 (Page 1954; Montgomery, Introduction to Statistical
 * Quality Control, 6th ed., 9.1.2: C+_i = max(0, x_i - k + C+_{i-1}), C-_i = max(0, -k - x_i + C-_{i-1})):
 *   step  x     C+    N+   C-    N-
 *   1     0     0     0    0     0
 *   2     0.3   0     0    0     0
 *   3    -1     0     0    0.5   1
 *   4     0.2   0     0    0     0
 *   5     2     1.5   1    0     0
 *   6     2     3.0   2
 *   7     2     4.5   3
 *   8     2     6.0   4    -> 6.0 > h = 5: upward signal at step 8, onset step 8 - 4 + 1 = 5,
 *                             shifted mean 0.5 + 6.0/4 = 2.0 s; the sums restart at 0
 *   9     2     1.5   1
 *   10    2     3.0   2
 */
const R = [0, 0.3, -1, 0.2, 2, 2, 2, 2, 2, 2];
const LOAD = 12;

async function makeUnit(label: string) {
  const site = await createSite({ name: `Drift site ${label} ${randomUUID().slice(0, 8)}`, timeZone: 'UTC', T0_K: 298.15, p0_Pa: 101325, currency: 'EUR', prices: [] });
  const unit = await createUnit(site.id, { name: `Turbine ${randomUUID().slice(0, 6)}`, kind: 'pump' });
  const rows: (typeof unitHours.$inferInsert)[] = [];
  for (let i = 1; i <= 24; i++) {
    rows.push({
      unitId: unit.id,
      hourStart: new Date(t0 + (i - 1) * HOUR),
      state: 'steady',
      load: i,
      T0_K: 293.15,
      destruction_W: 100_000 + 5000 * i + (i % 2 ? 2000 : -2000),
      modelVersion: 'test',
      inputsHash: `r${i}`,
    });
  }
  await db().insert(unitHours).values(rows);
  const [lead] = await db().select().from(user).where(eq(user.email, 'lead@demo.lossline.test'));
  const draft = await fitDraft(unit.id, { periodFrom: new Date(t0), periodTo: new Date(after0), terms: ['load'] }, lead!.id);
  expectClose(draft.destruction.stats.s, s, { rtol: 1e-10 });
  await acceptBaseline(draft.id, lead!.id);
  return { siteId: site.id, unitId: unit.id, unitName: unit.name };
}

/** Post-period hours i (1-based) with normalised residuals r; an hour that is not steady in between. */
async function addHours(unitId: string, from: number, rs: number[]) {
  const rows = rs.map((r, j) => {
    const D = a + b * LOAD + r * s;
    return {
      unitId,
      hourStart: new Date(after0 + (from + j - 1) * 2 * HOUR),
      state: 'steady' as const,
      load: LOAD,
      T0_K: 291,
      destruction_W: D,
      destruction_U_W: U_W,
      destructionCost_per_h: cF * D * 3600,
      modelVersion: 'test',
      inputsHash: `p${from + j}`,
    };
  });
  // Odd hours between the steady ones are unsettled and must not count as CUSUM steps.
  const between = rs.map((_, j) => ({
    unitId,
    hourStart: new Date(after0 + ((from + j - 1) * 2 + 1) * HOUR),
    state: 'unsettled' as const,
    load: LOAD,
    T0_K: 291,
    destruction_W: 5e6,
    modelVersion: 'test',
    inputsHash: `u${from + j}`,
  }));
  await db().insert(unitHours).values([...rows, ...between]);
}
const hourOf = (i: number) => new Date(after0 + (i - 1) * 2 * HOUR);

async function points(unitId: string) {
  return db().select().from(driftPoints).where(eq(driftPoints.unitId, unitId)).orderBy(asc(driftPoints.hourStart));
}
async function notices(unitId: string) {
  return db().select().from(driftNotices).where(eq(driftNotices.unitId, unitId)).orderBy(asc(driftNotices.openedAt));
}

/** Waits until no send-mail job is waiting or running, so the catcher holds everything sent. */
async function mailQueueDrained(timeoutMs = 15_000) {
  const t = Date.now();
  for (;;) {
    const r = await db().execute<{ n: number }>(sql`select count(*)::int as n from pgboss.job where name = ${QUEUES.sendMail} and state in ('created', 'retry', 'active')`);
    if (r.rows[0]!.n === 0) return;
    if (Date.now() - t > timeoutMs) throw new Error('send-mail jobs still waiting');
    await new Promise((res) => setTimeout(res, 200));
  }
}

describeIntegration('drift check: CUSUM on residuals through the service, saved state, notices and their mail', () => {
  beforeAll(async () => {
    const boss = await queue();
    await boss.work(QUEUES.sendMail, { pollingIntervalSeconds: 0.5 }, async ([job]) => {
      await sendMail(SendMailPayload.parse(job!.data));
    });
  });

  it('streams from the saved state hour by hour, opens one notice on the hand-worked signal, and re-runs change nothing', async () => {
    const u = await makeUnit('stream');
    // The product defaults (k = 0.5, h = 8, docs/domain.md section 7); this hand-worked case is set to h = 5.
    expect(await driftSettingsFor(u.unitId)).toMatchObject({ k: 0.5, h: 8, isDefault: true });
    const [setter] = await db().select().from(user).where(eq(user.email, 'lead@demo.lossline.test'));
    await setDriftSettings(u.unitId, { k: 0.5, h: 5 }, setter!.id);
    // 24 reference hours give 23 consecutive pairs, too few for an AR(1) fit: phi = 0, so x = r exactly.
    const [bl] = await db().select({ model: baselines.destructionModel }).from(baselines).where(and(eq(baselines.unitId, u.unitId), eq(baselines.status, 'active')));
    expect(bl!.model.stats).toMatchObject({ phi: 0, ar1Pairs: 23 });
    expect(bl!.model.stats.sInnovation).toBe(bl!.model.stats.s);

    // Hours 1-6 first: no signal yet, C+ = 3.0 after step 6.
    await addHours(u.unitId, 1, R.slice(0, 6));
    const first = await checkDrift({ siteId: u.siteId, fromMs: after0, toMs: after0 + 12 * HOUR });
    expect(first).toEqual([{ unitId: u.unitId, outcome: 'checked', hours: 6, signals: 0, opened: [] }]);
    let p = await points(u.unitId);
    expect(p.map((x) => x.step)).toEqual([1, 2, 3, 4, 5, 6]);
    expect(p.map((x) => Number(x.x.toFixed(9)))).toEqual([0, 0.3, -1, 0.2, 2, 2]);
    expect(p.map((x) => Number(x.cPlus.toFixed(9)))).toEqual([0, 0, 0, 0, 1.5, 3]);
    expect(p.map((x) => Number(x.cMinus.toFixed(9)))).toEqual([0, 0, 0.5, 0, 0, 0]);
    expect(p.map((x) => x.nPlus)).toEqual([0, 0, 0, 0, 1, 2]);

    // Hours 7-10 arrive: the check continues from step 6's saved state and signals at step 8.
    await addHours(u.unitId, 7, R.slice(6));
    const second = await checkDrift({ siteId: u.siteId, fromMs: hourOf(7).getTime(), toMs: hourOf(10).getTime() + HOUR, unitIds: [u.unitId] });
    expect(second[0]).toMatchObject({ outcome: 'checked', hours: 4, signals: 1 });
    expect(second[0]!.opened).toHaveLength(1);
    p = await points(u.unitId);
    expect(p.map((x) => x.step)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    // The sums after each step; the one that crossed h is marked, and the next step starts from zero.
    expect(p.map((x) => Number(x.cPlus.toFixed(9)))).toEqual([0, 0, 0, 0, 1.5, 3, 4.5, 6, 1.5, 3]);
    expect(p.map((x) => x.nPlus)).toEqual([0, 0, 0, 0, 1, 2, 3, 4, 1, 2]);
    expect(p.map((x) => x.signal)).toEqual([null, null, null, null, null, null, null, 'up', null, null]);

    const [n] = await notices(u.unitId);
    expect(n!.direction).toBe('up');
    expect(n!.status).toBe('open');
    expect(n!.onsetHour.toISOString()).toBe(hourOf(5).toISOString());
    expect(n!.signalHour.toISOString()).toBe(hourOf(8).toISOString());
    expect(n!.hours).toBe(4);
    // Extra destruction = mean residual of steps 5-8 = 2 s (every one of them is 2 s by construction).
    expectClose(n!.extra_W, 2 * s, { rtol: 1e-9 });
    expectClose(n!.expected_W, a + b * LOAD, { rtol: 1e-12 });
    expectClose(n!.shift_sigma, 2, { rtol: 1e-9 });
    // Cost per day = cF * extra * 86 400 s (SPECO, Cdot_D = c_F Xdot_D), cF from the hours' own cost.
    expectClose(n!.cF_per_J!, cF, { rtol: 1e-12 });
    expectClose(n!.extraCost_per_day!, cF * 2 * s * 86400, { rtol: 1e-9 });
    // Uncertainty of the mean of 4 hours: 3000 W / sqrt(4) = 1500 W, below the shift of about 4167 W.
    expectClose(n!.shiftU_W!, 1500, { rtol: 1e-12 });
    expect(n!.exceedsUncertainty).toBe(true);

    // The same hours again, twice, and the whole range: the same rows and still one notice.
    const before = (await points(u.unitId)).map((x) => [x.step, x.cPlus, x.cMinus, x.residual_W]);
    const again = await checkDrift({ siteId: u.siteId, fromMs: hourOf(7).getTime(), toMs: hourOf(10).getTime() + HOUR });
    expect(again[0]).toMatchObject({ signals: 1, opened: [] });
    await checkDrift({ siteId: u.siteId, fromMs: 0, toMs: hourOf(10).getTime() + HOUR });
    expect((await points(u.unitId)).map((x) => [x.step, x.cPlus, x.cMinus, x.residual_W])).toEqual(before);
    expect(await notices(u.unitId)).toHaveLength(1);

    // An earlier hour changes (hour 5 now as expected, r = 0): recomputed from there on.
    //   step 5: x = 0, C+ = 0; 6: 1.5; 7: 3.0; 8: 4.5; 9: 6.0 > 5, signal (onset step 6); 10: 1.5.
    await db()
      .update(unitHours)
      .set({ destruction_W: a + b * LOAD })
      .where(and(eq(unitHours.unitId, u.unitId), eq(unitHours.hourStart, hourOf(5))));
    const changed = await checkDrift({ siteId: u.siteId, fromMs: hourOf(5).getTime(), toMs: hourOf(5).getTime() + HOUR });
    expect(changed[0]).toMatchObject({ hours: 6, signals: 1, opened: [] });
    p = await points(u.unitId);
    expect(p.map((x) => Number(x.cPlus.toFixed(9)))).toEqual([0, 0, 0, 0, 0, 1.5, 3, 4.5, 6, 1.5]);
    expect(p.map((x) => x.signal)).toEqual([null, null, null, null, null, null, null, null, 'up', null]);
    const still = await notices(u.unitId);
    expect(still).toHaveLength(1);
    // The open notice takes the later signal as its latest one.
    expect(still[0]!.lastSignalHour.toISOString()).toBe(hourOf(9).toISOString());

    // Closed, then the same hours once more: already reported, nothing new opens.
    const [lead] = await db().select().from(user).where(eq(user.email, 'lead@demo.lossline.test'));
    await closeNotice(still[0]!.id, lead!.id, 'Checked the seal; planned for the next stop.');
    await checkDrift({ siteId: u.siteId, fromMs: 0, toMs: hourOf(10).getTime() + HOUR });
    expect(await notices(u.unitId)).toHaveLength(1);

    // The shift goes on after closing: a new signal after the last reported one opens a new notice.
    //   step 10 left C+ = 1.5; steps 11-13 at x = 2: 3.0, 4.5, 6.0 > 5 -> signal at step 13.
    await addHours(u.unitId, 11, [2, 2, 2]);
    const later = await checkDrift({ siteId: u.siteId, fromMs: hourOf(11).getTime(), toMs: hourOf(13).getTime() + HOUR });
    expect(later[0]!.opened).toHaveLength(1);
    const both = await notices(u.unitId);
    expect(both.map((x) => x.status)).toEqual(['closed', 'open']);
    expect(both[1]!.signalHour.toISOString()).toBe(hourOf(13).toISOString());
  });

  it('one mail per notice and person: concurrent checks and a repeated mail call send exactly one', async () => {
    const u = await makeUnit('mail');
    await addHours(u.unitId, 1, R);
    const payload = { siteId: u.siteId, fromMs: after0, toMs: hourOf(10).getTime() + HOUR };
    const runs = await Promise.all([checkDrift(payload), checkDrift(payload), checkDrift(payload)]);
    const opened = runs.flatMap((r) => r.flatMap((x) => x.opened));
    expect(opened).toHaveLength(1);
    expect(await notices(u.unitId)).toHaveLength(1);
    await checkDrift(payload);
    expect(await mailNoticeOpened(opened[0]!)).toEqual([]);

    const recipients = await db()
      .select({ email: user.email })
      .from(user)
      .where(and(sql`${user.role} in ('planner', 'energy-lead')`, eq(user.deactivated, false)));
    const marks = await db().select().from(noticeMails).where(eq(noticeMails.noticeId, opened[0]!));
    expect(marks).toHaveLength(recipients.length);

    const mail = await waitForMail('planner@demo.lossline.test', u.unitName);
    await mailQueueDrained();
    await new Promise((r) => setTimeout(r, 500));
    const mine = (await caughtMail()).filter((m) => m.subject.includes(u.unitName));
    expect(mine.filter((m) => m.to.includes('planner@demo.lossline.test'))).toHaveLength(1);
    expect(mine.filter((m) => m.to.includes('lead@demo.lossline.test'))).toHaveLength(1);
    expect(mine.filter((m) => m.to.includes('operator@demo.lossline.test'))).toHaveLength(0);
    expect(mine).toHaveLength(recipients.length);

    // The mail links the notice page and carries the figures and the caution.
    const n = await getNotice(opened[0]!);
    expect(mail.text).toContain(`${process.env.PUBLIC_BASE_URL}/notices/${n.id}`);
    expect(mail.text).toContain(`Extra destruction: +${(2 * s / 1000).toFixed(1)} kW`);
    expect(mail.text).toContain('Since: 2025-03-04 08:00 (UTC)');
    expect(mail.text).toContain('not an alarm');
    expect(mail.text).toContain('licensed engineers');
  });

  it('a notice of less destruction is mailed to the energy leads only: no maintenance work, the baseline is the lead\'s to judge', async () => {
    const u = await makeUnit('less');
    // The hand-worked series mirrored: the lower sum C- crosses h at step 8 (a downward signal).
    await addHours(u.unitId, 1, R.map((r) => -r));
    const runs = await checkDrift({ siteId: u.siteId, fromMs: after0, toMs: hourOf(10).getTime() + HOUR });
    const opened = runs.flatMap((x) => x.opened);
    expect(opened).toHaveLength(1);
    const [n] = await notices(u.unitId);
    expect(n!.direction).toBe('down');

    const leads = await db().select({ id: user.id }).from(user).where(and(eq(user.role, 'energy-lead'), eq(user.deactivated, false)));
    const planners = await db().select({ id: user.id }).from(user).where(and(eq(user.role, 'planner'), eq(user.deactivated, false)));
    expect(leads.length).toBeGreaterThan(0);
    expect(planners.length).toBeGreaterThan(0);
    const marks = await db().select({ userId: noticeMails.userId }).from(noticeMails).where(eq(noticeMails.noticeId, opened[0]!));
    expect(marks.map((m) => m.userId).sort()).toEqual(leads.map((l) => l.id).sort());

    await waitForMail('lead@demo.lossline.test', u.unitName);
    await mailQueueDrained();
    await new Promise((r) => setTimeout(r, 500));
    const mine = (await caughtMail()).filter((m) => m.subject.includes(u.unitName));
    expect(mine.filter((m) => m.to.includes('lead@demo.lossline.test'))).toHaveLength(1);
    expect(mine.filter((m) => m.to.includes('planner@demo.lossline.test'))).toHaveLength(0);
  });

  it('new k and h drop the saved state and queue a check of all hours', async () => {
    const u = await makeUnit('settings');
    await addHours(u.unitId, 1, R.slice(0, 6));
    await checkDrift({ siteId: u.siteId, fromMs: after0, toMs: hourOf(6).getTime() + HOUR });
    expect(await points(u.unitId)).toHaveLength(6);
    const [lead] = await db().select().from(user).where(eq(user.email, 'lead@demo.lossline.test'));
    expect(await setDriftSettings(u.unitId, { k: 0.25, h: 4 }, lead!.id)).toMatchObject({ k: 0.25, h: 4, isDefault: false });
    expect(await points(u.unitId)).toHaveLength(0);
    const jobs = await db().execute<{ data: { unitIds: string[] } }>(sql`select data from pgboss.job where name = ${QUEUES.checkDrift} and data->'unitIds' ? ${u.unitId}`);
    expect(jobs.rows.length).toBeGreaterThanOrEqual(1);
    // By hand with k = 0.25, h = 4: C+ = max(0, x - 0.25 + C+): 0, 0.05, 0 (x = -1), 0 (0.2 - 0.25 < 0),
    // 1.75, 3.5; no signal yet.
    await checkDrift({ siteId: u.siteId, fromMs: 0, toMs: hourOf(6).getTime() + HOUR });
    const p = await points(u.unitId);
    expect(p.map((x) => Number(x.cPlus.toFixed(9)))).toEqual([0, 0.05, 0, 0, 1.75, 3.5]);
  });

  it('pre-whitening: a baseline with enough consecutive hours keeps its AR(1), and the CUSUM input is the standardised innovation', async () => {
    // 72 reference hours, destruction 100 kW + 5 kW/MW x with an invented residual of period 6
    // (+2, +2, +2, -2, -2, -2 kW): its lag-one autocorrelation is positive.
    const site = await createSite({ name: `Drift site ar1 ${randomUUID().slice(0, 8)}`, timeZone: 'UTC', T0_K: 298.15, p0_Pa: 101325, currency: 'EUR', prices: [] });
    const unit = await createUnit(site.id, { name: `Pump ${randomUUID().slice(0, 6)}`, kind: 'pump' });
    const ref = Array.from({ length: 72 }, (_, i) => ({
      unitId: unit.id,
      hourStart: new Date(t0 + i * HOUR),
      state: 'steady' as const,
      load: 1 + (i % 24),
      T0_K: 293.15,
      destruction_W: 100_000 + 5000 * (1 + (i % 24)) + (i % 6 < 3 ? 2000 : -2000),
      modelVersion: 'test',
      inputsHash: `a${i}`,
    }));
    await db().insert(unitHours).values(ref);
    const [lead] = await db().select().from(user).where(eq(user.email, 'lead@demo.lossline.test'));
    const draft = await fitDraft(unit.id, { periodFrom: new Date(t0), periodTo: new Date(t0 + 72 * HOUR), terms: ['load'] }, lead!.id);
    await acceptBaseline(draft.id, lead!.id);
    const [bl] = await db().select({ model: baselines.destructionModel }).from(baselines).where(eq(baselines.id, draft.id));
    const st = bl!.model.stats;
    expect(st.ar1Pairs).toBe(71);
    expect(st.phi!).toBeGreaterThan(0.2);
    // Post-period steady hours two hours apart (an unsettled hour between each, as addHours writes them).
    const start = t0 + 72 * HOUR;
    const rs = [1, -0.5, 2, 2, 0.3];
    const post = rs.flatMap((r, j) => [
      { unitId: unit.id, hourStart: new Date(start + 2 * j * HOUR), state: 'steady' as const, load: 12, T0_K: 291, destruction_W: predictAt(bl!.model, 12) + r * st.s, modelVersion: 'test', inputsHash: `b${j}` },
      { unitId: unit.id, hourStart: new Date(start + (2 * j + 1) * HOUR), state: 'unsettled' as const, load: 12, T0_K: 291, destruction_W: 5e6, modelVersion: 'test', inputsHash: `c${j}` },
    ]);
    await db().insert(unitHours).values(post);
    await checkDrift({ siteId: site.id, fromMs: start, toMs: start + 10 * HOUR });
    const p = await points(unit.id);
    expect(p).toHaveLength(5);
    // By hand: the first hour has no previous one (stationary spread sigma_e / sqrt(1 - phi^2)); the others
    // are two hours after the previous steady one: prediction phi^2 r_prev, spread sigma_e sqrt((1 - phi^4) / (1 - phi^2)).
    const phi = st.phi!;
    const se = st.sInnovation!;
    const res = p.map((x) => x.residual_W);
    rs.forEach((r, j) => expectClose(res[j]!, r * st.s, { rtol: 1e-6, atol: 1e-6 }));
    expectClose(p[0]!.x, res[0]! / (se / Math.sqrt(1 - phi * phi)), { rtol: 1e-9 });
    for (let j = 1; j < 5; j++) {
      expectClose(p[j]!.x, (res[j]! - phi * phi * res[j - 1]!) / (se * Math.sqrt((1 - phi ** 4) / (1 - phi * phi))), { rtol: 1e-9, label: `hour ${j}` });
    }
  });
});

function predictAt(model: { coefficients: { intercept: number; load?: number } }, load: number): number {
  return model.coefficients.intercept + (model.coefficients.load ?? 0) * load;
}
