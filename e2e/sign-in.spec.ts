import { expect, test } from '@playwright/test';
import { DEMO, DEMO_PASSWORD, signIn, watchConsole } from './helpers';

const BASE = () => process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4331';

test('without JavaScript the sign-in form posts (never a GET with the password) and lands on next', async ({ browser }) => {
  const context = await browser.newContext({ javaScriptEnabled: false });
  const page = await context.newPage();
  const urls: { method: string; url: string }[] = [];
  page.on('request', (r) => urls.push({ method: r.method(), url: r.url() }));
  await page.goto('/sign-in?next=%2Fledger');
  await page.getByLabel('E-mail').fill(DEMO.operator);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/ledger$/);
  await expect(page.getByTestId('signed-in-user')).toBeVisible();
  expect(urls.some((u) => u.method === 'POST' && u.url.endsWith('/sign-in'))).toBe(true);
  expect(urls.filter((u) => u.url.includes(encodeURIComponent(DEMO_PASSWORD)) || u.url.includes(DEMO_PASSWORD))).toEqual([]);
  await context.close();
});

test('a wrong password without JavaScript gets the message on the page, not in the address', async ({ browser }) => {
  const context = await browser.newContext({ javaScriptEnabled: false });
  const page = await context.newPage();
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(`nobody-${Date.now()}@example.test`);
  await page.getByLabel('Password').fill('not-the-right-one');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toContainText('do not match an account');
  expect(page.url()).not.toContain('not-the-right-one');
  await context.close();
});

for (const evil of ['//evil.example', '/%5Cevil.example', '/%09/evil.example', 'https://evil.example/', '/\\evil.example']) {
  test(`sign-in?next=${evil} stays on this site`, async ({ page }) => {
    await page.goto(`/sign-in?next=${encodeURIComponent(evil)}`);
    await page.getByLabel('E-mail').fill(DEMO.planner);
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.getByTestId('signed-in-user')).toBeVisible();
    expect(new URL(page.url()).origin).toBe(new URL(BASE()).origin);
  });
}

test('made-up X-Forwarded-For addresses do not dodge the per-address limit', async ({ request }) => {
  // The password-link request is limited to 5 a minute per address; a forged header must not reset it.
  const statuses: number[] = [];
  for (let i = 0; i < 8; i++) {
    const res = await request.post('/api/auth/request-password-reset', {
      headers: { origin: new URL(BASE()).origin, 'x-forwarded-for': `198.51.100.${i + 1}` },
      data: { email: `nobody-${i}@example.test`, redirectTo: '/set-password' },
    });
    statuses.push(res.status());
  }
  expect(statuses.filter((s) => s === 429).length).toBeGreaterThanOrEqual(3);
});

test('pages carry a script policy without inline script, and the islands still work under it', async ({ page }) => {
  const errors = watchConsole(page);
  const res = await page.goto('/sign-in');
  const csp = res!.headers()['content-security-policy']!;
  expect(csp).toMatch(/frame-ancestors 'none'/);
  expect(csp.split(';').find((d) => d.trim().startsWith('script-src'))).not.toMatch(/unsafe-inline/);
  expect(res!.headers()['x-content-type-options']).toBe('nosniff');
  expect(res!.headers()['referrer-policy']).toBe('same-origin');
  // The island is hydrated: a wrong password is answered in place, without a page load.
  await page.getByLabel('E-mail').fill(DEMO.planner);
  await page.getByLabel('Password').fill('still-not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toContainText('do not match an account');
  await signIn(page, DEMO.admin);
  await page.goto('/admin/users');
  await expect(page.getByRole('heading', { name: 'People', exact: true }).first()).toBeVisible();
  expect(errors.filter((e) => /Content Security Policy|Refused to/i.test(e))).toEqual([]);
  const asset = await page.request.get('/favicon.svg');
  expect(asset.headers()['x-content-type-options']).toBe('nosniff');
});

test('a bodyless DELETE from the real origin gets through; one claiming http://localhost does not', async ({ page }) => {
  await signIn(page, DEMO.admin);
  const fromPage = await page.evaluate(async () => (await fetch('/api/tokens/00000000-0000-4000-8000-000000000000', { method: 'DELETE' })).status);
  expect(fromPage).toBe(404); // through the guard to the endpoint: no such token
  const forged = await page.request.delete('/api/tokens/00000000-0000-4000-8000-000000000000', { headers: { origin: 'http://localhost' } });
  expect(forged.status()).toBe(403);
  const unknown = await page.request.get('/api/no-such-thing');
  expect(unknown.status()).toBe(404);
  expect((await unknown.json()).error.code).toBe('NOT_FOUND');
});

test('a site token call with curl’s default content type is not taken for a cross-site form', async ({ page, playwright }) => {
  await signIn(page, DEMO.admin);
  const sites = (await (await page.request.get('/api/sites')).json()).sites as { id: string; name: string }[];
  const site = sites[0]!;
  const issued = await page.request.post(`/api/sites/${site.id}/tokens`, { data: { name: `e2e content type ${Date.now()}`, role: 'admin' } });
  expect(issued.status()).toBe(201);
  const { id, token } = (await issued.json()) as { id: string; token: string };
  const client = await playwright.request.newContext({ baseURL: BASE() });
  // As `curl -X PUT -d 'x=1'` sends it: a form content type, no Origin. The endpoint itself answers.
  const res = await client.put(`/api/v1/sites/${site.id}/model`, {
    headers: { authorization: `Bearer ${token}`, 'content-type': 'application/x-www-form-urlencoded' },
    data: 'x=1',
  });
  expect(res.status()).toBe(400);
  expect((await res.json()).error.message).toMatch(/not JSON/);
  await client.dispose();
  expect((await page.request.delete(`/api/tokens/${id}`)).status()).toBe(200);
});
