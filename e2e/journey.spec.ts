import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { generateExports } from '../scripts/demo/generate';
import { DEMO, nav, signIn, watchConsole } from './helpers';

/**
 * The whole chain in one journey: an admin sets up a site from a plant model file, an operator
 * uploads a day of that (invented) plant's historian export, confirms the new layout, and the unit
 * results appear once the worker has read the file and the engine has balanced its hours.
 */
test('an operator uploads a day of exports and sees the unit results appear', async ({ page, browser }) => {
  const admin = await browser.newPage();
  await signIn(admin, DEMO.admin);
  const model = JSON.parse(readFileSync('scripts/demo/harrowgate.model.json', 'utf8'));
  const name = `Journey site ${Date.now().toString(36)}`;
  model.site.name = name;
  const created = await admin.request.post('/api/sites/from-model', { data: model });
  expect(created.status()).toBe(201);
  const { siteId } = (await created.json()) as { siteId: string };
  await admin.close();

  // One day of the invented plant's one-minute export (the demo generator, its own seed).
  const file = generateExports({ start: '2025-03-04', days: 1, seed: 11 }).next().value!;
  expect(file.rows).toBe(1440);

  const errors = watchConsole(page);
  await signIn(page, DEMO.operator);
  await nav(page, 'Uploads').click();
  await page.getByLabel('Site').selectOption({ label: `${name} (Europe/London)` });
  await page.locator('input[type=file]').first().setInputFiles({ name: file.name, mimeType: 'text/csv', buffer: Buffer.from(file.text) });
  await page.getByRole('button', { name: /Upload 1 file/i }).click();
  const row = page.getByTestId(`upload-${file.name}`);
  await expect(row.locator('[data-state="needs your review"]')).toBeVisible({ timeout: 30_000 });
  await row.getByRole('button', { name: 'Review layout' }).click();
  await page.getByTestId('layout-review').getByRole('button', { name: 'Save layout and read the file' }).click();
  await expect(row.locator('[data-state="read"]')).toBeVisible({ timeout: 30_000 });

  // The engine balances the hours the file brought; the turbine's results page shows them.
  await nav(page, 'Unit results').click();
  await page.locator(`section[data-site="${siteId}"]`).getByRole('link', { name: 'TG1', exact: true }).click();
  await expect(async () => {
    await page.reload();
    await expect(page.getByTestId('unit-hours')).toBeVisible({ timeout: 3_000 });
  }).toPass({ timeout: 90_000 });
  await expect(page.getByTestId('state-counts')).toContainText(/\d+ hours:/);
  await expect(page.getByTestId('unit-hours').locator('tbody tr').first()).toContainText('2025-03-0');
  expect(errors).toEqual([]);
});
