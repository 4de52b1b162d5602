import { eq } from 'drizzle-orm';
import { beforeAll, expect, it } from 'vitest';
import { QUEUES, SendMailPayload } from '~/jobs';
import { db } from '~/server/db/client';
import { sites, user, verification } from '~/server/db/schema';
import { DEMO_ACCOUNTS } from '~/server/demo-accounts';
import { AppError } from '~/server/errors';
import { guard } from '~/server/guard';
import { sendMail } from '~/server/mail';
import { queue } from '~/server/queue';
import { issueApiToken, revokeApiToken } from '~/server/tokens';
import { inviteUser, resendInvitation } from '~/server/services/users';
import { caughtMail, describeIntegration, waitForMail } from '../support/integration';

const BASE = () => process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:4331';
const admin = DEMO_ACCOUNTS.find((a) => a.role === 'admin')!;

// Invitation mails go out from the queue; no worker runs during these tests, so this file works it.
beforeAll(async () => {
  if (!process.env.DATABASE_URL) return;
  const boss = await queue();
  await boss.work(QUEUES.sendMail, { pollingIntervalSeconds: 0.5 }, async ([job]) => {
    await sendMail(SendMailPayload.parse(job!.data));
  });
});

/** A request through the guard alone, as a script with a bearer token sends it. */
async function asScript(path: string, secret: string) {
  const url = new URL(path, BASE());
  const request = new Request(url, { headers: { authorization: `Bearer ${secret}` } });
  const ctx = { request, url, params: {}, locals: {} as App.Locals, redirect: (p: string, s = 302) => new Response(null, { status: s, headers: { location: p } }) };
  return guard(ctx as never, async () => Response.json({ reached: true }));
}

describeIntegration('invitations say who invited, to what; they can be sent again', () => {
  it('the invitation mail names the admin who invited, the role and the site', async () => {
    const [adminRow] = await db().select().from(user).where(eq(user.email, admin.email));
    const [site] = await db().insert(sites).values({ name: `Invite site ${Date.now()}`, timeZone: 'UTC' }).returning();
    const email = `invited-${Date.now()}@example.test`;
    const { id } = await inviteUser({ name: 'Ivo Invited', email, role: 'energy-lead', sites: [site!.id] }, adminRow!.id);
    const mail = await waitForMail(email, 'invitation');
    expect(mail.text).toContain(`${adminRow!.name} has invited you to Lossline as energy lead, for ${site!.name}.`);
    await db().delete(user).where(eq(user.id, id));
    await db().delete(sites).where(eq(sites.id, site!.id));
  });

  it('resending ends the first link and mails a new one; an accepted invitation is not sent again', async () => {
    const [adminRow] = await db().select().from(user).where(eq(user.email, admin.email));
    const email = `resent-${Date.now()}@example.test`;
    const { id } = await inviteUser({ name: 'Rita Resent', email, role: 'planner', sites: 'all' }, adminRow!.id);
    const first = await waitForMail(email, 'invitation');
    expect(first.text).toContain('as maintenance planner, for every site.');
    expect(await db().select().from(verification).where(eq(verification.value, id))).toHaveLength(1);
    const before = (await caughtMail()).filter((m) => m.to.includes(email)).length;
    expect(await resendInvitation(id)).toEqual({ sentTo: email });
    const t0 = Date.now();
    while ((await caughtMail()).filter((m) => m.to.includes(email)).length === before && Date.now() - t0 < 10_000) await new Promise((r) => setTimeout(r, 150));
    const mails = (await caughtMail()).filter((m) => m.to.includes(email));
    expect(mails).toHaveLength(before + 1);
    const links = mails.map((m) => m.text.match(/reset-password\/([^?\s]+)/)![1]);
    expect(new Set(links).size).toBe(mails.length);
    // Only the new link is stored: the first no longer works.
    expect(await db().select().from(verification).where(eq(verification.value, id))).toHaveLength(1);
    await db().update(user).set({ deactivated: true }).where(eq(user.id, id));
    await expect(resendInvitation(id)).rejects.toThrow(/deactivated/);
    await db().delete(user).where(eq(user.id, id));
    await expect(resendInvitation(id)).rejects.toBeInstanceOf(AppError);
  });

  it('an account that signed in long ago has no invitation to resend', async () => {
    const [adminRow] = await db().select().from(user).where(eq(user.email, admin.email));
    await expect(resendInvitation(adminRow!.id)).rejects.toThrow(AppError);
  });
});

describeIntegration('a revoked API token is told so', () => {
  it("answers 401 in the API's error shape saying the token was revoked and when, in the site's clock", async () => {
    const [site] = await db().insert(sites).values({ name: `Revoked token site ${Date.now()}`, timeZone: 'Europe/London' }).returning();
    const t = await issueApiToken({ siteId: site!.id, name: 'nightly export', role: 'operator', createdBy: null });
    const path = `/api/v1/uploads/${crypto.randomUUID()}`;
    expect((await asScript(path, t.secret)).status).not.toBe(401);
    await revokeApiToken(t.id);
    const res = await asScript(path, t.secret);
    expect(res.status).toBe(401);
    const body = await res.json();
    expect(Object.keys(body)).toEqual(['error']);
    expect(body.error.code).toBe('UNAUTHENTICATED');
    expect(body.error.message).toMatch(/^The API token "nightly export" \(llt_\S+…\) was revoked on \d{4}-\d{2}-\d{2} \d{2}:\d{2} \(Europe\/London\) and no longer works/);
    const made = await asScript(path, 'llt_not-a-token-anyone-issued');
    expect((await made.json()).error.message).toMatch(/not one Lossline issued/);
    await db().delete(sites).where(eq(sites.id, site!.id));
  });
});
