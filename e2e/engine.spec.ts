import { expect, test } from '@playwright/test';
import pg from 'pg';
import { DEMO, letDownValveModel, signIn, watchConsole } from './helpers';

const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4)}`;
const HOUR = 3_600_000;

/**
 * An invented let-down valve: 60 bar(a) and 485 degC in, 2 kg/s, to 5 bar(a) (3.98675 barg with the
 * standard atmosphere). Three hours of tag statistics, the last with the flow swinging +-8 %.
 */
const READINGS: Record<string, number> = { PRV_IN_P: 60, PRV_IN_T: 485, PRV_F: 7.2, PRV_OUT_P: 3.98675 };

async function insertTagHours(siteId: string, firstHour: number) {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/lossline' });
  await client.connect();
  try {
    for (const [tag, mean] of Object.entries(READINGS)) {
      const { rows } = await client.query('select seq from tags where site_id = $1 and name = $2', [siteId, tag]);
      for (let h = 0; h < 3; h++) {
        const swing = tag === 'PRV_F' && h === 2 ? 0.08 : 0.001;
        await client.query(
          `insert into tag_hours (tag_id, hour_start, mean, min, max, std, samples, covered_s)
           values ($1, $2, $3, $4, $5, $6, 60, 3600)`,
          [rows[0].seq, new Date(firstHour + h * HOUR), mean, mean * (1 - swing), mean * (1 + swing), mean * swing * 0.5],
        );
      }
    }
  } finally {
    await client.end();
  }
}

test('an operator opens a unit\'s hourly results and one hour\'s detail', async ({ page }) => {
  const errors = watchConsole(page);
  const firstHour = Math.floor(Date.now() / HOUR) * HOUR - 6 * HOUR;
  const unitName = `PRV ${stamp()}`;

  // An admin sets the unit up from a model file; tag hours arrive; a parameter change queues the engine's job.
  await signIn(page, DEMO.admin);
  const created = await page.request.post('/api/sites/from-model', {
    data: letDownValveModel(`E2E engine site ${stamp()}`, unitName, { inP: 'PRV_IN_P', inT: 'PRV_IN_T', flow: 'PRV_F', outP: 'PRV_OUT_P' }),
  });
  expect(created.status()).toBe(201);
  const siteId = (await created.json()).siteId as string;
  await insertTagHours(siteId, firstHour);
  const units = await (await page.request.get(`/api/sites/${siteId}/units`)).json();
  const unitId = (units.units ?? units).find((u: { name: string }) => u.name === unitName).id as string;
  const patched = await page.request.patch(`/api/sites/${siteId}/units/${unitId}`, { data: { parameters: { minLoad_kg_per_s: 0.2 } } });
  expect(patched.status()).toBe(200);
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page).toHaveURL(/sign-in/);

  // The worker computes the hours.
  await signIn(page, DEMO.operator);
  const from = new Date(firstHour).toISOString();
  const to = new Date(firstHour + 3 * HOUR).toISOString();
  await expect
    .poll(async () => ((await (await page.request.get(`/api/v1/units/${unitId}/hours?from=${from}&to=${to}`)).json()).hours ?? []).length, { timeout: 45_000 })
    .toBe(3);

  // From the navigation to the unit's results.
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Unit results' }).click();
  await page.getByRole('link', { name: unitName }).click();
  await expect(page.getByRole('heading', { level: 1, name: unitName })).toBeVisible();
  const table = page.getByTestId('unit-hours');
  await expect(table.locator('tbody tr')).toHaveCount(3);
  await expect(table.getByText('steady')).toHaveCount(2);
  await expect(table.getByText('unsettled')).toHaveCount(1);
  await expect(page.getByTestId('state-counts')).toHaveText('3 hours: 2 steady, 1 unsettled');
  // The state is told by a word and a shape, not colour alone.
  await expect(table.locator('[data-state="steady"] svg').first()).toBeVisible();

  // One hour opened up, in place: a dialog over the table.
  await table.locator(`tr[data-hour="${from}"]`).getByRole('button', { name: 'Open hour' }).click();
  const detail = page.getByRole('dialog', { name: `${unitName}, hour from` });
  await expect(detail).toBeVisible();
  await expect(detail).toHaveAttribute('data-testid', 'hour-detail');
  await expect(detail.getByText('monitoring aid')).toBeVisible();
  await expect(detail.getByTestId('hour-ports')).toContainText('HP side');
  await expect(detail.getByTestId('hour-ports')).toContainText('from the energy balance');
  await expect(detail.getByTestId('hour-terms')).toContainText('fuel F');
  await expect(detail.getByTestId('hour-balance')).toContainText('none (dissipative unit)');
  await expect(detail.getByTestId('hour-contributors').locator('tbody tr').first()).toBeVisible();
  await expect(detail.getByTestId('hour-tags')).toContainText('PRV_OUT_P');
  await expect(detail.getByTestId('hour-tags')).toContainText('barg');

  // The unsettled hour says why.
  await detail.getByRole('button', { name: 'Close the hour' }).click();
  await expect(detail).toHaveCount(0);
  await table.locator(`tr[data-hour="${new Date(firstHour + 2 * HOUR).toISOString()}"]`).getByRole('button', { name: 'Open hour' }).click();
  await expect(page.getByTestId('hour-reasons')).toContainText('spread too wide');
  await expect(page.getByTestId('hour-reasons')).not.toContainText('SPREAD_HIGH');
  await expect(page.getByTestId('hour-reasons')).toContainText('PRV_F');

  expect(errors).toEqual([]);
});
