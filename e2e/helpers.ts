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

/**
 * A plant model file of one site with one invented let-down valve (steam at the inlet's pressure,
 * temperature and flow, to the outlet's gauge pressure), for journeys that need computed hours.
 */
export function letDownValveModel(siteName: string, unitName: string, tags: { inP: string; inT: string; flow: string; outP: string }) {
  return {
    format: 'lossline-plant-model',
    version: 1,
    site: { name: siteName, timeZone: 'UTC', p_atm_Pa: 101325, deadState: { T0_K: 298.15, p0_Pa: 101325 }, currency: 'EUR', prices: [{ name: 'gas', kind: 'fuel', price_per_MWh: 30, currency: 'EUR' }] },
    units: [
      {
        name: unitName,
        kind: 'let-down-valve',
        parameters: { minLoad_kg_per_s: 0.1 },
        ports: [
          { name: 'HP side', slot: 'inlet', fluid: { kind: 'water' } },
          { name: 'LP side', slot: 'outlet', fluid: { kind: 'water' } },
        ],
        links: [
          { port: 'HP side', quantity: 'pressure', tag: tags.inP, unit: 'bar' },
          { port: 'HP side', quantity: 'temperature', tag: tags.inT, unit: 'degC' },
          { port: 'HP side', quantity: 'massFlow', tag: tags.flow, unit: 't/h' },
          { port: 'LP side', quantity: 'pressure', tag: tags.outP, unit: 'barg' },
        ],
      },
    ],
  };
}
