/**
 * Tags' own limits of the plant model file (`tags[]`, src/lib/plant/tag-limits.ts) in and out of the
 * tags table: the frozen-value limit (tags.flatline_limit_seconds, read by the ingest) and the spread
 * limit and least coverage (tags.spread_limit, tags.min_coverage, read by the engine through the links).
 */
import { and, eq, isNotNull, ne, or } from 'drizzle-orm';
import type { PlantModel } from '~/lib/plant/model';
import { DEFAULT_FROZEN_LIMIT_s, storedLimitsOf, tagLimitsEntry, type TagLimits } from '~/lib/plant/tag-limits';
import { tags } from '../db/schema';
import type { Tx } from './plant-tx';
import type { db } from '../db/client';

type Reader = Tx | ReturnType<typeof db>;

const limitColumns = { id: tags.id, name: tags.name, flatlineLimitSeconds: tags.flatlineLimitSeconds, spreadLimit: tags.spreadLimit, minCoverage: tags.minCoverage };

/**
 * Makes the site's tags hold the file's limits: a tag the file lists gets its entry (defaults where
 * the entry leaves a limit out), every other tag of the site the defaults. Answers the ids of the tags
 * whose limits changed, and the names of those whose spread limit or coverage changed (their units'
 * hours are computed again; a frozen-value limit applies to files read from now on).
 */
export async function writeTagLimits(tx: Tx, siteId: string, model: PlantModel, createdTagIds: ReadonlySet<string>): Promise<{ changed: string[]; steadyTestTags: Set<string> }> {
  const listed = new Map((model.tags ?? []).map((t) => [t.name, t]));
  const rows = await tx.select(limitColumns).from(tags).where(eq(tags.siteId, siteId));
  const changed: string[] = [];
  const steadyTestTags = new Set<string>();
  for (const row of rows) {
    const want = storedLimitsOf(listed.get(row.name));
    const steadyTest = row.spreadLimit !== want.spreadLimit || row.minCoverage !== want.minCoverage;
    if (!steadyTest && row.flatlineLimitSeconds === want.flatlineLimitSeconds) continue;
    await tx.update(tags).set(want).where(eq(tags.id, row.id));
    if (!createdTagIds.has(row.id)) changed.push(row.id);
    if (steadyTest) steadyTestTags.add(row.name);
  }
  return { changed, steadyTestTags };
}

/**
 * The file's `tags[]` of a site: the tags among `named` (those its links and ambient tag name) whose
 * limits differ from the defaults, by name; empty when none does.
 */
export async function readTagLimits(r: Reader, siteId: string, named: ReadonlySet<string>): Promise<TagLimits[]> {
  const rows = await r
    .select(limitColumns)
    .from(tags)
    .where(and(eq(tags.siteId, siteId), or(ne(tags.flatlineLimitSeconds, DEFAULT_FROZEN_LIMIT_s), isNotNull(tags.spreadLimit), isNotNull(tags.minCoverage))));
  return rows
    .filter((t) => named.has(t.name))
    .map(tagLimitsEntry)
    .filter((e): e is TagLimits => e !== null)
    .sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
}
