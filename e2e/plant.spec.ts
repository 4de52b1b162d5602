import { expect, test, type Page } from '@playwright/test';
import pg from 'pg';
import { DEMO, signIn, watchConsole } from './helpers';

const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4)}`;

/** Tags as ingest creates them when a file first brings them: unlinked, with the export's unit text. */
async function addTags(siteId: string, list: [name: string, unitHint: string][]) {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/lossline' });
  await client.connect();
  try {
    for (const [name, hint] of list) await client.query('insert into tags (site_id, name, unit_hint) values ($1, $2, $3)', [siteId, name, hint]);
  } finally {
    await client.end();
  }
}

async function createSite(page: Page, name: string): Promise<string> {
  const res = await page.request.post('/api/sites', { data: { name, timeZone: 'Europe/Berlin' } });
  expect(res.status()).toBe(201);
  return (await res.json()).site.id;
}

test('an admin builds a let-down valve by hand, links its tags and sees it become complete', async ({ page }) => {
  const errors = watchConsole(page);
  await signIn(page, DEMO.admin);
  const siteId = await createSite(page, `E2E valve site ${stamp()}`);
  await addTags(siteId, [
    ['PRV7_P_IN', 'bar(g)'],
    ['PRV7_T_IN', '°C'],
    ['PRV7_F_IN', 't/h'],
    ['PRV7_P_OUT', 'barg'],
    ['COOLING_TOWER_FAN', 'kW'],
  ]);

  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Plant model' }).click();
  await expect(page.getByText('monitoring aid')).toBeVisible();
  await page.goto(`/plant/${siteId}`);
  await expect(page.getByTestId('unlinked-PRV7_P_IN')).toBeVisible();

  // A unit by hand: no ports yet.
  await page.getByLabel('Unit name').fill('PRV 7');
  await page.getByLabel('Kind').selectOption('let-down-valve');
  await page.getByLabel('with its required ports').uncheck();
  await page.getByRole('button', { name: 'Add unit' }).click();
  await expect(page.getByTestId('unit-PRV 7')).toContainText('2 missing');
  await page.getByRole('link', { name: 'PRV 7' }).click();
  await expect(page.getByTestId('unit-status')).toContainText('Not yet');

  // Its ports: an inlet and an outlet carrying steam.
  await page.getByLabel('Port name').fill('HP in');
  await page.getByLabel('Slot').selectOption('inlet');
  await page.getByLabel('Fluid').selectOption('water');
  await page.getByRole('button', { name: 'Add port' }).click();
  await expect(page.getByTestId('port-HP in')).toBeVisible();
  await page.getByLabel('Port name').fill('LP out');
  await page.getByLabel('Slot').selectOption('outlet');
  await page.getByRole('button', { name: 'Add port' }).click();
  await expect(page.getByTestId('port-LP out')).toBeVisible();
  await expect(page.getByTestId('unit-status')).toContainText('4 missing');

  // Link three tags from the unit's list of what is missing: the engineering unit comes from the export.
  for (const [tag, unit] of [
    ['PRV7_P_IN', 'barg'],
    ['PRV7_T_IN', 'degC'],
    ['PRV7_F_IN', 't/h'],
  ]) {
    await page.getByTestId('missing').getByRole('button', { name: 'Link a tag' }).first().click();
    const form = page.getByRole('form', { name: 'Link a tag' });
    await form.getByLabel('Tag').fill(tag!);
    await expect(form.getByLabel(/Engineering unit/)).toHaveValue(unit!);
    await form.getByRole('button', { name: 'Link tag' }).click();
    await expect(page.getByTestId(`link-${tag}`)).toBeVisible();
  }
  await expect(page.getByTestId('unit-status')).toContainText('1 missing');

  // The last one from the site's list of unlinked tags, in a few clicks.
  await page.getByRole('link', { name: /E2E valve site/ }).click();
  await page.getByLabel('Search tags').fill('out');
  await expect(page.getByTestId('unlinked-COOLING_TOWER_FAN')).toHaveCount(0);
  await page.getByRole('button', { name: 'Link PRV7_P_OUT…' }).click();
  const form = page.getByRole('form', { name: 'Link a tag' });
  await form.getByLabel('Unit', { exact: true }).selectOption({ label: 'PRV 7' });
  await expect(form.getByLabel('Measures')).toHaveValue(/\|pressure$/);
  await form.getByRole('button', { name: 'Link tag' }).click();
  await expect(page.getByRole('status')).toContainText('Linked PRV7_P_OUT as pressure at LP out of PRV 7');
  await expect(page.getByTestId('unit-PRV 7')).toContainText('complete');
  await expect(page.getByTestId('unlinked-PRV7_P_OUT')).toHaveCount(0);

  await page.getByRole('link', { name: 'PRV 7' }).click();
  await expect(page.getByTestId('unit-status')).toContainText('Complete');
  await expect(page.getByTestId('links-table').locator('tbody tr')).toHaveCount(4);
  expect(errors).toEqual([]);
});

test('a maintenance planner sees the plant model read-only', async ({ browser }) => {
  const admin = await browser.newPage();
  await signIn(admin, DEMO.admin);
  const name = `E2E read-only site ${stamp()}`;
  const res = await admin.request.post('/api/sites/from-model', {
    data: {
      format: 'lossline-plant-model',
      version: 1,
      site: { name, timeZone: 'UTC', deadState: { T0_K: 298.15, p0_Pa: 101325 }, currency: 'EUR' },
      units: [
        {
          name: 'Feed pump B',
          kind: 'pump',
          ports: [
            { name: 'suction', slot: 'inlet', fluid: { kind: 'water' } },
            { name: 'discharge', slot: 'outlet', fluid: { kind: 'water' } },
          ],
          links: [{ port: 'suction', quantity: 'pressure', tag: 'FPB_P_SUC', unit: 'barg' }],
        },
      ],
    },
  });
  expect(res.status()).toBe(201);
  const { siteId } = await res.json();
  await admin.close();

  const page = await browser.newPage();
  const errors = watchConsole(page);
  await signIn(page, DEMO.planner);
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Plant model' }).click();
  await expect(page.getByText('You see it read-only')).toBeVisible();
  await expect(page.getByRole('button', { name: 'Create site' })).toHaveCount(0);
  await page.getByRole('link', { name }).click();
  await expect(page.getByTestId('unit-Feed pump B')).toContainText('missing');
  await expect(page.getByRole('button', { name: 'Add unit' })).toHaveCount(0);
  await expect(page.getByLabel('Model file to import')).toHaveCount(0);
  await expect(page.getByRole('link', { name: 'Download model file' })).toBeVisible();
  await expect(page.getByLabel('Name', { exact: true })).toBeDisabled();
  await expect(page.getByRole('button', { name: 'Save site' })).toHaveCount(0);

  await page.getByRole('link', { name: 'Feed pump B' }).click();
  await expect(page.getByTestId('unit-status')).toContainText('Not yet');
  await expect(page.getByTestId('link-FPB_P_SUC')).toBeVisible();
  await expect(page.getByRole('button', { name: /Link a tag/ })).toHaveCount(0);
  await expect(page.getByRole('button', { name: 'Add port' })).toHaveCount(0);
  await expect(page.getByRole('button', { name: 'End' })).toHaveCount(0);
  await expect(page.getByLabel(/Generator efficiency|Drive \(motor\) efficiency/)).toBeDisabled();

  // The API refuses the planner's writes, whatever the screen shows.
  const write = await page.request.post(`/api/sites/${siteId}/units`, { data: { name: 'Sneaky', kind: 'fan' } });
  expect(write.status()).toBe(403);
  const model = await page.request.get(`/api/v1/sites/${siteId}/model`);
  expect(model.status()).toBe(200);
  const put = await page.request.put(`/api/v1/sites/${siteId}/model`, { data: await model.json() });
  expect(put.status()).toBe(403);
  expect(errors).toEqual([]);
  await page.close();
});
