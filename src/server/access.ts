import { eq, sql, type SQL } from 'drizzle-orm';
import type { Role } from '../lib/roles';
import { db } from './db/client';
import { personSites, user } from './db/schema';
import { cachedHours } from './hours-cache';

/**
 * Access by site. Admins have every site. Everyone else has either every site (user.all_sites, the
 * default: on a one-site install that is simply the site) or exactly the sites an admin listed for
 * them on the people page (person_sites). A site API token has its own site only.
 *
 * "Every site" includes sites added later: when a second site is added, people on "every site" see
 * it too, until an admin narrows them to a list (the people page marks who is on every site).
 */
export type SiteScope = 'all' | readonly string[];

export async function siteScopeFor(person: { id: string; role: Role; allSites?: boolean }): Promise<SiteScope> {
  if (person.role === 'admin' || person.allSites !== false) return 'all';
  const rows = await db().select({ siteId: personSites.siteId }).from(personSites).where(eq(personSites.userId, person.id));
  return rows.map((r) => r.siteId);
}

/**
 * A condition on the user table: the person may use this site (admins and people on every site, or a
 * person_sites row). Used where mail goes to people about one site's notices.
 */
export function personMayUseSite(siteId: string | SQL) {
  return sql`(${user.role} = 'admin' or ${user.allSites} or exists (select 1 from ${personSites} where ${personSites.userId} = ${user.id} and ${personSites.siteId} = ${siteId}))`;
}

/** The sites the caller may use: a token's own site, a person's scope, or none. */
export function scopeOf(locals: App.Locals): SiteScope {
  if (locals.user) return locals.sites ?? 'all';
  if (locals.apiToken) return [locals.apiToken.siteId];
  return [];
}

export function canUseSite(locals: App.Locals, siteId: string): boolean {
  const scope = scopeOf(locals);
  return scope === 'all' || scope.includes(siteId);
}

/** Keeps the entries of a list that belong to sites the caller may use. */
export function visibleToCaller<T>(locals: App.Locals, list: readonly T[], siteOf: (item: T) => string = (i) => (i as { id: string }).id): T[] {
  const scope = scopeOf(locals);
  return scope === 'all' ? [...list] : list.filter((i) => scope.includes(siteOf(i)));
}

export const UUID_RE = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Ids come from URLs: anything that is not a UUID is simply not found. */
export function isId(id: unknown): id is string {
  return typeof id === 'string' && UUID_RE.test(id);
}

/**
 * How a route parameter leads to its site: the SQL that finds the site of the thing the parameter
 * names. Parameters not listed here are not tied to a site (a person's id, an hour, a month).
 */
const SITE_OF: Record<string, (id: string) => ReturnType<typeof sql>> = {
  siteId: (id) => sql`select id as site_id from sites where id = ${id}`,
  unitId: (id) => sql`select site_id from plant_units where id = ${id}`,
  uploadId: (id) => sql`select site_id from uploads where id = ${id}`,
  baselineId: (id) => sql`select u.site_id from baselines b join plant_units u on u.id = b.unit_id where b.id = ${id}`,
  noticeId: (id) => sql`select site_id from drift_notices where id = ${id}`,
  tokenId: (id) => sql`select site_id from api_tokens where id = ${id}`,
  portId: (id) => sql`select u.site_id from plant_ports p join plant_units u on u.id = p.unit_id where p.id = ${id}`,
  linkId: (id) => sql`select site_id from tag_links where id = ${id}`,
};

/** Parameters that name a row by UUID (a malformed one is answered 404 before any query). */
export const UUID_PARAMS = new Set(Object.keys(SITE_OF));

/**
 * Parameters whose site is kept in the read cache (src/server/hours-cache.ts): their rows and the rows
 * their lookup joins notify it at every change (plant units, sites, baselines), so the guard's
 * unit-to-site query runs once per unit, not once per request.
 */
const CACHED_SITE_OF = new Set(['siteId', 'unitId', 'baselineId']);

/** The site a parameter's thing belongs to; null when no such thing; undefined when not site-bound. */
export async function siteOfParam(name: string, value: string): Promise<string | null | undefined> {
  const q = SITE_OF[name];
  if (!q) return undefined;
  if (!UUID_RE.test(value)) return null;
  const find = async () => (await db().execute<{ site_id: string }>(q(value))).rows[0]?.site_id ?? null;
  return CACHED_SITE_OF.has(name) ? cachedHours(`site-of:${name}:${value.toLowerCase()}`, find) : find();
}
