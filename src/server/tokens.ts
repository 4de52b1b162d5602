import { randomBytes } from 'node:crypto';
import { sha256Hex } from '~/lib/engine/hash';
import { and, eq, isNull, or } from 'drizzle-orm';
import { isRole, type Role } from '../lib/roles';
import { db } from './db/client';
import { apiTokens, sites, user } from './db/schema';
import { siteStampWithZone } from '~/lib/site-time';

const PREFIX = 'llt_';

export function hashToken(secret: string): string {
  return sha256Hex(secret);
}

/** Issues a token for a site; the secret is returned once and only its hash is stored. */
export async function issueApiToken(opts: { siteId: string; name: string; role: 'operator' | 'admin'; createdBy: string | null }) {
  const secret = PREFIX + randomBytes(24).toString('base64url');
  const [row] = await db()
    .insert(apiTokens)
    .values({ siteId: opts.siteId, name: opts.name, role: opts.role, createdBy: opts.createdBy, tokenHash: hashToken(secret), prefix: secret.slice(0, 10) })
    .returning({ id: apiTokens.id });
  return { id: row!.id, secret };
}

export async function revokeApiToken(id: string): Promise<boolean> {
  const out = await db().update(apiTokens).set({ revokedAt: new Date() }).where(and(eq(apiTokens.id, id), isNull(apiTokens.revokedAt))).returning({ id: apiTokens.id });
  return out.length > 0;
}

/**
 * Resolves an Authorization header to a live token, or null. A token stops working when it is
 * revoked or when the person who issued it is deactivated (tokens issued by no person, e.g. by a
 * script, depend only on revocation).
 */
export async function resolveApiToken(header: string | null): Promise<{ id: string; siteId: string; role: Role } | null> {
  const m = header?.match(/^Bearer\s+(\S+)$/i);
  if (!m || !m[1]!.startsWith(PREFIX)) return null;
  const [hit] = await db()
    .select({ token: apiTokens })
    .from(apiTokens)
    .leftJoin(user, eq(user.id, apiTokens.createdBy))
    .where(and(eq(apiTokens.tokenHash, hashToken(m[1]!)), isNull(apiTokens.revokedAt), or(isNull(apiTokens.createdBy), eq(user.deactivated, false))))
    .limit(1);
  const row = hit?.token;
  if (!row) return null;
  void db().update(apiTokens).set({ lastUsedAt: new Date() }).where(eq(apiTokens.id, row.id)).catch(() => undefined);
  return { id: row.id, siteId: row.siteId, role: isRole(row.role) ? row.role : 'operator' };
}

/**
 * Why a bearer token that does not resolve is refused, in words for its 401: revoked (and when),
 * its issuer deactivated, or not a token Lossline issued. Null when the header carries no bearer
 * token at all (then the answer is the plain "sign in first").
 */
export async function tokenRefusal(header: string | null): Promise<string | null> {
  const m = header?.match(/^Bearer\s+(\S+)$/i);
  if (!m) return null;
  const unknown = 'This API token is not valid: it is not one Lossline issued (check that it was copied whole). An admin issues tokens on the API tokens page.';
  if (!m[1]!.startsWith(PREFIX)) return unknown;
  const [hit] = await db()
    .select({ name: apiTokens.name, prefix: apiTokens.prefix, revokedAt: apiTokens.revokedAt, deactivated: user.deactivated, timeZone: sites.timeZone })
    .from(apiTokens)
    .innerJoin(sites, eq(sites.id, apiTokens.siteId))
    .leftJoin(user, eq(user.id, apiTokens.createdBy))
    .where(eq(apiTokens.tokenHash, hashToken(m[1]!)))
    .limit(1);
  if (!hit) return unknown;
  const which = `The API token "${hit.name}" (${hit.prefix}…)`;
  if (hit.revokedAt) return `${which} was revoked on ${siteStampWithZone(hit.revokedAt, hit.timeZone)} and no longer works. Ask an admin for a new token.`;
  if (hit.deactivated) return `${which} stopped working because the person who issued it is deactivated. Ask an admin for a new token.`;
  return unknown;
}
