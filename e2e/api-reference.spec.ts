import { expect, test } from '@playwright/test';
import { DEMO, signIn } from './helpers';

interface OpenApiDocument {
  paths: Record<string, Record<string, { summary?: string; operationId?: string }>>;
}

/**
 * The API reference page (src/pages/api-reference.astro), reached from the API tokens page: it draws
 * the server's own OpenAPI document with a renderer bundled into the app, so it needs nothing from
 * outside (no CDN, no web fonts, no telemetry). Every request of the browser is watched, and one
 * that leaves the server's origin fails the test by its address.
 */
test('the API reference, linked from the API tokens page, draws the operations of the document without a request leaving the server', async ({ page, context, baseURL }) => {
  // The renderer parses the whole document in the browser: generous waits for a loaded machine (not a speed check).
  test.setTimeout(240_000);
  const origin = new URL(baseURL!).origin;
  const local = (url: string) => url.startsWith(`${origin}/`) || url === origin || url.startsWith('data:') || url.startsWith('blob:') || url === 'about:blank';
  const outside: string[] = [];
  context.on('request', (r) => {
    if (!local(r.url())) outside.push(r.url());
  });

  await signIn(page, DEMO.admin);
  await page.goto('/admin/tokens');
  await page.getByRole('link', { name: 'API reference', exact: true }).click();
  await expect(page).toHaveURL(/\/api-reference$/);
  await expect(page.getByRole('heading', { level: 1, name: 'API reference' })).toBeVisible();

  const doc = (await (await page.request.get('/api/v1/openapi.json')).json()) as OpenApiDocument;
  const operations = Object.entries(doc.paths).flatMap(([path, methods]) => Object.entries(methods).map(([method, op]) => ({ path, method, summary: op.summary ?? '' })));
  expect(operations.length).toBeGreaterThan(10);
  // The renderer draws the document: its title and description, and a known operation once its group is open.
  const main = page.getByRole('main');
  await expect(main.getByText('Lossline API', { exact: true }).first()).toBeVisible({ timeout: 150_000 });
  const sidebar = page.getByRole('complementary');
  const closed = sidebar.getByRole('button', { name: /^Open Group - / });
  await expect(closed.first()).toBeVisible();
  await sidebar.getByRole('button', { name: 'Open Group - Site', exact: true }).click();
  await expect(sidebar.getByText('The site and its settings', { exact: true })).toBeVisible();
  // Every operation of the document is in the drawn reference by its summary, with every group open.
  for (let n = 0; n < 20 && (await closed.count()) > 0; n++) await closed.first().click();
  const missing: string[] = [];
  for (const op of operations) {
    if ((await sidebar.getByText(op.summary, { exact: true }).count()) === 0) missing.push(`${op.method.toUpperCase()} ${op.path}: ${op.summary}`);
  }
  expect(missing).toEqual([]);
  expect(outside).toEqual([]);
});
