import { expect, test } from '@playwright/test';
import pg from 'pg';
import { DEMO, inboxUrl, signIn, watchConsole } from './helpers';

const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4)}`;
const HOUR = 3_600_000;
const t0 = Date.UTC(2025, 9, 6, 0);

/** Invented unit hours: the turbine runs 12 hours; the valve beside it runs (passes steam) hours 4-9, 150 kW at 5 EUR/h. */
async function insertHours(tgId: string, prvId: string) {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/lossline' });
  await client.connect();
  try {
    for (let i = 0; i < 12; i++) {
      await client.query(`insert into unit_hours (unit_id, hour_start, state, model_version, inputs_hash) values ($1, $2, 'steady', 'e2e', $3)`, [tgId, new Date(t0 + i * HOUR), `tg-${i}`]);
      const on = i >= 4 && i <= 9;
      await client.query(
        `insert into unit_hours (unit_id, hour_start, state, destruction_w, destruction_cost_per_h, model_version, inputs_hash) values ($1, $2, $3, $4, $5, 'e2e', $6)`,
        [prvId, new Date(t0 + i * HOUR), on ? 'steady' : 'idle', on ? 150_000 : null, on ? 5 : null, `prv-${i}`],
      );
    }
  } finally {
    await client.end();
  }
}

test('an admin declares a let-down valve normally idle while its turbine runs; the planner gets one mail and closes the notice', async ({ browser, request }) => {
  const siteName = `E2E idle site ${stamp()}`;
  const admin = await browser.newPage();
  const errors = watchConsole(admin);
  await signIn(admin, DEMO.admin);
  const site = await admin.request.post('/api/sites', { data: { name: siteName, timeZone: 'UTC' } });
  expect(site.status()).toBe(201);
  const siteId = (await site.json()).site.id;
  const tg = (await (await admin.request.post(`/api/sites/${siteId}/units`, { data: { name: 'TG', kind: 'turbine' } })).json()).unit.id;
  const prv = (await (await admin.request.post(`/api/sites/${siteId}/units`, { data: { name: 'PRV', kind: 'let-down-valve' } })).json()).unit.id;
  await insertHours(tg, prv);

  await admin.goto(`/plant/${siteId}/units/${prv}`);
  const box = admin.getByRole('region', { name: 'Normally idle' });
  await expect(box.getByTestId('idle-now')).toContainText('not declared idle');
  await box.getByLabel('This unit is normally idle').check();
  await box.getByLabel('TG').check();
  await box.getByRole('button', { name: 'Save idle declaration' }).click();
  await expect(box.getByRole('status')).toContainText('Saved');
  await expect(box.getByTestId('idle-now')).toContainText('normally idle always, while TG runs; more than 3 hours');
  expect(errors).toEqual([]);
  await admin.close();

  // The worker checks the valve's hours: six hours running while TG runs open one notice, mailed once.
  const mails = async () =>
    ((await (await request.get(`${inboxUrl()}/api/messages`)).json()) as { to: string[]; subject: string; text: string }[]).filter(
      (m) => m.to.includes(DEMO.planner) && m.subject.includes(siteName),
    );
  await expect.poll(async () => (await mails()).length, { timeout: 30_000 }).toBe(1);
  const [mail] = await mails();
  expect(mail!.subject).toContain('Running while it should be idle: PRV');
  expect(mail!.text).toContain('Cost of destruction per day: EUR 120');
  expect(mail!.text).toContain('licensed engineers');
  const link = /(https?:\/\/\S+\/notices\/[0-9a-f-]{36})/.exec(mail!.text)![1]!;

  const planner = await browser.newPage();
  await signIn(planner, DEMO.planner);
  await planner.goto(link);
  await expect(planner.getByRole('heading', { level: 1 })).toContainText('Notice (running while idle): PRV');
  await expect(planner.getByTestId('rule-notice')).toContainText('normally idle always, while TG runs');
  await expect(planner.getByTestId('fig-destruction')).toHaveText('150 kW');
  await expect(planner.getByTestId('fig-cost')).toContainText('120');
  await expect(planner.getByTestId('notice-caution')).toContainText('not an alarm');
  await expect(planner.locator('astro-island[ssr]')).toHaveCount(0);
  await planner.getByLabel('Why it can be closed (required)').fill('Valve seat lapped; passing stopped.');
  await planner.getByRole('button', { name: 'Close notice' }).click();
  await planner.getByRole('dialog').getByRole('button', { name: 'Close the notice' }).click();
  await expect(planner.getByTestId('notice-status')).toContainText('closed');
  await planner.close();
  expect(await mails()).toHaveLength(1);
});
