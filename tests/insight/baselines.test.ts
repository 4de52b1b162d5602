import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { unitHours, user } from '~/server/db/schema';
import { AppError } from '~/server/errors';
import {
  acceptBaseline,
  activeBaseline,
  baselineFitView,
  discardBaseline,
  expectedFor,
  fitDraft,
  unitBaselines,
} from '~/server/services/baselines';
import { createSite, createUnit } from '~/server/services/plant';
import { expectClose } from '../support/expect-close';
import { describeIntegration } from '../support/integration';

/**
 * The worked case (invented hours, computed by hand below, independently of the service):
 * 24 steady reference hours, load x_i = i (i = 1..24, in MW), constant T0 = 293.15 K,
 *   destruction y_i = 100 kW + 5 kW x_i + e_i, e_i = +2 kW for odd i and -2 kW for even i,
 *   efficiency  z_i = 0.80 - 0.002 x_i + f_i,  f_i = +0.001 for odd i and -0.001 for even i.
 * Closed-form simple linear regression (Draper & Smith, Applied Regression Analysis, 3rd ed., 1.2):
 *   xbar = 12.5, Sxx = sum (x - xbar)^2 = n (n^2 - 1) / 12 = 24 * 575 / 12 = 1150.
 *   sum over odd i of x = 144, over even i = 156, so Sxe = 2000 * 144 - 2000 * 156 = -24 000 [W MW],
 *   sum e = 0, See = 24 * (2000)^2 = 96e6 W^2.
 *   slope b = 5000 + Sxe / Sxx = 5000 - 24000/1150 = 4979.1304347826... W per MW
 *   ybar = 100 000 + 5000 * 12.5 = 162 500 W; intercept a = ybar - b xbar = 100 260.8695652... W
 *   SSE = See - Sxe^2 / Sxx = 96e6 - 576e6/1150 = 95 499 130.43... W^2, s = sqrt(SSE / 22)
 *   CV(RMSE) = s / ybar (ASHRAE Guideline 14-2014 with n - p), NMBE = 0 (OLS with an intercept).
 * Efficiency likewise: Sxf = 0.001 * 144 - 0.001 * 156 = -0.012, slope = -0.002 - 0.012/1150,
 *   zbar = 0.80 - 0.002 * 12.5 = 0.775, Sff = 24e-6, SSE_z = 24e-6 - 0.012^2/1150.
 */
const n = 24;
const xbar = 12.5;
const Sxx = 1150;
const b = 5000 - 24000 / 1150;
const a = 162500 - b * xbar;
const s = Math.sqrt((96e6 - 576e6 / 1150) / 22);
const bz = -0.002 - 0.012 / 1150;
const az = 0.775 - bz * xbar;
const sz = Math.sqrt((24e-6 - 0.012 ** 2 / 1150) / 22);

const t0 = Date.UTC(2025, 0, 6, 0);
const HOUR = 3_600_000;
let unitId: string;
let leadId: string;

async function referenceHours(unit: string) {
  const rows: (typeof unitHours.$inferInsert)[] = [];
  for (let i = 1; i <= n; i++) {
    const sign = i % 2 ? 1 : -1;
    rows.push({
      unitId: unit,
      hourStart: new Date(t0 + (i - 1) * HOUR),
      state: 'steady',
      load: i,
      loadUnit: 'MW',
      T0_K: 293.15,
      destruction_W: 100_000 + 5000 * i + sign * 2000,
      efficiency: 0.8 - 0.002 * i + sign * 0.001,
      modelVersion: 'test',
      inputsHash: `h${i}`,
    });
  }
  // An unsettled hour inside the period and steady hours outside it must not enter the fit.
  rows.push({ unitId: unit, hourStart: new Date(t0 + 24 * HOUR), state: 'unsettled', load: 3, T0_K: 293.15, destruction_W: 9e6, efficiency: 0.1, modelVersion: 'test', inputsHash: 'unsettled' });
  rows.push({ unitId: unit, hourStart: new Date(t0 + 25 * HOUR), state: 'steady', load: 3, T0_K: 293.15, destruction_W: 9e6, efficiency: 0.1, modelVersion: 'test', inputsHash: 'after' });
  rows.push({ unitId: unit, hourStart: new Date(t0 - HOUR), state: 'steady', load: 3, T0_K: 293.15, destruction_W: 9e6, efficiency: 0.1, modelVersion: 'test', inputsHash: 'before' });
  await db().insert(unitHours).values(rows);
}

/** The reference period: the 24 steady hours and the unsettled one after them. */
const period = { periodFrom: new Date(t0), periodTo: new Date(t0 + 25 * HOUR) };

describeIntegration('baselines: fit, versions, expected values', () => {
  beforeAll(async () => {
    const site = await createSite({ name: `Baseline site ${randomUUID().slice(0, 8)}`, timeZone: 'UTC', T0_K: 298.15, p0_Pa: 101325, currency: 'EUR', prices: [] });
    const unit = await createUnit(site.id, { name: 'Feed pump 1', kind: 'pump' });
    unitId = unit.id;
    await referenceHours(unitId);
    const [lead] = await db().select().from(user).where(eq(user.email, 'lead@demo.lossline.test'));
    leadId = lead!.id;
  });

  it('closed-form simple linear regression (Draper & Smith 1.2): coefficients, s, CV(RMSE), NMBE of destruction and efficiency', async () => {
    const v1 = await fitDraft(unitId, { ...period, terms: ['load'] }, leadId);
    expect(v1.version).toBe(1);
    expect(v1.status).toBe('draft');
    expect(v1.hours).toBe(24);
    expect(v1.loadUnit).toBe('MW');
    expectClose(v1.destruction.coefficients.load!, b, { rtol: 1e-10 });
    expectClose(v1.destruction.coefficients.intercept, a, { rtol: 1e-10 });
    expectClose(v1.destruction.stats.s, s, { rtol: 1e-10 });
    expectClose(v1.destruction.stats.cvRmse, s / 162500, { rtol: 1e-10 });
    expect(Math.abs(v1.destruction.stats.nmbe)).toBeLessThan(1e-12);
    expect(v1.destruction.guideline14).toMatchObject({ meets: true, cvRmseMax: 0.3, nmbeMax: 0.1 });
    expectClose(v1.efficiency!.coefficients.load!, bz, { rtol: 1e-9 });
    expectClose(v1.efficiency!.coefficients.intercept, az, { rtol: 1e-10 });
    expectClose(v1.efficiency!.stats.s, sz, { rtol: 1e-8 });
    expect(v1.meetsGuideline14).toBe(true);
    expect(v1.createdBy).toBe('Lena Lead');
    expect(v1.label).toBe('Baseline v1 (2025-01-06 to 2025-01-07)');

    const view = await baselineFitView(v1.id);
    expect(view.points).toHaveLength(24);
    expectClose(view.points[9]!.expectedDestruction_W, a + b * 10, { rtol: 1e-12 });
    expect(view.curve[0]!.load).toBe(1);
    expect(view.curve.at(-1)!.load).toBe(24);
  });

  it('refuses a term that does not vary (T0 is constant here) and a period with too few steady hours', async () => {
    const e1 = await fitDraft(unitId, { ...period, terms: ['load', 'T_amb'] }, leadId).catch((e) => e);
    expect(e1).toBeInstanceOf(AppError);
    expect(e1.code).toBe('UNPROCESSABLE');
    expect(e1.message).toMatch(/T_amb/);
    const e2 = await fitDraft(unitId, { periodFrom: new Date(t0), periodTo: new Date(t0 + 10 * HOUR), terms: ['load'] }, leadId).catch((e) => e);
    expect(e2.code).toBe('UNPROCESSABLE');
    expect(e2.message).toMatch(/10 steady hours/);
  });

  it('accepting a draft makes it active and retires the previous one; a discarded draft cannot be accepted', async () => {
    const [v1] = (await unitBaselines(unitId)).filter((x) => x.version === 1);
    await acceptBaseline(v1!.id, leadId);
    expect((await activeBaseline(unitId))!.id).toBe(v1!.id);

    // Three coefficients on 24 hours: under the 10 hours per coefficient of src/lib/analytics/fit-trust.ts
    // (common practice), so the draft is kept and says why, but cannot be accepted.
    const weak = await fitDraft(unitId, { ...period, terms: ['load', 'load^2'] }, leadId);
    expect(weak.version).toBe(2);
    expect(weak.trust).toMatchObject({ acceptable: false, trusted: false, minHours: 30 });
    expect(weak.trust.warnings[0]).toMatch(/Fitted on 24 steady hours for 3 coefficients: at least 30/);
    const refused = await acceptBaseline(weak.id, leadId).catch((e) => e);
    expect(refused.code).toBe('UNPROCESSABLE');
    expect(refused.message).toMatch(/cannot be accepted: Fitted on 24 steady hours/);
    await discardBaseline(weak.id, leadId);
    expect((await activeBaseline(unitId))!.version).toBe(1);

    const v2 = await fitDraft(unitId, { ...period, terms: ['load'] }, leadId);
    // Acceptable (24 >= 2 x 10 and >= 24) but under a week: accepted, with the warning on its page.
    expect(v2.trust.acceptable).toBe(true);
    expect(v2.trust.trusted).toBe(false);
    expect(v2.trust.warnings.join(' ')).toMatch(/only 24 steady hours, less than a week/);
    const accepted = await acceptBaseline(v2.id, leadId);
    expect(accepted.status).toBe('active');
    expect(accepted.decidedBy).toBe('Lena Lead');

    const v3 = await fitDraft(unitId, { ...period, terms: ['load'] }, leadId);
    expect(v3.version).toBe(4);
    const discarded = await discardBaseline(v3.id, leadId);
    expect(discarded.status).toBe('discarded');
    const err = await acceptBaseline(v3.id, leadId).catch((e) => e);
    expect(err.code).toBe('CONFLICT');

    const all = await unitBaselines(unitId);
    expect(all.map((x) => [x.version, x.status])).toEqual([
      [4, 'discarded'],
      [3, 'active'],
      [2, 'discarded'],
      [1, 'retired'],
    ]);
    expect(all.find((x) => x.version === 1)!.retiredAt).not.toBeNull();
  });

  it('expectedFor gives the active baseline and yhat +- 2 s sqrt(1 + 1/n + (x0 - xbar)^2/Sxx) (Draper & Smith 3.1)', async () => {
    // Make the linear version active again, so the closed form applies.
    const v4 = await fitDraft(unitId, { ...period, terms: ['load'] }, leadId);
    await acceptBaseline(v4.id, leadId);
    const out = await expectedFor(unitId, [
      { hourStart: new Date(t0 + 100 * HOUR), load: 20, T0_K: 290 },
      { hourStart: new Date(t0 + 101 * HOUR).toISOString(), load: null, T0_K: 290 },
    ]);
    expect(out.baseline!.version).toBe(5);
    expect(out.baseline!.label).toMatch(/^Baseline v5 /);
    const row = out.rows[0]!;
    expect(row.hourStart).toBe(new Date(t0 + 100 * HOUR).toISOString());
    expectClose(row.destruction_W!.expected, a + b * 20, { rtol: 1e-12 });
    const half = 2 * s * Math.sqrt(1 + 1 / n + (20 - xbar) ** 2 / Sxx);
    expectClose(row.destruction_W!.upper - row.destruction_W!.expected, half, { rtol: 1e-10 });
    expectClose(row.destruction_W!.expected - row.destruction_W!.lower, half, { rtol: 1e-10 });
    expectClose(row.efficiency!.expected, az + bz * 20, { rtol: 1e-10 });
    expect(out.rows[1]).toEqual({ hourStart: new Date(t0 + 101 * HOUR).toISOString(), efficiency: null, destruction_W: null });

    const none = await expectedFor(randomUUID(), [{ hourStart: new Date(t0), load: 1, T0_K: 290 }]);
    expect(none.baseline).toBeNull();
    expect(none.rows[0]!.destruction_W).toBeNull();
  });
});
