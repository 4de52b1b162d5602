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
