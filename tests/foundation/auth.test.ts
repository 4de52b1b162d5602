import { and, eq, sql } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { QUEUES, SendMailPayload } from '~/jobs';
import { auth, authHandler, hashIdentifier } from '~/server/auth';
import { db } from '~/server/db/client';
import { session, signInFailures, user, verification } from '~/server/db/schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '~/server/demo-accounts';
import { sendMail } from '~/server/mail';
import { queue } from '~/server/queue';
import { AppError } from '~/server/errors';
import { inviteUser, updateUser } from '~/server/services/users';
import { describeIntegration, freshIp, waitForMail } from '../support/integration';

const BASE = () => process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4331';

/** A browser-like call through Lossline's auth route (its limits apply; they do not to auth.api). */
async function post(path: string, body: unknown, ip = freshIp(), cookie?: string) {
  const headers: Record<string, string> = { 'content-type': 'application/json', origin: BASE() };
  if (cookie) headers.cookie = cookie;
  const res = await authHandler(new Request(`${BASE()}/api/auth${path}`, { method: 'POST', headers, body: JSON.stringify(body) }), ip);
  const data = await res.json().catch(() => ({}));
  return { status: res.status, data, res };
}

const cookieOf = (res: Response) => res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');

// Password mails go out from the queue; no worker runs during these tests, so this file works it.
beforeAll(async () => {
  if (!process.env.DATABASE_URL) return;
  const boss = await queue();
  await boss.work(QUEUES.sendMail, { pollingIntervalSeconds: 0.5 }, async ([job]) => {
    await sendMail(SendMailPayload.parse(job!.data));
  });
});

async function sessionsOf(email: string) {
  const [u] = await db().select().from(user).where(eq(user.email, email));
  return db().select().from(session).where(eq(session.userId, u!.id));
}

const operator = DEMO_ACCOUNTS.find((a) => a.role === 'operator')!;
const admin = DEMO_ACCOUNTS.find((a) => a.role === 'admin')!;

/** The demo admin, signed in: whom updateUser acts as (the admin plugin checks its caller's session). */
async function actingAdmin() {
  const out = await post('/sign-in/email', { email: admin.email, password: DEMO_PASSWORD });
  expect(out.status).toBe(200);
  return { userId: out.data.user.id as string, headers: new Headers({ cookie: cookieOf(out.res), origin: BASE() }) };
}

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
    // A different (unknown) account each time, so only the per-address limit can refuse.
    for (let i = 0; i < limit + 1; i++) statuses.push((await post('/sign-in/email', { email: `guess-${Date.now()}-${i}@example.test`, password: 'wrong-' + i }, ip)).status);
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
    // Long enough but guessable: refused with the estimator's reason, and the link still works.
    const guessable = await post('/reset-password', { token, newPassword: 'aaaaaaaaaa' });
    expect([guessable.status, guessable.data.code]).toEqual([400, 'PASSWORD_TOO_WEAK']);
    expect(guessable.data.message).toMatch(/repeats the same character/);
    const common = await post('/reset-password', { token, newPassword: 'password123' });
    expect([common.status, common.data.code]).toEqual([400, 'PASSWORD_TOO_WEAK']);
    expect(common.data.message).toMatch(/most used passwords/);
    // The link is stored hashed: no row holds the token itself.
    const plain = await db().select().from(verification).where(sql`${verification.identifier} like ${'%' + token + '%'}`);
    expect(plain).toEqual([]);
    expect((await db().select().from(verification).where(eq(verification.identifier, hashIdentifier(`reset-password:${token}`)))).length).toBe(1);

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
    await db().update(verification).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(verification.identifier, hashIdentifier(`reset-password:${token2}`)));
    const expired = await post('/reset-password', { token: token2, newPassword: 'another-long-password' });
    expect([expired.status, expired.data.code]).toEqual([400, 'INVALID_TOKEN']);
    expect((await post('/sign-in/email', { email, password: 'a-good-long-password' })).status).toBe(200);

    await db().delete(user).where(eq(user.id, id));
  });

  it('refuses to invite an address that already has an account', async () => {
    await expect(inviteUser({ name: 'Again', email: operator.email, role: 'operator' }, 'x')).rejects.toThrow(AppError);
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

    await updateUser(id, { deactivated: true }, await actingAdmin());
    expect((await sessionsOf(email)).length).toBe(0);
    const [banned] = await db().select().from(user).where(eq(user.id, id));
    expect([banned!.deactivated, banned!.banReason, banned!.banExpires]).toEqual([true, 'Deactivated by a Lossline admin.', null]);
    const refused = await post('/sign-in/email', { email, password: 'temporary-password-1' });
    expect(refused.status).toBe(403);
    expect(refused.data.code).toBe('ACCOUNT_DEACTIVATED');

    await updateUser(id, { deactivated: false, role: 'energy-lead' }, await actingAdmin());
    const back = await post('/sign-in/email', { email, password: 'temporary-password-1' });
    expect(back.status).toBe(200);
    expect(back.data.user.role).toBe('energy-lead');
    await db().delete(user).where(eq(user.id, id));
  });

  it("the admin plugin's own routes are closed: no impersonation, bans or accounts around /api/admin/users", async () => {
    const me = await actingAdmin();
    const [op] = await db().select().from(user).where(eq(user.email, operator.email));
    for (const path of ['/admin/impersonate-user', '/admin/ban-user', '/admin/create-user', '/admin/set-role', '/admin/remove-user']) {
      const out = await post(path, { userId: op!.id, role: 'admin' }, freshIp(), me.headers.get('cookie')!);
      expect([path, out.status]).toEqual([path, 404]);
    }
    const [still] = await db().select().from(user).where(eq(user.id, op!.id));
    expect([still!.role, still!.deactivated]).toEqual(['operator', false]);
  });

  it('keeps at least one active admin and stops an admin deactivating themself', async () => {
    const admins = await db().select().from(user).where(and(eq(user.role, 'admin'), eq(user.deactivated, false)));
    expect(admins.length).toBe(1);
    await expect(updateUser(admins[0]!.id, { role: 'operator' }, { userId: admins[0]!.id, headers: new Headers() })).rejects.toThrow(/last active admin/);
    await expect(updateUser(admins[0]!.id, { deactivated: true }, { userId: admins[0]!.id, headers: new Headers() })).rejects.toThrow(/last active admin|own account/);
    const [still] = await db().select().from(user).where(eq(user.id, admins[0]!.id));
    expect([still!.role, still!.deactivated]).toEqual(['admin', false]);
  });
});

/** A person with a password, made directly (no mail round trip), for the tests below. */
async function personWithPassword(password: string, role: 'operator' | 'planner' = 'operator') {
  const { hashPassword } = await import('better-auth/crypto');
  const { account } = await import('~/server/db/schema');
  const id = crypto.randomUUID();
  const email = `p-${id.slice(0, 8)}@example.test`;
  await db().insert(user).values({ id, email, name: 'Test Person', role, emailVerified: true });
  await db().insert(account).values({ id: crypto.randomUUID(), accountId: id, providerId: 'credential', userId: id, password: await hashPassword(password) });
  return { id, email };
}

describeIntegration('client address and per-account pauses', () => {
  it('forty wrong passwords from forty made-up X-Forwarded-For addresses are limited as one address', async () => {
    const { clientAddressOf, parseTrustProxy, settleForwardedHeaders } = await import('~/server/client-ip');
    const limit = Number(process.env.SIGN_IN_LIMIT_PER_MINUTE ?? 5);
    const peer = `::ffff:${freshIp()}`; // the real connection, not a trusted proxy
    const statuses: number[] = [];
    for (let i = 0; i < 40; i++) {
      const headers: Record<string, string | undefined> = { 'x-forwarded-for': `198.51.100.${i + 1}` };
      const client = settleForwardedHeaders(headers, peer, parseTrustProxy(''));
      expect(headers['x-forwarded-for']).toBe(peer.replace('::ffff:', ''));
      statuses.push((await post('/sign-in/email', { email: `xff-${Date.now()}-${i}@example.test`, password: 'wrong-password' }, client)).status);
    }
    expect(statuses.filter((s) => s === 429).length).toBe(40 - limit);
    // From the named proxy, the forwarded address counts (the rightmost one the proxy did not add).
    const proxies = parseTrustProxy('10.9.0.1, 192.168.0.0/16');
    expect(clientAddressOf('10.9.0.1', '198.51.100.7, 192.168.4.4', proxies)).toBe('198.51.100.7');
    expect(clientAddressOf('::ffff:10.9.0.1', '6.6.6.6, 198.51.100.7', proxies)).toBe('198.51.100.7');
    expect(clientAddressOf('10.9.0.2', '198.51.100.7', proxies)).toBe('10.9.0.2');
    expect(() => parseTrustProxy('true')).toThrow(/not an IP address/);
  });

  it('pauses an account after five failures from any addresses, growing and capped; a success clears it', async () => {
    const { pauseAfterFailure } = await import('~/server/auth');
    // docs/design.md: free up to 5 failures, then 15 s doubling up to 5 minutes
    expect([1, 4, 5, 6, 7, 8, 20].map(pauseAfterFailure)).toEqual([0, 0, 15, 30, 60, 120, 300]);

    const p = await personWithPassword('pause-test-correct-horse');
    for (let i = 0; i < 5; i++) expect((await post('/sign-in/email', { email: p.email, password: `nope-${i}` }, freshIp())).status).toBe(401);
    const paused = await post('/sign-in/email', { email: p.email, password: 'pause-test-correct-horse' }, freshIp());
    expect([paused.status, paused.data.code]).toEqual([429, 'SIGN_IN_PAUSED']);
    expect(Number(paused.res.headers.get('retry-after'))).toBeGreaterThan(0);
    expect(Number(paused.res.headers.get('retry-after'))).toBeLessThanOrEqual(15);
    // Attempts during the pause do not lengthen it.
    await post('/sign-in/email', { email: p.email, password: 'nope-again' }, freshIp());
    const [row] = await db().select().from(signInFailures).where(eq(signInFailures.email, p.email));
    expect(row!.failures).toBe(5);
    // Once the pause has run out, the right password signs in and the count is cleared.
    await db().update(signInFailures).set({ pausedUntil: new Date(Date.now() - 1000) }).where(eq(signInFailures.email, p.email));
    expect((await post('/sign-in/email', { email: p.email, password: 'pause-test-correct-horse' }, freshIp())).status).toBe(200);
    expect(await db().select().from(signInFailures).where(eq(signInFailures.email, p.email))).toEqual([]);
    await db().delete(user).where(eq(user.id, p.id));
  });
});

describeIntegration('passwords, sessions and links', () => {
  it('the demo password passes the strength estimator; guessable ones do not', async () => {
    const { passwordProblem } = await import('~/server/password-strength');
    expect(passwordProblem(DEMO_PASSWORD)).toBeNull();
    expect(passwordProblem('aaaaaaaaaa')).toMatch(/repeats/);
    expect(passwordProblem('qwertyuiop1')).toMatch(/too easy to guess/);
  });

  it('a password change ends every other session and every outstanding reset link', async () => {
    const p = await personWithPassword('change-test-first-phrase');
    const a = await post('/sign-in/email', { email: p.email, password: 'change-test-first-phrase' });
    const b = await post('/sign-in/email', { email: p.email, password: 'change-test-first-phrase' });
    expect([a.status, b.status]).toEqual([200, 200]);
    await auth().api.requestPasswordReset({ body: { email: p.email, redirectTo: '/set-password' } });
    const mail = await waitForMail(p.email, 'new Lossline password');
    const link = mail.text.match(/reset-password\/([^?\s]+)/)![1]!;

    const weak = await post('/change-password', { currentPassword: 'change-test-first-phrase', newPassword: 'password1234' }, freshIp(), cookieOf(a.res));
    expect([weak.status, weak.data.code]).toEqual([400, 'PASSWORD_TOO_WEAK']);
    const changed = await post('/change-password', { currentPassword: 'change-test-first-phrase', newPassword: 'change-test-second-phrase' }, freshIp(), cookieOf(a.res));
    expect(changed.status).toBe(200);
    const left = await db().select().from(session).where(eq(session.userId, p.id));
    expect(left.length).toBe(1); // only the session that made the change (renewed)
    const bStill = await auth().api.getSession({ headers: new Headers({ cookie: cookieOf(b.res) }) });
    expect(bStill).toBeNull();
    const old = await post('/reset-password', { token: link, newPassword: 'change-test-third-phrase' });
    expect([old.status, old.data.code]).toEqual([400, 'INVALID_TOKEN']);
    await db().delete(user).where(eq(user.id, p.id));
  });

  it('a reset ends every session and the other outstanding links', async () => {
    const p = await personWithPassword('reset-test-first-phrase');
    expect((await post('/sign-in/email', { email: p.email, password: 'reset-test-first-phrase' })).status).toBe(200);
    await auth().api.requestPasswordReset({ body: { email: p.email, redirectTo: '/set-password' } });
    await auth().api.requestPasswordReset({ body: { email: p.email, redirectTo: '/set-password' } });
    const t0 = Date.now();
    let links: string[] = [];
    while (links.length < 2 && Date.now() - t0 < 10_000) {
      const { caughtMail } = await import('../support/integration');
      links = (await caughtMail()).filter((m) => m.to.includes(p.email)).map((m) => m.text.match(/reset-password\/([^?\s]+)/)![1]!);
      await new Promise((r) => setTimeout(r, 150));
    }
    expect(links.length).toBe(2);
    expect((await post('/reset-password', { token: links[0], newPassword: 'reset-test-second-phrase' })).status).toBe(200);
    expect(await db().select().from(session).where(eq(session.userId, p.id))).toEqual([]);
    const other = await post('/reset-password', { token: links[1], newPassword: 'reset-test-third-phrase' });
    expect([other.status, other.data.code]).toEqual([400, 'INVALID_TOKEN']);
    await db().delete(user).where(eq(user.id, p.id));
  });

  it('a reset request answers alike for known and unknown addresses and leaves the mail to the queue', async () => {
    const { RESET_REQUEST_FLOOR_MS } = await import('~/server/auth');
    const p = await personWithPassword('timing-test-first-phrase');
    const boss = await queue();
    await boss.offWork(QUEUES.sendMail); // hold the mail, to see it waiting in the queue
    try {
      const t1 = Date.now();
      const known = await post('/request-password-reset', { email: p.email, redirectTo: '/set-password' });
      const knownMs = Date.now() - t1;
      const t2 = Date.now();
      const unknown = await post('/request-password-reset', { email: `nobody-${Date.now()}@example.test`, redirectTo: '/set-password' });
      const unknownMs = Date.now() - t2;
      expect([known.status, unknown.status]).toEqual([200, 200]);
      expect(known.data).toEqual(unknown.data);
      expect(knownMs).toBeGreaterThanOrEqual(RESET_REQUEST_FLOOR_MS - 5);
      expect(unknownMs).toBeGreaterThanOrEqual(RESET_REQUEST_FLOOR_MS - 5);
      const queued = await db().execute<{ n: number }>(
        sql`select count(*)::int as n from pgboss.job where name = ${QUEUES.sendMail} and state = 'created' and data->>'to' = ${p.email}`,
      );
      expect(queued.rows[0]!.n).toBe(1);
    } finally {
      await boss.work(QUEUES.sendMail, { pollingIntervalSeconds: 0.5 }, async ([job]) => {
        await sendMail(SendMailPayload.parse(job!.data));
      });
    }
    await waitForMail(p.email, 'new Lossline password');
    await db().delete(user).where(eq(user.id, p.id));
  });

  it('a deactivated person’s API tokens stop working; reactivation brings them back', async () => {
    const { issueApiToken, resolveApiToken } = await import('~/server/tokens');
    const { sites } = await import('~/server/db/schema');
    const [adminRow] = await db().select().from(user).where(eq(user.email, admin.email));
    const p = await personWithPassword('token-test-first-phrase');
    await db().update(user).set({ role: 'admin' }).where(eq(user.id, p.id));
    // A site of its own: the test must not depend on another file having made one first.
    const [site] = await db().insert(sites).values({ name: `Token test site ${Date.now()}`, timeZone: 'UTC' }).returning();
    const t = await issueApiToken({ siteId: site!.id, name: 'nightly', role: 'operator', createdBy: p.id });
    expect(await resolveApiToken(`Bearer ${t.secret}`)).not.toBeNull();
    await updateUser(p.id, { deactivated: true }, await actingAdmin());
    expect(await resolveApiToken(`Bearer ${t.secret}`)).toBeNull();
    await updateUser(p.id, { deactivated: false }, await actingAdmin());
    expect(await resolveApiToken(`Bearer ${t.secret}`)).not.toBeNull();
    const { revokeApiToken } = await import('~/server/tokens');
    await revokeApiToken(t.id);
    await db().delete(user).where(eq(user.id, p.id));
    await db().delete(sites).where(eq(sites.id, site!.id));
  });

  it('sets the Secure cookie flag whenever the base URL is https', async () => {
    const { createAuth } = await import('~/server/auth');
    const { env } = await import('~/server/env');
    const signIn = (a: ReturnType<typeof createAuth>) => a.api.signInEmail({ body: { email: operator.email, password: DEMO_PASSWORD }, asResponse: true });
    const https = await signIn(createAuth({ ...env(), PUBLIC_BASE_URL: 'https://lossline.example' }));
    const http = await signIn(createAuth({ ...env(), PUBLIC_BASE_URL: 'http://127.0.0.1:4331' }));
    expect(https.headers.getSetCookie().every((c) => /;\s*Secure/i.test(c))).toBe(true);
    expect(http.headers.getSetCookie().some((c) => /;\s*Secure/i.test(c))).toBe(false);
  });

  it('caps names: a 2,000,000-character or NUL-bearing name is refused, and people cannot rename themselves', async () => {
    const { InviteInput } = await import('~/server/services/users');
    expect(InviteInput.safeParse({ name: 'x'.repeat(2_000_000), email: 'long@example.test', role: 'operator' }).success).toBe(false);
    expect(InviteInput.safeParse({ name: 'Nul\u0000Name', email: 'nul@example.test', role: 'operator' }).success).toBe(false);
    const a = await post('/sign-in/email', { email: operator.email, password: DEMO_PASSWORD });
    const rename = await post('/update-user', { name: 'x'.repeat(5000) }, freshIp(), cookieOf(a.res));
    expect(rename.status).toBe(404);
    const [row] = await db().select().from(user).where(eq(user.email, operator.email));
    expect(row!.name.length).toBeLessThan(200);
  });
});
