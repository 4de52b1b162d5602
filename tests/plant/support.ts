import { randomUUID } from 'node:crypto';
import { and, eq, inArray, sql } from 'drizzle-orm';
import { db } from '~/server/db/client';
import { plantPorts, plantUnits, sites, tagLinks, tags } from '~/server/db/schema';

/** A site name no other test run uses. */
export const uniqueName = (what: string) => `${what} ${randomUUID().slice(0, 8)}`;

/** Recompute jobs queued for a site, oldest first. */
export async function recomputeJobs(siteId: string): Promise<{ siteId: string; fromMs: number; toMs: number; unitIds?: string[] }[]> {
  const res = await db().execute<{ data: { siteId: string; fromMs: number; toMs: number; unitIds?: string[] } }>(
    sql`select data from pgboss.job where name = 'compute-unit-hours' and data->>'siteId' = ${siteId} order by created_on, id`,
  );
  return res.rows.map((r) => r.data);
}

/** Everything of a site's model in the database, for "nothing changed" checks. */
export async function siteSnapshot(siteId: string) {
  const [site] = await db().select().from(sites).where(eq(sites.id, siteId));
  const units = await db().select().from(plantUnits).where(eq(plantUnits.siteId, siteId)).orderBy(plantUnits.id);
  const ports = units.length ? await db().select().from(plantPorts).where(inArray(plantPorts.unitId, units.map((u) => u.id))).orderBy(plantPorts.id) : [];
  const links = await db().select().from(tagLinks).where(eq(tagLinks.siteId, siteId)).orderBy(tagLinks.id);
  const tagRows = await db().select().from(tags).where(eq(tags.siteId, siteId)).orderBy(tags.id);
  const jobs = await recomputeJobs(siteId);
  return { site, units, ports, links, tags: tagRows, jobs };
}

/** Tags as ingest creates them (unlinked, with the unit text of the export). */
export async function addTags(siteId: string, list: { name: string; unitHint?: string }[]) {
  const rows = await db()
    .insert(tags)
    .values(list.map((t) => ({ siteId, name: t.name, unitHint: t.unitHint ?? null })))
    .returning();
  return new Map(rows.map((r) => [r.name, r.id]));
}

/** The tag's narrow key (tags.seq), which tag hours carry. */
export async function tagSeq(siteId: string, name: string) {
  const [t] = await db().select({ seq: tags.seq }).from(tags).where(and(eq(tags.siteId, siteId), eq(tags.name, name)));
  return t!.seq;
}

export async function tagId(siteId: string, name: string) {
  const [t] = await db().select({ id: tags.id }).from(tags).where(and(eq(tags.siteId, siteId), eq(tags.name, name)));
  return t!.id;
}
