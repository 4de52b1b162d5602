import { expect, test } from '@playwright/test';
import { DEMO, signIn } from './helpers';

interface OpenApiDocument {
  paths: Record<string, Record<string, { summary?: string; operationId?: string }>>;
}

/**
 * The API reference page (src/pages/api-reference.astro), reached from the API tokens page: it draws
 * the server's own OpenAPI document with a renderer bundled into the app, so it needs nothing from
 * outside (no CDN, no web fonts, no telemetry). Every request leaving the server's origin is
 * refused and listed: a page that needed one would fail to draw, and the list names it.
 */
test('the API reference, linked from the API tokens page, draws the operations of the document without a request leaving the server', async ({ page, context, baseURL }) => {
  const origin = new URL(baseURL!).origin;
  const local = (url: string) => url.startsWith(`${origin}/`) || url === origin || url.startsWith('data:') || url.startsWith('blob:') || url === 'about:blank';
  const outside: string[] = [];
  context.on('request', (r) => {
    if (!local(r.url())) outside.push(r.url());
  });
  await context.route((url) => !local(url.href), (route) => route.abort('blockedbyclient'));

  await signIn(page, DEMO.admin);
  await page.goto('/admin/tokens');
  await page.getByRole('link', { name: 'API reference', exact: true }).click();
  await expect(page).toHaveURL(/\/api-reference$/);
  await expect(page.getByRole('heading', { level: 1, name: 'API reference' })).toBeVisible();

  const doc = (await (await page.request.get('/api/v1/openapi.json')).json()) as OpenApiDocument;
  const operations = Object.entries(doc.paths).flatMap(([path, methods]) => Object.entries(methods).map(([method, op]) => ({ path, method, summary: op.summary ?? '' })));
  expect(operations.length).toBeGreaterThan(10);
  const reference = page.locator('#api-reference');
  // A known operation, drawn by the renderer from the document (not from the page's own words).
  await expect(reference.getByText('Whether the site’s figures are final', { exact: true }).first()).toBeVisible({ timeout: 30_000 });
  // Every operation of the document is in the drawn reference by its summary.
  const missing: string[] = [];
  for (const op of operations) {
    if ((await reference.getByText(op.summary, { exact: true }).count()) === 0) missing.push(`${op.method.toUpperCase()} ${op.path}: ${op.summary}`);
  }
  expect(missing).toEqual([]);
  expect(outside).toEqual([]);
});
