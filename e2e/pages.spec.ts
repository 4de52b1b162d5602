import { expect, test } from '@playwright/test';
import { NAV } from '~/lib/navigation';
import { DEMO, signIn, watchConsole } from './helpers';

/**
 * Every page of the main navigation renders for an admin without console errors, with a screenshot
 * of each in the test's output folder. The list is the navigation itself, so a new page is checked
 * as soon as it is listed there.
 */
const pages = NAV.filter((n) => n.roles.includes('admin'));

test('self-consistency: the navigation lists the main pages', () => {
  expect(pages.length).toBeGreaterThanOrEqual(4);
  expect(pages[0]!.href).toBe('/');
});

for (const item of pages) {
  test(`${item.label} (${item.href}) renders for an admin without console errors`, async ({ page }, testInfo) => {
    const errors = watchConsole(page);
    await signIn(page, DEMO.admin);
    const res = await page.goto(item.href);
    expect(res?.status()).toBe(200);
    await page.waitForLoadState('networkidle');
    await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
    await expect(page.getByTestId('loading')).toHaveCount(0);
    const current = page.getByRole('navigation', { name: 'Main' }).locator('[aria-current="page"]');
    await expect(current).toHaveText(item.label);
    const file = testInfo.outputPath(`${item.href === '/' ? 'overview' : item.href.replace(/^\//, '').replace(/\//g, '-')}.png`);
    await page.screenshot({ path: file, fullPage: true });
    expect(errors).toEqual([]);
  });
}

test('a page closed to the role and an address with no page answer inside the frame, with the way back', async ({ page }) => {
  await signIn(page, DEMO.planner);
  const refused = await page.goto('/admin/users');
  expect(refused?.status()).toBe(403);
  await expect(page.getByRole('heading', { level: 1, name: 'Not open to you' })).toBeVisible();
  await expect(page.getByText('not open to your role')).toBeVisible();
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
  const missing = await page.goto('/no-such-page-here');
  expect(missing?.status()).toBe(404);
  await expect(page.getByRole('heading', { level: 1, name: 'Nothing here' })).toBeVisible();
  await page.getByRole('link', { name: 'Back to the overview' }).click();
  await expect(page).toHaveURL(/\/$/);
});

test('the main navigation of the role with most places stays on one line at 1440 px, and a skip link leads to the content', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 900 });
  await signIn(page, DEMO.admin);
  const links = page.getByRole('navigation', { name: 'Main' }).getByRole('link');
  const tops = await links.evaluateAll((els) => els.map((e) => Math.round(e.getBoundingClientRect().top)));
  expect(new Set(tops).size).toBe(1);
  expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
  await page.keyboard.press('Tab');
  const skip = page.getByRole('link', { name: "Skip to the page's content" });
  await expect(skip).toBeFocused();
  await skip.press('Enter');
  await expect(page.locator('main#main')).toBeFocused();
});
