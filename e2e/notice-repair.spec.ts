import { expect, test } from '@playwright/test';
import pg from 'pg';
import PgBoss from 'pg-boss';
import { DEMO, inboxUrl, signIn, watchConsole } from './helpers';

/**
 * A maintenance planner's journey with a drift notice: the notice's mail in the catcher's inbox, its
 * page from the mail's link, closed as repaired with the date of the work, and later, once the drift
 * check has run over the steady hours after the repair (supplied here as the engine would write them),
 * the verdict on the same page. Invented hours, as in e2e/notices.spec.ts.
 */
const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4)}`;
const HOUR = 3_600_000;
const t0 = Date.UTC(2025, 5, 2, 0);
/** The repair: 2025-06-04 in Berlin (UTC+2) starts at 2025-06-03 22:00 UTC; the hours after it start 2025-06-04 00:00 UTC. */
const REPAIR_DAY = '2025-06-04';
const after0 = Date.UTC(2025, 5, 4, 0);
const dbUrl = () => process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/lossline';
const cF = 40 / 3.6e9;

/** 30 reference hours (load 4-9 MW, 150 kW + 6 kW/MW +- 1 kW), then 12 hours 25 kW above the line at 6 MW. */
async function insertHours(unitId: string, rows: { ms: number; load: number; D: number }[], tag: string) {
  const client = new pg.Client({ connectionString: dbUrl() });
  await client.connect();
  try {
    for (const [i, r] of rows.entries()) {
      await client.query(
        `insert into unit_hours (unit_id, hour_start, state, load, load_unit, t0_k, destruction_w, destruction_u_w, destruction_cost_per_h, model_version, inputs_hash)
         values ($1, $2, 'steady', $3, 'MW', 293.15, $4, 8000, $5, 'e2e', $6)`,
        [unitId, new Date(r.ms), r.load, r.D, cF * r.D * 3600, `${tag}-${i}`],
      );
    }
  } finally {
    await client.end();
  }
}

interface Caught {
  to: string[];
  subject: string;
  text: string;
}

test('a planner opens a notice from its mail, closes it as repaired, and later sees the verdict', async ({ browser, request }) => {
  test.setTimeout(240_000);
  const unitName = `Hot-water heater ${stamp()}`;
  const admin = await browser.newPage();
  await signIn(admin, DEMO.admin);
  const site = await admin.request.post('/api/sites', { data: { name: `E2E repair site ${stamp()}`, timeZone: 'Europe/Berlin' } });
  expect(site.status()).toBe(201);
  const siteId = (await site.json()).site.id;
  const unit = await admin.request.post(`/api/sites/${siteId}/units`, { data: { name: unitName, kind: 'pump' } });
  const unitId = (await unit.json()).unit.id;
  await admin.close();
  await insertHours(
    unitId,
    Array.from({ length: 42 }, (_, i) => {
      const load = i < 30 ? 4 + (i % 6) : 6;
      return { ms: t0 + i * HOUR, load, D: 150e3 + 6e3 * load + (i % 2 ? 1000 : -1000) + (i >= 30 ? 25e3 : 0) };
    }),
    'before',
  );

  const lead = await browser.newPage();
  await signIn(lead, DEMO['energy-lead']);
  const fit = await lead.request.post(`/api/units/${unitId}/baselines`, {
    data: { periodFrom: new Date(t0).toISOString(), periodTo: new Date(t0 + 30 * HOUR).toISOString(), terms: ['load'] },
  });
  const baselineId = (await fit.json()).baseline.id;
  expect((await lead.request.post(`/api/baselines/${baselineId}/accept`, { data: {} })).status()).toBe(200);
  await lead.close();

  // The notice's mail in the catcher's inbox.
  const mails = async () => ((await (await request.get(`${inboxUrl()}/api/messages`)).json()) as Caught[]).filter((m) => m.to.includes(DEMO.planner) && m.subject.includes(unitName));
  await expect.poll(async () => (await mails()).length, { timeout: 60_000 }).toBe(1);
  const [mail] = await mails();
  expect(mail!.text).toContain('not an alarm');
  const link = /(https?:\/\/\S+\/notices\/[0-9a-f-]{36})/.exec(mail!.text)![1]!;

  const page = await browser.newPage();
  const errors = watchConsole(page);
  await page.goto(link);
  await page.getByLabel('E-mail').fill(DEMO.planner);
  await page.getByLabel('Password').fill('lossline-demo-1');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(link);
  await expect(page.getByTestId('fig-extra')).toHaveText(/^\+2[45]\.\d kW$/);
  await expect(page.getByTestId('fig-extra-u')).toContainText('±');
  await expect(page.getByTestId('notice-caution')).toContainText('licensed engineers');
  // The unit runs on the product defaults (allowance 0.5 σ, decision limit 8 σ; docs/domain.md section 7).
  await expect(page.getByTestId('chart-key')).toContainText('decision limit h = 8 σ');

  // Close as repaired, with the date of the work.
  await expect(page.locator('astro-island[ssr]')).toHaveCount(0);
  await page.getByLabel('repaired', { exact: true }).check();
  await page.getByLabel(/Date of the repair work/).fill(REPAIR_DAY);
  await page.getByLabel('Why it can be closed (required)').fill('Tube bundle pulled and cleaned at the weekend stop.');
  await page.getByRole('button', { name: 'Close notice' }).click();
  await page.getByRole('dialog').getByRole('button', { name: 'Close the notice' }).click();
  await expect(page.getByTestId('notice-status')).toContainText('closed');
  await expect(page.getByTestId('notice-history')).toContainText('repaired, work done 2025-06-04');
  await expect(page.getByTestId('verdict-waiting')).toBeVisible();

  // Later: the engine has written 80 steady hours after the repair, back on the line, and sends the drift check.
  await insertHours(
    unitId,
    Array.from({ length: 80 }, (_, i) => ({ ms: after0 + i * HOUR, load: 6, D: 150e3 + 36e3 + (i % 2 ? 1000 : -1000) })),
    'after',
  );
  const boss = new PgBoss({ connectionString: dbUrl() });
  boss.on('error', () => undefined);
  await boss.start();
  await boss.send('check-drift', { siteId, fromMs: after0, toMs: after0 + 80 * HOUR, unitIds: [unitId] });
  await boss.stop({ graceful: true, wait: false });

  await expect
    .poll(
      async () => {
        await page.reload();
        return (await page.getByTestId('verdict-word').count()) > 0;
      },
      { timeout: 90_000, intervals: [2000] },
    )
    .toBe(true);
  await expect(page.getByTestId('verdict-word')).toHaveText('Back within the expected band');
  await expect(page.getByTestId('verdict-avoided')).toContainText('EUR');
  await expect(page.getByTestId('notice-caution')).toContainText('not an alarm');
  expect(errors).toEqual([]);
  // Still one mail about this notice.
  expect(await mails()).toHaveLength(1);
});
