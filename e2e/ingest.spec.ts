import { expect, test } from '@playwright/test';
import { DEMO, DEMO_SITE, nav, signIn, watchConsole } from './helpers';

const FIX = 'tests/fixtures/ingest-server';

test('an operator uploads a file, reviews the new layout, watches it being read and reads the report', async ({ page }) => {
  const errors = watchConsole(page);
  await signIn(page, DEMO.operator);
  await nav(page, 'Uploads').click();
  await expect(page.getByRole('heading', { name: 'Uploads' })).toBeVisible();
  await page.getByLabel('Site').selectOption({ label: `${DEMO_SITE} (Europe/London)` });

  // A shape this site has not seen yet: tag names unique to this run.
  const run = Date.now().toString(36).toUpperCase();
  const csv = (await import('node:fs')).readFileSync(`${FIX}/shift-a.csv`, 'utf8').replaceAll('HG.', `E2E${run}.`);
  await page.locator('input[type=file]').first().setInputFiles({ name: 'shift-a.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
  await page.getByRole('button', { name: /Upload 1 file/i }).click();

  const row = page.getByTestId('upload-shift-a.csv').first();
  await expect(row).toBeVisible();
  // A first file of a new shape asks the operator to confirm what was detected.
  await expect(row.locator('[data-state="needs your review"]')).toBeVisible({ timeout: 20_000 });
  await row.getByRole('button', { name: 'Review layout' }).click();
  const review = page.getByTestId('layout-review');
  await expect(review.getByLabel('Separator')).toHaveValue(',');
  await expect(review.getByRole('columnheader', { name: `E2E${run}.PT-110 [barg]` })).toBeVisible();
  await review.getByRole('button', { name: 'Save layout and read the file' }).click();

  await expect(row.locator('[data-state="read"]')).toBeVisible({ timeout: 20_000 });
  await expect(row.getByRole('progressbar')).toHaveAttribute('aria-valuenow', '100');
  await row.getByRole('button', { name: 'Report' }).click();
  const report = page.getByTestId('upload-report');
  await expect(report).toContainText('Rows');
  await expect(report).toContainText('150');
  const download = page.waitForEvent('download');
  await report.getByRole('link', { name: /rejected cell/ }).click();
  expect((await download).suggestedFilename()).toContain('rejected-cells');
  expect(errors).toEqual([]);
});

test('a scheduled export posts a file with a site token; its status and tag hours come back over the API', async ({ page, request }) => {
  await signIn(page, DEMO.admin);
  await nav(page, 'API tokens').click();
  await page.getByLabel('Site').selectOption({ label: DEMO_SITE });
  await page.getByLabel('What uses it').fill('nightly export');
  await page.getByRole('button', { name: 'Issue token' }).click();
  const token = (await page.getByTestId('new-token').textContent())!.trim();
  const siteId = await page.getByLabel('Site').inputValue();

  const body = (await import('node:fs')).readFileSync(`${FIX}/shift-b.csv`);
  const anon = await request.post(`/api/v1/sites/${siteId}/files?name=shift-b.csv`, { data: body, headers: { 'content-type': 'text/csv', cookie: '' } });
  expect(anon.status()).toBe(401);
  const posted = await request.post(`/api/v1/sites/${siteId}/files?name=shift-b.csv`, {
    data: body,
    headers: { authorization: `Bearer ${token}`, 'content-type': 'text/csv', cookie: '' },
  });
  expect(posted.status()).toBe(202);
  const { uploadId } = await posted.json();

  let status = '';
  await expect
    .poll(async () => {
      const res = await request.get(`/api/v1/uploads/${uploadId}`, { headers: { authorization: `Bearer ${token}`, cookie: '' } });
      status = (await res.json()).status;
      return status;
    }, { timeout: 20_000 })
    .toBe('done');

  const hours = await request.get(
    `/api/v1/sites/${siteId}/tag-hours?tag=HG.TT-111&from=2026-03-10T00:00:00Z&to=2026-03-11T00:00:00Z`,
    { headers: { authorization: `Bearer ${token}`, cookie: '' } },
  );
  expect(hours.status()).toBe(200);
  const data = await hours.json();
  expect(data.tag.name).toBe('HG.TT-111');
  expect(data.hours.map((h: { hourStart: string }) => h.hourStart)).toContain('2026-03-10T03:00:00.000Z');
});
