import { expect, test } from '@playwright/test';
import { DEMO, inboxUrl, nav, signIn, watchConsole } from './helpers';

const NAV_BY_ROLE: Record<keyof typeof DEMO, { shown: string[]; hidden: string[]; label: string }> = {
  admin: { shown: ['Overview', 'People'], hidden: [], label: 'Admin' },
  'energy-lead': { shown: ['Overview'], hidden: ['People'], label: 'Energy lead' },
  operator: { shown: ['Overview'], hidden: ['People'], label: 'Operator' },
  planner: { shown: ['Overview'], hidden: ['People'], label: 'Maintenance planner' },
};

for (const [role, expectNav] of Object.entries(NAV_BY_ROLE)) {
  test(`${role} signs in and sees its own navigation`, async ({ page }) => {
    const errors = watchConsole(page);
    await signIn(page, DEMO[role as keyof typeof DEMO]);
    await expect(page.getByTestId('signed-in-role')).toHaveText(expectNav.label);
    const mainNav = page.getByRole('navigation', { name: 'Main' });
    for (const label of expectNav.shown) await expect(mainNav.getByRole('link', { name: label, exact: true })).toBeVisible();
    for (const label of expectNav.hidden) await expect(mainNav.getByRole('link', { name: label, exact: true })).toHaveCount(0);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await expect(page).toHaveURL(/\/sign-in/);
    expect(errors).toEqual([]);
  });
}

test('a wrong password gets a clear message and no session', async ({ page }) => {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(DEMO.operator);
  await page.getByLabel('Password').fill('not-the-right-one');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toContainText('do not match an account');
  await page.goto('/');
  await expect(page).toHaveURL(/\/sign-in\?next=/);
});

test('an operator calling an admin endpoint gets 403', async ({ page }) => {
  await signIn(page, DEMO.operator);
  const res = await page.request.get('/api/admin/users');
  expect(res.status()).toBe(403);
  expect((await res.json()).error.code).toBe('FORBIDDEN');
  const anon = await page.request.fetch('/api/admin/users', { headers: { cookie: '' } });
  expect([401, 403]).toContain(anon.status());
});

test('an invited person receives the e-mail, sets a password through its link, and signs in', async ({ page, request }) => {
  const email = `e2e-invitee-${Date.now()}@example.test`;
  await signIn(page, DEMO.admin);
  await nav(page, 'People').click();
  await page.getByLabel('Name').fill('Erin Example');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Role', { exact: true }).selectOption('planner');
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByRole('status')).toContainText(`Invitation sent to ${email}`);
  await expect(page.getByTestId(`person-${email}`)).toContainText('invited, no password yet');
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page).toHaveURL(/\/sign-in/);

  let link: string | undefined;
  await expect
    .poll(async () => {
      const mails = (await (await request.get(`${inboxUrl()}/api/messages`)).json()) as { to: string[]; text: string }[];
      link = mails.find((m) => m.to.includes(email))?.text.match(/https?:\/\/\S+/)?.[0];
      return Boolean(link);
    })
    .toBe(true);

  await page.goto(link!);
  await expect(page).toHaveURL(/\/set-password\?token=/);
  await page.getByLabel('New password').fill('short');
  await page.getByLabel('The same again').fill('short');
  await page.getByRole('button', { name: 'Set password' }).click();
  await expect(page.getByRole('alert')).toContainText('too short');
  await page.getByLabel('New password').fill('erin-sets-a-long-one');
  await page.getByLabel('The same again').fill('erin-sets-a-long-one');
  await page.getByRole('button', { name: 'Set password' }).click();
  await expect(page.getByRole('status')).toContainText('Your password is set');

  await signIn(page, email, 'erin-sets-a-long-one');
  await expect(page.getByTestId('signed-in-role')).toHaveText('Maintenance planner');
});
