import { and, eq, like } from 'drizzle-orm';
import { expect, it } from 'vitest';
import { auth } from '../../src/server/auth';
import { CLIENT_IP_HEADER } from '../../src/server/client-ip';
import { db } from '../../src/server/db/client';
import { session, user, verification } from '../../src/server/db/schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../src/server/demo-accounts';
import { UserRuleError, inviteUser, updateUser } from '../../src/server/services/users';
import { describeIntegration, freshIp, waitForMail } from '../support/integration';

const BASE = () => process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4331';

/** A browser-like call to better-auth's HTTP handler (rate limits apply to these, not to auth.api). */
async function post(path: string, body: unknown, ip = freshIp()) {
  const res = await auth().handler(
    new Request(`${BASE()}/api/auth${path}`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: BASE(), [CLIENT_IP_HEADER]: ip },
      body: JSON.stringify(body),
    }),
  );
  const data = await res.json().catch(() => ({}));
  return { status: res.status, data, res };
}

async function sessionsOf(email: string) {
  const [u] = await db().select().from(user).where(eq(user.email, email));
  return db().select().from(session).where(eq(session.userId, u!.id));
}

const operator = DEMO_ACCOUNTS.find((a) => a.role === 'operator')!;
const admin = DEMO_ACCOUNTS.find((a) => a.role === 'admin')!;

describeIntegration('sign-in', () => {
  it('signs in a demo account with its password', async () => {
    const out = await post('/sign-in/email', { email: operator.email, password: DEMO_PASSWORD });
    expect(out.status).toBe(200);
    expect(out.data.user.email).toBe(operator.email);
  });

  it('refuses a wrong password and an unknown e-mail alike, creating no session', async () => {
    const before = (await sessionsOf(operator.email)).length;
    const wrong = await post('/sign-in/email', { email: operator.email, password: 'not-the-password' });
    const unknown = await post('/sign-in/email', { email: 'nobody@demo.lossline.test', password: DEMO_PASSWORD });
    expect([wrong.status, wrong.data.code]).toEqual([401, 'INVALID_EMAIL_OR_PASSWORD']);
    expect([unknown.status, unknown.data.code]).toEqual([401, 'INVALID_EMAIL_OR_PASSWORD']);
    expect((await sessionsOf(operator.email)).length).toBe(before);
  });

  it('rate-limits repeated sign-in attempts from one address (SIGN_IN_LIMIT_PER_MINUTE)', async () => {
    const ip = freshIp();
    const limit = Number(process.env.SIGN_IN_LIMIT_PER_MINUTE ?? 5);
    const statuses: number[] = [];
    for (let i = 0; i < limit + 1; i++) statuses.push((await post('/sign-in/email', { email: operator.email, password: 'wrong-' + i }, ip)).status);
    expect(statuses.slice(0, limit).every((s) => s === 401)).toBe(true);
    expect(statuses[limit]).toBe(429);
    // Even the right password is refused while the window lasts.
    expect((await post('/sign-in/email', { email: operator.email, password: DEMO_PASSWORD }, ip)).status).toBe(429);
  });
});

describeIntegration('invitation and password links', () => {
  it('invites a person by e-mail; the link sets a password; weak, reused and expired links change nothing', async () => {
    const [adminRow] = await db().select().from(user).where(eq(user.email, admin.email));
    const email = `invitee-${Date.now()}@example.test`;
    const { id } = await inviteUser({ name: 'Ines Invitee', email, role: 'planner' }, adminRow!.id);

    const mail = await waitForMail(email, 'invitation');
    const link = mail.text.match(/https?:\/\/\S+/)?.[0];
    expect(link).toMatch(/^https?:\/\/\S+\/api\/auth\/reset-password\//);
    expect(link!.startsWith(BASE())).toBe(true);

    // Following the link redirects to the set-password page with the token.
    const follow = await auth().handler(new Request(link!, { redirect: 'manual' }));
    expect(follow.status).toBe(302);
    const location = new URL(follow.headers.get('location')!, BASE());
    expect(location.pathname).toBe('/set-password');
    const token = location.searchParams.get('token')!;
    expect(token).toMatch(/^[\w-]{16,}$/);

    // No password yet: sign-in fails.
    expect((await post('/sign-in/email', { email, password: 'a-good-long-password' })).status).toBe(401);

    const weak = await post('/reset-password', { token, newPassword: 'short' });
    expect([weak.status, weak.data.code]).toEqual([400, 'PASSWORD_TOO_SHORT']);
    expect((await post('/sign-in/email', { email, password: 'short' })).status).toBe(401);

    const ok = await post('/reset-password', { token, newPassword: 'a-good-long-password' });
    expect(ok.status).toBe(200);
    const signIn = await post('/sign-in/email', { email, password: 'a-good-long-password' });
    expect(signIn.status).toBe(200);
    expect(signIn.data.user.role).toBe('planner');

    const reused = await post('/reset-password', { token, newPassword: 'another-long-password' });
    expect([reused.status, reused.data.code]).toEqual([400, 'INVALID_TOKEN']);

    // An expired link: ask again, then move its expiry into the past.
    await auth().api.requestPasswordReset({ body: { email, redirectTo: '/set-password' } });
    const again = await waitForMail(email, 'new Lossline password');
    const token2 = again.text.match(/reset-password\/([^?\s]+)/)![1]!;
    await db().update(verification).set({ expiresAt: new Date(Date.now() - 1000) }).where(like(verification.identifier, `reset-password:${token2}`));
    const expired = await post('/reset-password', { token: token2, newPassword: 'another-long-password' });
    expect([expired.status, expired.data.code]).toEqual([400, 'INVALID_TOKEN']);
    expect((await post('/sign-in/email', { email, password: 'a-good-long-password' })).status).toBe(200);

    await db().delete(user).where(eq(user.id, id));
  });

  it('refuses to invite an address that already has an account', async () => {
    await expect(inviteUser({ name: 'Again', email: operator.email, role: 'operator' }, 'x')).rejects.toThrow(UserRuleError);
  });
});

describeIntegration('roles and deactivation', () => {
  it('deactivation ends sessions and blocks sign-in; reactivation restores it; role changes apply', async () => {
    const [adminRow] = await db().select().from(user).where(eq(user.email, admin.email));
    const email = `temp-${Date.now()}@example.test`;
    const { id } = await inviteUser({ name: 'Tom Temp', email, role: 'operator' }, adminRow!.id);
    const mail = await waitForMail(email, 'invitation');
    const token = mail.text.match(/reset-password\/([^?\s]+)/)![1]!;
    expect((await post('/reset-password', { token, newPassword: 'temporary-password-1' })).status).toBe(200);
    expect((await post('/sign-in/email', { email, password: 'temporary-password-1' })).status).toBe(200);
    expect((await sessionsOf(email)).length).toBeGreaterThan(0);

    await updateUser(id, { deactivated: true }, adminRow!.id);
    expect((await sessionsOf(email)).length).toBe(0);
    const refused = await post('/sign-in/email', { email, password: 'temporary-password-1' });
    expect(refused.status).toBe(403);
    expect(refused.data.code).toBe('ACCOUNT_DEACTIVATED');

    await updateUser(id, { deactivated: false, role: 'energy-lead' }, adminRow!.id);
    const back = await post('/sign-in/email', { email, password: 'temporary-password-1' });
    expect(back.status).toBe(200);
    expect(back.data.user.role).toBe('energy-lead');
    await db().delete(user).where(eq(user.id, id));
  });

  it('keeps at least one active admin and stops an admin deactivating themself', async () => {
    const admins = await db().select().from(user).where(and(eq(user.role, 'admin'), eq(user.deactivated, false)));
    expect(admins.length).toBe(1);
    await expect(updateUser(admins[0]!.id, { role: 'operator' }, admins[0]!.id)).rejects.toThrow(/last active admin/);
    await expect(updateUser(admins[0]!.id, { deactivated: true }, admins[0]!.id)).rejects.toThrow(/last active admin|own account/);
    const [still] = await db().select().from(user).where(eq(user.id, admins[0]!.id));
    expect([still!.role, still!.deactivated]).toEqual(['admin', false]);
  });
});
