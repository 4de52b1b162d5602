import { expect, test, type Page } from '@playwright/test';
import { NAV } from '~/lib/navigation';
import { DEMO, signIn } from './helpers';
import { codesOnPage } from './words-scan';

/**
 * Words, not codes: no page of the demo shows a code or identifier of the word catalogue
 * (src/lib/words: reason codes, engine identifiers, slot counts, "[SI]", e-notation) in its visible
 * text. The main pages come from the navigation; the detail pages from the first link of each list.
 */
const MAIN = NAV.filter((n) => n.roles.includes('admin')).map((n) => n.href);
/** Detail pages reached from a list page: the first link whose address matches. */
const DETAILS: [string, RegExp][] = [
  ['/plant', /^\/plant\/[0-9a-f-]{36}$/],
  ['/units', /^\/units\/[0-9a-f-]{36}$/],
  ['/baselines', /^\/baselines\/[0-9a-f-]{36}$/],
  ['/notices', /^\/notices\/[0-9a-f-]{36}$/],
  ['/trends', /^\/trends\/[0-9a-f-]{36}$/],
];

async function firstLink(page: Page, list: string, pattern: RegExp): Promise<string | null> {
  await page.goto(list);
  await page.waitForLoadState('networkidle');
  const hrefs = await page.locator('main a[href]').evaluateAll((as) => as.map((a) => a.getAttribute('href') ?? ''));
  return hrefs.find((h) => pattern.test(h)) ?? null;
}

test('self-consistency: the pattern finds a code planted in a page', async ({ page }) => {
  await page.setContent('<body><p>Why: SPREAD_HIGH, shaftPower_W = -9.19541e-12 [SI]</p></body>');
  expect((await codesOnPage(page)).length).toBeGreaterThanOrEqual(3);
});

for (const href of MAIN) {
  test(`${href} shows words, not codes, to an admin`, async ({ page }) => {
    await signIn(page, DEMO.admin);
    await page.goto(href);
    expect(await codesOnPage(page)).toEqual([]);
  });
}

for (const [list, pattern] of DETAILS) {
  test(`the first detail page under ${list} shows words, not codes`, async ({ page }) => {
    await signIn(page, DEMO.admin);
    const href = await firstLink(page, list, pattern);
    test.info().annotations.push({ type: 'page', description: href ?? `no detail page under ${list} in this data` });
    if (!href) return;
    await page.goto(href);
    expect(await codesOnPage(page)).toEqual([]);
  });
}

test('an opened hour shows words, not codes', async ({ page }) => {
  await signIn(page, DEMO.admin);
  const href = await firstLink(page, '/units', /^\/units\/[0-9a-f-]{36}$/);
  test.info().annotations.push({ type: 'page', description: href ?? 'no unit in this data' });
  if (!href) return;
  await page.goto(href);
  await page.waitForLoadState('networkidle');
  const open = page.getByRole('button', { name: /open hour/i }).first();
  if ((await open.count()) === 0) return;
  await open.click();
  await expect(page.getByTestId('hour-detail')).toBeVisible();
  await expect(page.getByTestId('hour-detail').getByTestId('hour-figures')).toBeVisible();
  await page.locator('details').evaluateAll((ds) => ds.forEach((d) => d.setAttribute('open', '')));
  expect(await codesOnPage(page)).toEqual([]);
});
