/**
 * A tag's own data-quality limits in the plant model file (`tags[]`, docs/plant-model.md): its
 * frozen-value (flatline) limit, and a spread limit and a minimum coverage that override its unit's
 * `parameters.spreadLimit` and `parameters.minCoverage` in the steady-state test. Every field is
 * optional; a tag not listed keeps the defaults. Pure: the schema and the check against the file's
 * links.
 */
import { z } from 'zod';
import { jsonPath } from '~/lib/zod-words';
import type { ModelIssue } from './model-issue';
import { DEFAULT_FLATLINE_LIMIT_s } from '../ingest/aggregate-types';
import { DAY_S } from '../time';

/** The frozen-value limit of a tag not listed [s]: the reader's default, 4 h (src/lib/ingest/aggregate-types.ts). */
export const DEFAULT_FROZEN_LIMIT_s = DEFAULT_FLATLINE_LIMIT_s;
/** Bounds of a frozen-value limit [s]: a minute to 30 days. */
export const FROZEN_LIMIT_MIN_s = 60;
export const FROZEN_LIMIT_MAX_s = 30 * DAY_S;

const fraction = (field: string, what: string) =>
  z
    .number({ error: `The ${what} ${field} is a number from 0 to 1 (0.05 for 5 %).` })
    .finite()
    .min(0, `The ${what} ${field} cannot be negative.`)
    .max(1, `The ${what} ${field} is at most 1 (0.05 for 5 %).`);

export const TagLimitsSchema = z.strictObject({
  /** The tag's name as in the exports and in the file's links. */
  name: z
    .string({ error: 'Give the tag’s name (text), as in the links.' })
    .trim()
    .min(1, 'Give the tag’s name, as in the links.')
    .max(120, 'The tag name is longer than 120 characters.'),
  /** Longest run of an unchanged value before the tag's hour is flagged frozen [s]. */
  frozenLimit_s: z
    .number({ error: 'The frozen-value limit frozenLimit_s is a number of seconds (14400 for 4 h).' })
    .int('The frozen-value limit frozenLimit_s is a whole number of seconds.')
    .min(FROZEN_LIMIT_MIN_s, `The frozen-value limit frozenLimit_s must be at least ${FROZEN_LIMIT_MIN_s} seconds.`)
    .max(FROZEN_LIMIT_MAX_s, `The frozen-value limit frozenLimit_s must be at most ${FROZEN_LIMIT_MAX_s} seconds (30 days).`)
    .optional(),
  /** The tag's spread limit: (max - min) / |mean|; for O2 and vapour fraction tags (max - min) in fraction [-]. */
  spreadLimit: fraction('spreadLimit', 'tag’s spread limit').optional(),
  /** Least share of the hour the tag's samples must cover [-]. */
  minCoverage: fraction('minCoverage', 'tag’s least coverage of the hour').optional(),
});
export type TagLimits = z.infer<typeof TagLimitsSchema>;

/** The tags a model file names: in its links and as the site's ambient-temperature tag. */
function namedTags(model: { site: { deadState: { T0Tag?: { tag: string } } }; units: readonly { links: readonly { tag: string }[] }[] }): Set<string> {
  const out = new Set<string>();
  if (model.site.deadState.T0Tag) out.add(model.site.deadState.T0Tag.tag);
  for (const u of model.units) for (const l of u.links) out.add(l.tag);
  return out;
}

/**
 * Problems of the file's `tags[]`: a name listed twice, or a tag that no link of the file (nor the
 * ambient-temperature tag) names, which is most often a misspelling.
 */
export function checkTagLimits(model: Parameters<typeof namedTags>[0] & { tags?: readonly TagLimits[] }): ModelIssue[] {
  const out: ModelIssue[] = [];
  if (!model.tags?.length) return out;
  const known = namedTags(model);
  const seen = new Set<string>();
  model.tags.forEach((t, i) => {
    const at = jsonPath(['tags', i, 'name']);
    if (seen.has(t.name)) out.push({ path: at, message: `Tag '${t.name}' is listed twice in tags; give its limits once.` });
    else if (!known.has(t.name)) {
      out.push({ path: at, message: `No link of this file names the tag '${t.name}' (nor site.deadState.T0Tag): a tag's limits are given for a tag the file links. Check the spelling.` });
    }
    seen.add(t.name);
  });
  return out;
}

/** A tag's limits as stored (tags.flatline_limit_seconds, spread_limit, min_coverage). */
export interface StoredTagLimits {
  name: string;
  flatlineLimitSeconds: number;
  spreadLimit: number | null;
  minCoverage: number | null;
}

/** The file's entry of a stored tag, or null when every limit is the default (an export lists only those that differ). */
export function tagLimitsEntry(t: StoredTagLimits): TagLimits | null {
  const entry: TagLimits = {
    name: t.name,
    ...(t.flatlineLimitSeconds !== DEFAULT_FROZEN_LIMIT_s ? { frozenLimit_s: t.flatlineLimitSeconds } : {}),
    ...(t.spreadLimit !== null ? { spreadLimit: t.spreadLimit } : {}),
    ...(t.minCoverage !== null ? { minCoverage: t.minCoverage } : {}),
  };
  return Object.keys(entry).length > 1 ? entry : null;
}

/** What to store for a tag the file names: its entry's limits, the defaults where left out. */
export function storedLimitsOf(entry: TagLimits | undefined): Omit<StoredTagLimits, 'name'> {
  return {
    flatlineLimitSeconds: entry?.frozenLimit_s ?? DEFAULT_FROZEN_LIMIT_s,
    spreadLimit: entry?.spreadLimit ?? null,
    minCoverage: entry?.minCoverage ?? null,
  };
}
