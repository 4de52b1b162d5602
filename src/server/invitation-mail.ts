import { asc, eq } from 'drizzle-orm';
import { ROLE_LABELS, isRole } from '~/lib/roles';
import { db } from './db/client';
import { invitations, personSites, sites, user } from './db/schema';
import { escapeHtml, type OutgoingMail } from './mail';

/** Who invited a person, to which role and which sites, in words for the invitation mail. */
export interface InvitationWords {
  invitedBy: string | null;
  role: string;
  sites: string;
}

/**
 * The invitation of an account not yet accepted, or null when there is none (then a password mail is
 * a reset). Sites read as "every site" for an admin or a person given all of them.
 */
export async function invitationWords(userId: string): Promise<InvitationWords | null> {
  const [row] = await db()
    .select({ acceptedAt: invitations.acceptedAt, invitedBy: invitations.invitedBy, role: user.role, allSites: user.allSites })
    .from(invitations)
    .innerJoin(user, eq(user.id, invitations.userId))
    .where(eq(invitations.userId, userId))
    .limit(1);
  if (!row || row.acceptedAt) return null;
  const [by] = row.invitedBy ? await db().select({ name: user.name }).from(user).where(eq(user.id, row.invitedBy)).limit(1) : [];
  const named = await db()
    .select({ name: sites.name })
    .from(personSites)
    .innerJoin(sites, eq(sites.id, personSites.siteId))
    .where(eq(personSites.userId, userId))
    .orderBy(asc(sites.name));
  const everySite = row.role === 'admin' || row.allSites;
  return {
    invitedBy: by?.name ?? null,
    role: isRole(row.role) ? ROLE_LABELS[row.role].toLowerCase() : row.role,
    sites: everySite ? 'every site' : named.length ? named.map((s) => s.name).join(', ') : 'no site yet (an admin gives you sites)',
  };
}

/** The sentence that opens an invitation: who invited, to which role, for which sites. */
export function invitationIntro(w: InvitationWords): string {
  const who = w.invitedBy ? `${w.invitedBy} has invited you` : 'You have been invited';
  return `${who} to Lossline as ${w.role}, for ${w.sites}. Lossline keeps your plant's hourly exergy balances. Set your password to sign in:`;
}

/** The mail with a password link: an invitation (with its words) or a reset. */
export function passwordMail(invite: InvitationWords | null, to: string, name: string, url: string, validHours: number): OutgoingMail {
  const intro = invite
    ? invitationIntro(invite)
    : `Someone (hopefully you) asked to set a new Lossline password for this address. Choose one here:`;
  const subject = invite ? 'Your Lossline invitation' : 'Set a new Lossline password';
  const note = `The link works once and expires in ${validHours} hours. If you did not expect this e-mail, ignore it.`;
  return {
    to,
    subject,
    text: `Hello ${name},\n\n${intro}\n\n${url}\n\n${note}\n`,
    html: `<p>Hello ${escapeHtml(name)},</p><p>${escapeHtml(intro)}</p><p><a href="${escapeHtml(url)}">${escapeHtml(url)}</a></p><p>${note}</p>`,
  };
}
