/**
 * The guard's session lookup kept in memory (src/server/session-lookup.ts, cachedAccess of
 * src/server/hours-cache.ts) on a real database: a second request of the same session reads no
 * session or user row, and what an admin changes (a deactivation, a role, a site list) applies to the
 * very next request once the commit's notification is in: the documented bound is the notification,
 * not a max age (docs/design.md "Sign-in and sessions").
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, expect, it, vi } from 'vitest';
import { hashPassword } from 'better-auth/crypto';
import { eq } from 'drizzle-orm';
import { auth } from '~/server/auth';
import { db } from '~/server/db/client';
import { account, user } from '~/server/db/schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '~/server/demo-accounts';
import { guard } from '~/server/guard';
import { ACCESS_MAX_AGE_MS, accessGeneration, hoursCacheLive, startHoursCache, stopHoursCache } from '~/server/hours-cache';
import { updateUser } from '~/server/services/users';
import { describeIntegration } from '../support/integration';
import { queriesSent } from '../support/queries';

const BASE = () => process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4331';
const PASSWORD = 'session-cache-test-1';
const cookieOf = (res: Response) => res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');

/** Counts the queries that read better-auth's session or user table while `run` runs. */
async function sessionQueries(run: () => Promise<unknown>): Promise<number> {
  return (await queriesSent((q) => /from "(session|user)"/.test(q.text), run)).length;
}

/** The guard's verdict on a request of `cookie` to an energy lead's API route (299: let through). */
async function statusOf(cookie: string, path = '/api/sites/00000000-0000-4000-8000-000000000000/reports'): Promise<{ status: number; locals: App.Locals }> {
  const url = new URL(path, BASE());
  const locals = {} as App.Locals;
  const res = await guard(
    { request: new Request(url, { headers: { cookie } }), url, locals, redirect: (p, s) => new Response(null, { status: s ?? 302, headers: { location: p } }) },
    async () => new Response('reached', { status: 299 }),
  );
  return { status: res.status, locals };
}

describeIntegration('the guard’s session cache', () => {
  let personId = '';
  let cookie = '';
  let acting: { userId: string; headers: Headers };

  beforeAll(async () => {
    await startHoursCache();
    personId = randomUUID();
    const email = `session-cache-${personId.slice(0, 8)}@example.test`;
    await db().insert(user).values({ id: personId, email, name: 'Sam Session', role: 'energy-lead', emailVerified: true });
    await db().insert(account).values({ id: randomUUID(), accountId: personId, providerId: 'credential', userId: personId, password: await hashPassword(PASSWORD) });
    const signIn = await auth().api.signInEmail({ body: { email, password: PASSWORD }, asResponse: true });
    expect(signIn.status).toBe(200);
    cookie = cookieOf(signIn);
    const admin = DEMO_ACCOUNTS.find((a) => a.role === 'admin')!;
    const adminIn = await auth().api.signInEmail({ body: { email: admin.email, password: DEMO_PASSWORD }, asResponse: true });
    const [adminRow] = await db().select().from(user).where(eq(user.email, admin.email));
    acting = { userId: adminRow!.id, headers: new Headers({ cookie: cookieOf(adminIn), origin: BASE() }) };
  });
  afterAll(async () => {
    await db().delete(user).where(eq(user.id, personId));
    await stopHoursCache();
  });

  it('answers a signed-in person’s next request without reading sessions or people', async () => {
    expect(hoursCacheLive()).toBe(true);
    expect(ACCESS_MAX_AGE_MS).toBeLessThanOrEqual(60_000);
    const first = await statusOf(cookie);
    expect(first.status).toBe(299);
    expect(first.locals.user).toMatchObject({ id: personId, role: 'energy-lead' });
    let again = { status: 0, locals: {} as App.Locals };
    expect(await sessionQueries(async () => (again = await statusOf(cookie)))).toBe(0);
    expect(again.status).toBe(299);
    expect(again.locals.user).toEqual(first.locals.user);
    // Another cookie (a forged signature) is not the kept one: looked up, and refused.
    expect((await statusOf(cookie.replace(/.$/, (c) => (c === 'A' ? 'B' : 'A')))).status).toBe(401);
  });

  it('a role change applies to the next request once its commit is notified', async () => {
    expect((await statusOf(cookie)).status).toBe(299);
    const before = accessGeneration();
    await updateUser(personId, { role: 'operator' }, acting);
    await vi.waitFor(() => expect(accessGeneration()).toBeGreaterThan(before), { timeout: 2000 });
    const after = await statusOf(cookie);
    expect(after.locals.user?.role).toBe('operator');
    // Reports are for admins and energy leads, not operators.
    expect(after.status).toBe(403);
    await updateUser(personId, { role: 'energy-lead' }, acting);
    await vi.waitFor(async () => expect((await statusOf(cookie)).status).toBe(299), { timeout: 2000 });
  });

  it('a deactivated person loses access within the notification of the commit (well under the 60 s backstop)', async () => {
    expect(await sessionQueries(async () => expect((await statusOf(cookie)).status).toBe(299))).toBe(0);
    const t0 = Date.now();
    await updateUser(personId, { deactivated: true }, acting);
    await vi.waitFor(async () => expect((await statusOf(cookie)).status).toBe(401), { timeout: 2000, interval: 20 });
    expect(Date.now() - t0).toBeLessThan(2000);
    // And stays out.
    expect((await statusOf(cookie)).status).toBe(401);
    await updateUser(personId, { deactivated: false }, acting);
  });
});
