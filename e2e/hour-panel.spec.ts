import AxeBuilder from '@axe-core/playwright';
import { expect, test } from '@playwright/test';
import { DEMO, signIn } from './helpers';
import { stamp, turbineWithHours } from './unit-hours-fixture';

/**
 * One hour opens in place: a side sheet over the hour table, in view without scrolling, with the
 * focus inside it; Escape closes it and gives the focus back to the button that opened it; the
 * browser's Back closes it (the page stays) and Forward opens it again; the address names the hour,
 * and that address opens the hour directly, also one outside the week the page opens on. An invented site with a turbine and 10 days of unit hours written as the engine would.
 */
const FIRST = '2025-03-03T00:00:00Z';
const HOURS = 24 * 10;

const unitWithHours = async (name: string): Promise<string> => (await turbineWithHours(name, 'Panel turbine', FIRST, HOURS)).unitId;

const inAddress = (iso: string) => `${new Date(iso).toISOString().slice(0, 16)}Z`;

test('an hour opens in place, focused, closes with Escape back to its button or with Back (the page stays), and its address opens it directly', async ({ page }) => {
  test.setTimeout(240_000); // three page loads and an axe pass: slow on a shared machine
  const unitId = await unitWithHours(`E2E hour panel site ${stamp()}`);
  await page.setViewportSize({ width: 1440, height: 900 });
  await signIn(page, DEMO.operator);
  await page.goto(`/units/${unitId}`);
  const table = page.getByTestId('unit-hours');
  await expect(table.locator('tbody tr')).toHaveCount(24 * 7);

  // An hour near the foot of the table: its detail opens where the reader is, not below the table.
  const row = table.locator('tbody tr').nth(24 * 7 - 3);
  const hour = (await row.getAttribute('data-hour'))!;
  const button = row.getByRole('button', { name: 'Open hour' });
  await button.scrollIntoViewIfNeeded();
  await button.click();
  const panel = page.getByRole('dialog', { name: /Panel turbine, hour from/ });
  await expect(panel).toBeVisible();
  await expect(panel.getByTestId('hour-figures')).toBeVisible();
  const box = (await panel.boundingBox())!;
  expect(box.y, 'the panel starts inside the window').toBeGreaterThanOrEqual(0);
  expect(box.y, 'the panel starts inside the window').toBeLessThan(900);
  expect(box.height).toBeGreaterThan(400);
  expect(await panel.evaluate((d) => d.contains(document.activeElement)), 'the focus is in the panel').toBe(true);
  await expect(panel).toHaveAttribute('aria-modal', 'true');

  // The address names the hour, and the panel offers it as a link.
  expect(new URL(page.url()).searchParams.get('hour')).toBe(inAddress(hour));
  const link = (await panel.getByTestId('hour-link').getAttribute('href'))!;
  expect(link).toContain(`/units/${unitId}?hour=${inAddress(hour)}`);

  // The open panel passes axe (WCAG 2.1 AA).
  const axe = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  expect(axe.violations.map((v) => `${v.id}: ${v.help} [${v.nodes.map((n) => n.target.join(' ')).join(' | ')}]`)).toEqual([]);

  // Escape closes it; the focus is back on the button that opened it and the address forgets the hour.
  await page.keyboard.press('Escape');
  await expect(panel).toHaveCount(0);
  await expect(button).toBeFocused();
  await expect(page).toHaveURL((u) => u.pathname === `/units/${unitId}` && !u.searchParams.has('hour'));

  // The browser's Back closes an opened hour and the page stays; Forward opens it again.
  await button.click();
  await expect(panel).toBeVisible();
  await expect(page).toHaveURL((u) => u.searchParams.get('hour') === inAddress(hour));
  await page.goBack();
  await expect(panel).toHaveCount(0);
  await expect(page).toHaveURL((u) => u.pathname === `/units/${unitId}` && !u.searchParams.has('hour'));
  await expect(table.locator('tbody tr')).toHaveCount(24 * 7);
  await expect(button).toBeFocused();
  await page.goForward();
  await expect(panel).toBeVisible();
  await expect(panel.getByTestId('hour-figures')).toBeVisible();
  await expect(page).toHaveURL((u) => u.searchParams.get('hour') === inAddress(hour));
  // Closed by its button, the entry it pushed is gone again: one Back more leaves the hour list, not the hour.
  await panel.getByRole('button', { name: 'Close the hour' }).click();
  await expect(panel).toHaveCount(0);
  await expect(page).toHaveURL((u) => u.pathname === `/units/${unitId}` && !u.searchParams.has('hour'));
  await expect(table.locator('tbody tr')).toHaveCount(24 * 7);

  // The link opens the hour directly, and the close button gives the focus to that hour's row.
  await page.goto(link);
  const direct = page.getByRole('dialog', { name: /Panel turbine, hour from/ });
  await expect(direct).toBeVisible();
  await expect(direct.getByTestId('hour-figures')).toBeVisible();
  await direct.getByRole('button', { name: 'Close the hour' }).click();
  await expect(direct).toHaveCount(0);
  await expect(page.getByTestId('unit-hours').locator(`tr[data-hour="${hour}"]`).getByRole('button', { name: 'Open hour' })).toBeFocused();

  // An hour before the week the page opens on: the page shows the days up to it, and opens it.
  const early = new Date(Date.parse(FIRST) + 5 * 3_600_000).toISOString();
  await page.goto(`/units/${unitId}?hour=${inAddress(early)}`);
  await expect(page.getByRole('dialog', { name: /Panel turbine, hour from 2025-03-03 05:00/ })).toBeVisible();
  await page.keyboard.press('Escape');
  await expect(page.getByTestId('unit-hours').locator(`tr[data-hour="${early}"]`)).toHaveCount(1);
});
