import { randomUUID } from 'node:crypto';
import { and, asc, eq, inArray, ne, sql } from 'drizzle-orm';
import { z } from 'zod';
import { InviteInput, SitesInput } from '~/lib/people';
import { ROLES, type Role } from '~/lib/roles';
import { auth } from '../auth';
import { db } from '../db/client';
import { AppError } from '../errors';
import { invitations, personSites, sites, user, verification } from '../db/schema';

export { InviteInput, SitesInput };
export const UpdateUserInput = z
  .object({ role: z.enum(ROLES).optional(), deactivated: z.boolean().optional(), sites: SitesInput.optional() })
  .refine((v) => v.role !== undefined || v.deactivated !== undefined || v.sites !== undefined, 'Send a role, deactivated, sites, or any of them.');

export async function listUsers() {
  const rows = await db()
    .select({
      id: user.id,
      name: user.name,
      email: user.email,
      role: user.role,
      deactivated: user.deactivated,
      allSites: user.allSites,
      createdAt: user.createdAt,
      invitedAt: invitations.sentAt,
      acceptedAt: invitations.acceptedAt,
    })
    .from(user)
    .leftJoin(invitations, eq(invitations.userId, user.id))
    .orderBy(asc(user.name));
  const grants = await db().select().from(personSites);
  return rows.map(({ allSites, ...r }) => ({
    ...r,
    pending: r.invitedAt !== null && r.acceptedAt === null,
    // Admins have every site whatever is stored.
    sites: r.role === 'admin' || allSites ? ('all' as const) : grants.filter((g) => g.userId === r.id).map((g) => g.siteId),
  }));
}

type Tx = Parameters<Parameters<ReturnType<typeof db>['transaction']>[0]>[0];

async function setSites(tx: Tx, userId: string, value: z.infer<typeof SitesInput>): Promise<void> {
  await tx.delete(personSites).where(eq(personSites.userId, userId));
  if (value === 'all') {
    await tx.update(user).set({ allSites: true }).where(eq(user.id, userId));
    return;
  }
  const ids = [...new Set(value)];
  if (ids.length) {
    const known = await tx.select({ id: sites.id }).from(sites).where(inArray(sites.id, ids));
    if (known.length !== ids.length) throw new AppError('NOT_FOUND', 'One of the sites given does not exist.');
    await tx.insert(personSites).values(ids.map((siteId) => ({ userId, siteId })));
  }
  await tx.update(user).set({ allSites: false }).where(eq(user.id, userId));
}

/**
 * Invites a person: creates the account without a password and mails a link (a better-auth reset
 * token) through which they set one. The e-mail goes to SMTP_URL (the local catcher here).
 */
export async function inviteUser(input: z.infer<typeof InviteInput>, invitedBy: string) {
  const existing = await db().select({ id: user.id }).from(user).where(eq(user.email, input.email)).limit(1);
  if (existing.length) throw new AppError('CONFLICT', `${input.email} already has an account.`);
  const id = randomUUID();
  const [count] = await db().select({ n: sql<number>`count(*)::int` }).from(sites);
  const scope = input.sites ?? ((count?.n ?? 0) <= 1 ? 'all' : []);
  await db().transaction(async (tx) => {
    await tx.insert(user).values({ id, name: input.name, email: input.email, role: input.role, emailVerified: false });
    await tx.insert(invitations).values({ userId: id, invitedBy });
    await setSites(tx, id, scope);
  });
  await auth().api.requestPasswordReset({ body: { email: input.email, redirectTo: '/set-password' } });
  return { id };
}

/**
 * Sends an invitation again (the first mail lost, or its link expired): the outstanding links end,
 * the invitation is dated now and a new link goes out. Only for an invitation not yet accepted, of
 * an account that is not deactivated.
 */
export async function resendInvitation(userId: string) {
  const [row] = await db()
    .select({ email: user.email, deactivated: user.deactivated, invitationId: invitations.id, acceptedAt: invitations.acceptedAt })
    .from(user)
    .leftJoin(invitations, eq(invitations.userId, user.id))
    .where(eq(user.id, userId))
    .limit(1);
  if (!row) throw new AppError('NOT_FOUND', 'No such account.');
  if (!row.invitationId) throw new AppError('CONFLICT', `${row.email} was not invited through Lossline, so there is no invitation to send again.`);
  if (row.deactivated) throw new AppError('CONFLICT', 'This account is deactivated: activate it before inviting the person again.');
  if (row.acceptedAt !== null) throw new AppError('CONFLICT', `${row.email} has already accepted the invitation and set a password; they can ask for a new password on the sign-in page.`);
  await db().transaction(async (tx) => {
    // The value of a password link is the account id: the old links stop working.
    await tx.delete(verification).where(eq(verification.value, userId));
    await tx.update(invitations).set({ sentAt: new Date() }).where(eq(invitations.userId, userId));
  });
  await auth().api.requestPasswordReset({ body: { email: row.email, redirectTo: '/set-password' } });
  return { sentTo: row.email };
}

async function adminCount(exceptUserId: string): Promise<number> {
  const [row] = await db()
    .select({ n: sql<number>`count(*)::int` })
    .from(user)
    .where(and(eq(user.role, 'admin'), eq(user.deactivated, false), ne(user.id, exceptUserId)));
  return row?.n ?? 0;
}

/**
 * Changes a role or sites, or (de)activates an account. Deactivation is better-auth's admin plugin
 * ban (no expiry), which ends the person's sessions at once; reactivation is its unban. Both are
 * called with the acting admin's request headers (their session), as the plugin checks its caller.
 */
export async function updateUser(userId: string, input: z.infer<typeof UpdateUserInput>, acting: { userId: string; headers: Headers }) {
  const actingUserId = acting.userId;
  const [target] = await db().select().from(user).where(eq(user.id, userId)).limit(1);
  if (!target) throw new AppError('NOT_FOUND', 'No such account.');
  const losesAdmin =
    target.role === 'admin' && !target.deactivated && ((input.role && input.role !== 'admin') || input.deactivated === true);
  if (losesAdmin && (await adminCount(userId)) === 0) {
    throw new AppError('CONFLICT', 'This is the last active admin: make someone else admin first.');
  }
  if (userId === actingUserId && input.deactivated) {
    throw new AppError('CONFLICT', 'You cannot deactivate your own account.');
  }
  const patch: Partial<{ role: Role; updatedAt: Date }> = { updatedAt: new Date() };
  if (input.role) patch.role = input.role;
  await db().transaction(async (tx) => {
    await tx.update(user).set(patch).where(eq(user.id, userId));
    if (input.sites !== undefined) await setSites(tx, userId, input.sites);
  });
  if (input.deactivated === true && !target.deactivated) {
    await auth().api.banUser({ body: { userId, banReason: DEACTIVATION_REASON }, headers: acting.headers });
  } else if (input.deactivated === false && target.deactivated) {
    await auth().api.unbanUser({ body: { userId }, headers: acting.headers });
  }
}

/** The reason stored with a deactivation (the plugin's banReason). */
const DEACTIVATION_REASON = 'Deactivated by a Lossline admin.';
