import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import pg from 'pg';
import { DEMO, nav, signIn, watchConsole } from './helpers';

const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4)}`;

/**
 * An invented site in Asia/Kolkata with a turbine and a let-down valve and 20 days of unit hours in
 * March 2024 (written directly, as the engine would): two idle hours a day, an unsettled hour every
 * 50, efficiency following the load. Returns the ids.
 */
async function inventedSite(name: string) {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/lossline' });
  await client.connect();
  try {
    const site = await client.query<{ id: string }>(`insert into sites (name, time_zone, currency) values ($1, 'Asia/Kolkata', 'INR') returning id`, [name]);
    const siteId = site.rows[0]!.id;
    const unit = async (n: string, kind: string) =>
      (await client.query<{ id: string }>(`insert into plant_units (site_id, name, kind) values ($1, $2, $3) returning id`, [siteId, n, kind])).rows[0]!.id;
    const turbine = await unit('E2E turbine', 'turbine');
    const valve = await unit('E2E let-down valve', 'let-down-valve');
    // 480 hours from 1 March 2024 00:00 local (29 Feb 18:30 UTC).
    await client.query(
      `insert into unit_hours (unit_id, hour_start, state, reasons, load, load_unit, t0_k, fuel_w, product_w, loss_w, destruction_w,
         efficiency, efficiency_u, destruction_u_w, destruction_cost_per_h, model_version, inputs_hash)
       select $1, '2024-02-29T18:30:00Z'::timestamptz + i * interval '1 hour',
         case when i % 24 in (3, 4) then 'idle' when i % 50 = 10 then 'unsettled' else 'steady' end,
         case when i % 24 in (3, 4) then '[{"code":"below-min-load","message":"load under the minimum"}]'::jsonb
              when i % 50 = 10 then '[{"code":"load-swing","message":"load swung within the hour"}]'::jsonb else '[]'::jsonb end,
         l, '-', t0, 4e6 * l, 4e6 * l * e, 0, 4e6 * l * (1 - e), e, 0.012, 4e6 * l * (1 - e) * 0.05, 4e6 * l * (1 - e) * 0.002, 'e2e', md5(i::text)
       from generate_series(0, 479) i,
         lateral (select 0.6 + 0.3 * (0.5 + 0.5 * sin(i / 5.0)) as l, 298 + 5 * sin(i * 2 * pi() / 24) as t0) a,
         lateral (select 0.7 + 0.1 * l - 0.001 * (t0 - 298) + 0.003 * sin(i * 1.3) as e) b`,
      [turbine],
    );
    await client.query(
      `insert into unit_hours (unit_id, hour_start, state, load, load_unit, t0_k, fuel_w, product_w, loss_w, destruction_w,
         destruction_u_w, destruction_cost_per_h, model_version, inputs_hash)
       select $1, '2024-02-29T18:30:00Z'::timestamptz + i * interval '1 hour', 'steady', 0.5, '-', 298, 2e5, 0, 0, 2e5, 1e4, 200, 'e2e', md5(i::text)
       from generate_series(0, 479) i`,
      [valve],
    );
    await client.query(
      `insert into drift_notices (site_id, unit_id, direction, onset_hour, signal_hour, last_signal_hour, hours, extra_w, expected_w, shift_sigma, currency, k, h)
       values ($1, $2, 'up', '2024-03-11T04:30:00Z', '2024-03-11T09:30:00Z', '2024-03-11T09:30:00Z', 5, 40000, 600000, 3.5, 'INR', 0.5, 5)`,
      [siteId, turbine],
    );
    return { siteId, turbine, valve };
  } finally {
    await client.end();
  }
}

test('an energy lead opens a unit’s trend, switches ranges, opens the ledger and downloads the monthly report', async ({ page }) => {
  const errors = watchConsole(page);
  const name = `E2E views site ${stamp()}`;
  const { siteId, turbine } = await inventedSite(name);
  await signIn(page, DEMO['energy-lead']);

  // A baseline on the first week, so the charts have an expected band and name it.
  const fit = await page.request.post(`/api/units/${turbine}/baselines`, {
    data: { periodFrom: '2024-02-29T18:30:00Z', periodTo: '2024-03-07T18:30:00Z', terms: ['load', 'T_amb'] },
  });
  expect(fit.status()).toBe(201);
  const accepted = await page.request.post(`/api/baselines/${(await fit.json()).baseline.id}/accept`, { data: {} });
  expect(accepted.status()).toBe(200);

  // Trends: the site's units, then the turbine, opening on the week of its latest hours.
  await nav(page, 'Trends').click();
  await page.getByTestId(`trend-site-${name}`).getByRole('link', { name: 'E2E turbine' }).click();
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('E2E turbine');
  await expect(page.getByTestId('period-label')).toContainText('Mar 2024');
  await expect(page.getByTestId('chart-efficiency')).toBeVisible();
  // A week without hours: the empty state says so.
  await page.goto(`${page.url().split('?')[0]}?range=week&anchor=2020-01-06`);
  await expect(page.getByTestId('trend-empty')).toBeVisible();

  // A custom period around the notice.
  await page.getByRole('group', { name: 'Range' }).getByRole('button', { name: 'Custom' }).click();
  await page.getByLabel('From (first day)').fill('2024-03-10');
  await page.getByLabel('To (last day)').fill('2024-03-12');
  await page.getByRole('button', { name: 'Show' }).click();
  await expect(page.getByTestId('period-label')).toContainText('10 Mar 2024 – 12 Mar 2024');
  await expect(page.getByTestId('period-label')).toContainText('72 h');
  await expect(page.getByTestId('chart-efficiency')).toBeVisible();
  await expect(page.getByTestId('baseline-name').first()).toContainText(/Baseline v1 \(2024-03-01 to 2024-03-07\)/);
  // Idle hours shaded (two a day) and named in the legend by word and shape; the notice on the axis.
  await expect(page.getByTestId('chart-efficiency').locator('[data-shade="idle"]')).toHaveCount(3);
  await expect(page.locator('[data-legend="idle"]').first()).toContainText('idle');
  await expect(page.getByTestId('chart-efficiency').locator('[data-notice-mark]')).toHaveCount(1);
  await expect(page.getByTestId('state-hours')).toContainText('idle 6 h');
  await expect(page.getByTestId('trend-notices')).toContainText('more destruction than expected');
  // The tooltip gives the figure with its unit and uncertainty.
  const box = (await page.getByTestId('chart-efficiency').boundingBox())!;
  await page.mouse.move(box.x + box.width * 0.45, box.y + box.height * 0.5);
  await expect(page.getByTestId('trend-tooltip')).toContainText(/\d+\.\d % ± 1\.2 %/);

  // Day: the site's local day (Kolkata), 24 hours; then earlier and later; then week.
  await page.getByRole('group', { name: 'Range' }).getByRole('button', { name: 'Day' }).click();
  await expect(page.getByTestId('period-label')).toContainText('Sun 10 Mar 2024 · 24 h · Asia/Kolkata');
  await expect(page.getByTestId('stat-hours')).toContainText('22 h of 24 h');
  await page.getByRole('button', { name: 'Later period' }).click();
  await expect(page.getByTestId('period-label')).toContainText('Mon 11 Mar 2024');
  await page.getByRole('group', { name: 'Range' }).getByRole('button', { name: 'Week' }).click();
  await expect(page.getByTestId('period-label')).toContainText('Week of 11 Mar 2024 · 168 h');
  await page.getByRole('button', { name: 'Earlier period' }).click();
  await expect(page.getByTestId('period-label')).toContainText('Week of 4 Mar 2024');
  await expect(page).toHaveURL(/range=week&anchor=2024-03-04/);
  await page.getByRole('group', { name: 'Range' }).getByRole('button', { name: 'Month' }).click();
  await expect(page.getByTestId('period-label')).toContainText('March 2024 · 744 h');
  await expect(page.getByTestId('chart-scatter')).toBeVisible();

  // The ledger of the site for March: the turbine costs more than the valve.
  await nav(page, 'Loss ledger').click();
  await page.getByLabel('Site').selectOption({ label: name });
  await page.getByRole('group', { name: 'Range' }).getByRole('button', { name: 'Custom' }).click();
  await page.getByLabel('From (first day)').fill('2024-03-01');
  await page.getByLabel('To (last day)').fill('2024-03-31');
  await page.getByRole('button', { name: 'Show' }).click();
  await expect(page.getByTestId('period-label')).toContainText('1 Mar 2024 – 31 Mar 2024');
  const rows = page.getByTestId('ledger-table').locator('tbody tr');
  await expect(rows).toHaveCount(2);
  await expect(rows.nth(0)).toContainText('E2E turbine');
  await expect(rows.nth(1)).toContainText('E2E let-down valve');
  // The valve: 480 steady hours x 200 kW = 96 MWh, U 480 x 10 kW = 4.8 MWh; cost 480 h x 200 INR/h =
  // 96 000 INR, U 4 800 INR.
  await expect(page.getByTestId('ledger-row-E2E let-down valve')).toContainText('96.0 ± 4.8');
  await expect(page.getByTestId('ledger-row-E2E let-down valve')).toContainText(/96\s000 ± 4\s800/);
  await expect(page.getByTestId('flow-picture')).toContainText('Destroyed in E2E turbine');

  // Reports: March 2024 as PDF and CSV.
  await nav(page, 'Reports').click();
  const row = page.getByTestId(`reports-site-${name}`).getByTestId('report-2024-03');
  await expect(row).toContainText('March 2024');
  const [pdf] = await Promise.all([page.waitForEvent('download'), row.getByRole('link', { name: 'PDF' }).click()]);
  expect(pdf.suggestedFilename()).toMatch(/^lossline-report-e2e-views-site-.*-2024-03\.pdf$/);
  const pdfBytes = readFileSync((await pdf.path())!);
  expect(pdfBytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
  const [csv] = await Promise.all([page.waitForEvent('download'), row.getByRole('link', { name: 'CSV' }).click()]);
  expect(csv.suggestedFilename()).toMatch(/-2024-03\.csv$/);
  const text = readFileSync((await csv.path())!, 'utf8');
  expect(text).toContain('E2E turbine');
  expect(text).toContain('monitoring aid');
  expect(siteId).toMatch(/^[0-9a-f-]{36}$/);
  expect(errors).toEqual([]);
});

test('an operator sees trends and the ledger but not the reports', async ({ page }) => {
  await signIn(page, DEMO.operator);
  await expect(nav(page, 'Trends')).toBeVisible();
  await expect(nav(page, 'Loss ledger')).toBeVisible();
  await expect(nav(page, 'Reports')).toHaveCount(0);
  const res = await page.goto('/reports');
  expect(res?.status()).toBe(403);
});
