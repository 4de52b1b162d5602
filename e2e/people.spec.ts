import { expect, test } from '@playwright/test';
import { DEMO, DEMO_SITE, nav, signIn } from './helpers';

test('an admin narrows a person from every site to one site on the people page', async ({ page }) => {
  const email = `e2e-sites-${Date.now()}@example.test`;
  await signIn(page, DEMO.admin);
  const sites = (await (await page.request.get('/api/sites')).json()).sites as { id: string; name: string }[];
  const demo = sites.find((s) => s.name === DEMO_SITE)!;
  const invited = await page.request.post('/api/admin/users', {
    headers: { origin: new URL(page.url()).origin },
    data: { name: 'Sam Sites', email, role: 'operator', sites: 'all' },
  });
  expect(invited.status()).toBe(201);

  await nav(page, 'People').click();
  const row = page.getByTestId(`person-${email}`);
  await expect(row).toContainText('every site');
  await row.getByLabel('Sites of Sam Sites').click();
  // Off "every site": the sites of today stay ticked, sites added later no longer come along.
  await row.getByRole('checkbox', { name: 'Every site, including sites added later' }).click(); // saved at once; the box follows the answer
  await expect(page.getByRole('status')).toContainText('Saved');
  const sitesOf = async () =>
    ((await (await page.request.get('/api/admin/users')).json()).users as { email: string; sites: 'all' | string[] }[]).find((p) => p.email === email)!.sites;
  await expect.poll(async () => (await sitesOf()) === 'all').toBe(false);
  expect([...(await sitesOf())].sort()).toEqual(sites.map((s) => s.id).sort());
  // Untick the demo site: it is gone from the person's sites.
  await row.getByRole('checkbox', { name: DEMO_SITE }).click();
  await expect.poll(async () => (await sitesOf()).includes(demo.id)).toBe(false);
  expect((await sitesOf()).length).toBe(sites.length - 1);
});
