import { expect, test } from '@playwright/test';
import pg from 'pg';
import { DEMO, inboxUrl, signIn, watchConsole } from './helpers';

const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4)}`;
const HOUR = 3_600_000;
const t0 = Date.UTC(2025, 4, 5, 0);

/**
 * Invented unit hours, as the engine writes them: 30 steady reference hours (load 4-9 MW, destruction
 * about 150 kW + 6 kW/MW with +-1 kW scatter, cost at 40 EUR/MWh of destroyed exergy), then 12
 * steady hours at 6 MW whose destruction is 25 kW above the reference line: far more than the
 * residual spread, so the drift check signals within a few hours.
 */
async function insertHours(unitId: string) {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/lossline' });
  await client.connect();
  const cF = 40 / 3.6e9;
  try {
    for (let i = 0; i < 42; i++) {
      const load = i < 30 ? 4 + (i % 6) : 6;
      const D = 150e3 + 6e3 * load + (i % 2 ? 1000 : -1000) + (i >= 30 ? 25e3 : 0);
      await client.query(
        `insert into unit_hours (unit_id, hour_start, state, load, load_unit, t0_k, destruction_w, destruction_u_w, destruction_cost_per_h, model_version, inputs_hash)
         values ($1, $2, 'steady', $3, 'MW', 293.15, $4, 8000, $5, 'e2e', $6)`,
        [unitId, new Date(t0 + i * HOUR), load, D, cF * D * 3600, `e2e-${i}`],
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

async function mailsFor(request: import('@playwright/test').APIRequestContext, to: string, subjectPart: string): Promise<Caught[]> {
  const all = (await (await request.get(`${inboxUrl()}/api/messages`)).json()) as Caught[];
  return all.filter((m) => m.to.includes(to) && m.subject.includes(subjectPart));
}

test('a planner opens a drift notice from its e-mail link and marks it as seen; a lead closes it with a comment', async ({ browser, request }) => {
  const unitName = `Let-down station ${stamp()}`;
  const admin = await browser.newPage();
  await signIn(admin, DEMO.admin);
  const site = await admin.request.post('/api/sites', { data: { name: `E2E notice site ${stamp()}`, timeZone: 'Europe/Berlin' } });
  expect(site.status()).toBe(201);
  const siteId = (await site.json()).site.id;
  const unit = await admin.request.post(`/api/sites/${siteId}/units`, { data: { name: unitName, kind: 'pump' } });
  expect(unit.status()).toBe(201);
  const unitId = (await unit.json()).unit.id;
  await admin.close();
  await insertHours(unitId);

  // The energy lead accepts a baseline on the reference hours; the worker then checks the later hours.
  const lead = await browser.newPage();
  await signIn(lead, DEMO['energy-lead']);
  const fit = await lead.request.post(`/api/units/${unitId}/baselines`, {
    data: { periodFrom: new Date(t0).toISOString(), periodTo: new Date(t0 + 30 * HOUR).toISOString(), terms: ['load'] },
  });
  expect(fit.status()).toBe(201);
  const baselineId = (await fit.json()).baseline.id;
  expect((await lead.request.post(`/api/baselines/${baselineId}/accept`, { data: {} })).status()).toBe(200);

  // One mail to the planner, with the link to the notice page.
  await expect.poll(async () => (await mailsFor(request, DEMO.planner, unitName)).length, { timeout: 30_000 }).toBe(1);
  const [mail] = await mailsFor(request, DEMO.planner, unitName);
  expect(mail!.subject).toContain('more exergy than expected');
  expect(mail!.text).toContain('not an alarm');
  expect(mail!.text).toContain('Cost per day: EUR');
  const link = /(https?:\/\/\S+\/notices\/[0-9a-f-]{36})/.exec(mail!.text)![1]!;
  expect(link.startsWith(process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4331')).toBe(true);

  const page = await browser.newPage();
  const errors = watchConsole(page);
  await page.goto(link);
  await expect(page).toHaveURL(/\/sign-in\?next=/);
  await page.getByLabel('E-mail').fill(DEMO.planner);
  await page.getByLabel('Password').fill('lossline-demo-1');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(link);
  await expect(page.getByRole('heading', { level: 1 })).toContainText(`Drift notice: ${unitName}`);
  await expect(page.getByTestId('notice-status')).toContainText('open');
  // About +25 kW above the expected line (the scatter and the fit move it by a fraction of a kW).
  await expect(page.getByTestId('fig-extra')).toHaveText(/^\+2[45]\.\d kW$/);
  await expect(page.getByTestId('fig-cost')).toContainText('EUR/day');
  await expect(page.getByTestId('fig-uncertainty')).toHaveText('yes');
  await expect(page.getByTestId('fig-since')).toContainText('2025-05-06');
  await expect(page.getByTestId('notice-caution')).toContainText('not an alarm');
  await expect(page.getByTestId('notice-caution')).toContainText('licensed engineers');
  await expect(page.getByTestId('drift-chart').locator('.recharts-bar-rectangle').first()).toBeVisible();

  // Act only once the island is hydrated (Astro removes the ssr marker then).
  await expect(page.locator('astro-island[ssr]')).toHaveCount(0);
  await page.getByLabel('Comment (optional)').fill('Walked down the station; order raised for the seat.');
  await page.getByRole('button', { name: 'Mark as seen' }).click();
  await expect(page.getByTestId('notice-status')).toContainText('seen');
  await expect(page.getByTestId('notice-history')).toContainText('Seen by Pia Planner');
  await expect(page.getByRole('button', { name: 'Mark as seen' })).toHaveCount(0);

  // Closing needs a comment.
  await page.getByRole('button', { name: 'Close notice' }).click();
  await expect(page.getByRole('alert')).toContainText('Say why the notice is closed');
  await expect(page.getByTestId('notice-status')).toContainText('seen');

  // The list shows it (open and seen first).
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Drift notices' }).click();
  await expect(page.getByTestId(`notice-${unitName}`)).toContainText('seen');
  expect(errors).toEqual([]);
  await page.close();

  // An operator reads the notice but cannot act on it.
  const op = await browser.newPage();
  await signIn(op, DEMO.operator);
  await op.goto(link);
  await expect(op.getByTestId('notice-status')).toContainText('seen');
  await expect(op.getByRole('button', { name: 'Close notice' })).toHaveCount(0);
  const noticeId = link.split('/').pop()!;
  expect((await op.request.post(`/api/notices/${noticeId}/close`, { data: { comment: 'no' } })).status()).toBe(403);
  await op.close();

  await lead.goto(link);
  await expect(lead.locator('astro-island[ssr]')).toHaveCount(0);
  await lead.getByLabel('Why it can be closed (required)').fill('Seat replaced at the weekend stop; destruction back on the line.');
  // Closing asks first; Escape answers no and leaves the notice as it was.
  await lead.getByRole('button', { name: 'Close notice' }).click();
  const ask = lead.getByRole('dialog', { name: /Close the notice of/ });
  await expect(ask).toBeVisible();
  await expect(ask.getByRole('button', { name: 'Cancel' })).toBeFocused();
  await lead.keyboard.press('Escape');
  await expect(ask).toHaveCount(0);
  await expect(lead.getByTestId('notice-status')).not.toContainText('closed');
  await lead.getByRole('button', { name: 'Close notice' }).click();
  await lead.getByRole('dialog').getByRole('button', { name: 'Close the notice' }).click();
  await expect(lead.getByTestId('notice-status')).toContainText('closed');
  await expect(lead.getByTestId('notice-history')).toContainText('Closed by Lena Lead');
  await lead.close();

  // Never a second mail for the same notice.
  expect(await mailsFor(request, DEMO.planner, unitName)).toHaveLength(1);
});
