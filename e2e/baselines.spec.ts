import { expect, test, type Page } from '@playwright/test';
import pg from 'pg';
import { DEMO, signIn, watchConsole } from './helpers';

const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4)}`;
const HOUR = 3_600_000;

/**
 * Invented unit hours, as the engine writes them: 72 steady hours from 2025-04-01 00:00 UTC with
 * load 5-11 MW and T0 285-291 K varying independently, destruction about 200 kW + 8 kW/MW + 1 kW/K
 * with a small alternating scatter, and a few unsettled hours that the fit must leave out.
 */
async function insertHours(unitId: string) {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/lossline' });
  await client.connect();
  try {
    const t0 = Date.UTC(2025, 3, 1, 0);
    for (let i = 0; i < 72; i++) {
      const load = 5 + (i % 7);
      const T0 = 285 + (i % 5) * 1.5;
      const D = 200e3 + 8e3 * load + 1e3 * (T0 - 285) + (i % 2 ? 1500 : -1500) + (i % 3) * 400;
      const state = i % 17 === 16 ? 'unsettled' : 'steady';
      await client.query(
        `insert into unit_hours (unit_id, hour_start, state, load, load_unit, t0_k, destruction_w, efficiency, destruction_u_w, model_version, inputs_hash)
         values ($1, $2, $3, $4, 'MW', $5, $6, $7, 6000, 'e2e', $8)`,
        [unitId, new Date(t0 + i * HOUR), state, load, T0, state === 'steady' ? D : 9e6, 0.85 - 0.004 * load + (i % 2 ? 0.002 : -0.002), `e2e-${i}`],
      );
    }
  } finally {
    await client.end();
  }
}

async function adminCreatesUnit(page: Page, siteName: string, unitName: string): Promise<string> {
  await signIn(page, DEMO.admin);
  const site = await page.request.post('/api/sites', { data: { name: siteName, timeZone: 'UTC' } });
  expect(site.status()).toBe(201);
  const siteId = (await site.json()).site.id;
  const unit = await page.request.post(`/api/sites/${siteId}/units`, { data: { name: unitName, kind: 'pump' } });
  expect(unit.status()).toBe(201);
  return (await unit.json()).unit.id;
}

test('an energy lead builds a baseline from a reference period, reads it against Guideline 14 and accepts it', async ({ browser }) => {
  test.setTimeout(150_000); // three sign-ins, a fit and four page loads: over a minute on a loaded machine
  const unitName = `Boiler feed pump ${stamp()}`;
  const admin = await browser.newPage();
  const unitId = await adminCreatesUnit(admin, `E2E baseline site ${stamp()}`, unitName);
  await admin.close();
  await insertHours(unitId);

  const page = await browser.newPage();
  const errors = watchConsole(page);
  await signIn(page, DEMO['energy-lead']);
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Baselines' }).click();
  await expect(page.getByTestId(`baseline-unit-${unitName}`)).toContainText('none yet');
  await page.getByTestId(`baseline-unit-${unitName}`).getByRole('link', { name: 'Fit a new version' }).click();

  // The builder proposes the unit's whole span; the lead keeps the first two days as reference.
  await expect(page.getByTestId('hour-span')).toContainText('72 computed hours from 2025-04-01 to 2025-04-03, 68 of them steady');
  await expect(page.getByLabel(/First day/)).toHaveValue('2025-04-01');
  await page.getByLabel('Last day').fill('2025-04-02');
  await page.getByRole('button', { name: 'Linear: load and ambient temperature' }).click();
  await expect(page.getByLabel('ambient temperature', { exact: true })).toBeChecked();
  await expect(page.getByLabel('load²')).not.toBeChecked();
  await page.getByRole('button', { name: 'Fit baseline' }).click();

  const detail = page.getByTestId('baseline-detail');
  await expect(detail).toContainText(`${unitName} · version 1`);
  await expect(detail.getByTestId('baseline-status')).toContainText('draft');
  // Hours 0-47 of which 16, 33 are unsettled (i % 17 = 16): 46 steady hours fitted.
  await expect(detail.getByTestId('stats-destruction').locator('td').nth(1)).toHaveText('46');
  await expect(detail.getByTestId('stats-destruction')).toContainText('meets');
  await expect(detail.getByTestId('stats-efficiency')).toContainText('meets');
  await expect(detail.getByTestId('fit-chart').locator('.recharts-scatter-symbol').first()).toBeVisible();

  await detail.getByRole('button', { name: 'Accept as active baseline' }).click();
  await expect(detail.getByRole('status')).toContainText(`Version 1 is now the active baseline of ${unitName}`);
  await expect(detail.getByTestId('baseline-status')).toContainText('active');
  await expect(detail.getByRole('button', { name: 'Accept as active baseline' })).toHaveCount(0);

  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Baselines' }).click();
  const row = page.getByTestId(`baseline-unit-${unitName}`);
  await expect(row).toContainText('active v1');
  await expect(row).toContainText('2025-04-01 to 2025-04-02 (UTC)');
  // 46 steady hours "meet" Guideline 14, but the list says the fit is not to be trusted yet.
  await expect(row.getByTestId('fit-untrusted')).toHaveText('not to be trusted yet: Fitted on only 46 steady hours, less than a week');
  await row.getByRole('link', { name: 'active v1' }).click();
  await expect(page.getByRole('heading', { level: 1 })).toContainText('Baseline v1 (2025-04-01 to 2025-04-02)');
  await expect(page.getByLabel('Allowance k [σ]')).toHaveValue('0.5');
  await expect(page.getByLabel('Decision limit h [σ]')).toHaveValue('8');
  expect(errors).toEqual([]);
  await page.close();

  // An operator reads the list but is not offered the builder, and the API refuses a fit.
  const op = await browser.newPage();
  await signIn(op, DEMO.operator);
  await op.goto('/baselines');
  await expect(op.getByTestId(`baseline-unit-${unitName}`)).toContainText('active v1');
  await expect(op.getByRole('link', { name: 'Build a baseline' })).toHaveCount(0);
  const refused = await op.request.post(`/api/units/${unitId}/baselines`, { data: { periodFrom: '2025-04-01T00:00:00Z', periodTo: '2025-04-02T00:00:00Z', terms: ['load'] } });
  expect(refused.status()).toBe(403);
  await op.close();
});
