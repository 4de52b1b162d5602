/**
 * Who is asking: the guard's session lookup (better-auth's getSession, then the person's sites),
 * kept in the web process's memory by session cookie (src/server/hours-cache.ts cachedAccess).
 *
 * Without it every request costs better-auth's session and user queries and the site-list query.
 * With it, 50 people asking at once cost one lookup each until something about people changes: the
 * database notifies ACCESS_CHANNEL at the commit of any change to a person (role, deactivation), a
 * session (ended, refreshed) or a site list (migration web-access-cache), and each notification
 * empties the cache. So a deactivated person (the admin plugin's ban also deletes their sessions)
 * loses access with their next request after the commit's notification, not after some max age;
 * entries are kept 60 s at most in any case (ACCESS_MAX_AGE_MS), and while the listening connection
 * is down nothing is kept at all (docs/design.md "Sign-in and sessions").
 */
import { isRole, type Role } from '../lib/roles';
import { siteScopeFor, type SiteScope } from './access';
import { auth } from './auth';
import { cachedAccess } from './hours-cache';

export interface SignedIn {
  user: { id: string; name: string; email: string; role: Role };
  session: { id: string; expiresAt: Date };
  sites: SiteScope;
}

/** The session token cookie (better-auth's name, with the __Secure- prefix on https). */
const SESSION_COOKIE = /(?:^|;\s*)((?:__Secure-)?better-auth\.session_token=[^;]*)/;

/** The session cookie of a request: the key of the cache (the token with its signature). */
export function sessionCookieOf(headers: Headers): string | null {
  const m = SESSION_COOKIE.exec(headers.get('cookie') ?? '');
  return m ? m[1]! : null;
}

async function lookUp(headers: Headers): Promise<SignedIn | null> {
  const found = await auth().api.getSession({ headers }).catch(() => null);
  if (!found?.user || found.user.banned) return null;
  const role = found.user.role;
  const user = { id: found.user.id, name: found.user.name, email: found.user.email, role: isRole(role) ? role : ('operator' as Role) };
  const sites = await siteScopeFor({ ...user, allSites: (found.user as { allSites?: boolean }).allSites });
  return { user, session: { id: found.session.id, expiresAt: found.session.expiresAt }, sites };
}

/** The signed-in person of a request with their sites, or null (anonymous, ended, expired or deactivated). */
export async function signedIn(headers: Headers, nowMs = Date.now()): Promise<SignedIn | null> {
  const cookie = sessionCookieOf(headers);
  if (!cookie) return lookUp(headers);
  const found = await cachedAccess(cookie, () => lookUp(new Headers({ cookie })));
  if (!found) return null;
  // A session that expired since it was kept is looked up afresh (better-auth ends it).
  if (found.session.expiresAt.getTime() <= nowMs) return lookUp(headers);
  return { user: { ...found.user }, session: { ...found.session }, sites: found.sites };
}
