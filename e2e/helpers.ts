import { expect, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'lossline-demo-1';
/** The invented demo site the seed creates (Europe/London). */
export const DEMO_SITE = 'Harrowgate Mills Energy Centre';
export const DEMO = {
  admin: 'admin@demo.lossline.test',
  'energy-lead': 'lead@demo.lossline.test',
  operator: 'operator@demo.lossline.test',
  planner: 'planner@demo.lossline.test',
} as const;

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByTestId('signed-in-user')).toBeVisible();
}

/** A link of the main navigation (pages may have links with the same words elsewhere). */
export const nav = (page: Page, label: string) => page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: label, exact: true });

export const inboxUrl = () => process.env.MAIL_INBOX_URL ?? 'http://127.0.0.1:1090';

/** Collects console errors and failed page loads, for a check that a page rendered cleanly. */
export function watchConsole(page: Page): string[] {
  const errors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text());
  });
  page.on('pageerror', (e) => errors.push(e.message));
  return errors;
}
