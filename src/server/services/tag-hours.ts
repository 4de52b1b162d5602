import { and, asc, desc, eq, gte, lt } from 'drizzle-orm';
import { db } from '../db/client';
import { AppError } from '../errors';
import { TAG_HOUR_FLAGS, tagHourFlagNames, tagHourUploads, tagHours, tags, uploads } from '../db/schema';
import type { TagHour as EngineTagHour } from '~/lib/engine/types';
import { ensureMonthPartitions } from '../db/partitions';
import { replacedByExcluded } from '../db/upsert';
import { DAY_MS, HOUR_S } from '~/lib/time';

/** Longest range one request may ask for: 400 days of hours. */
export const MAX_RANGE_MS = 400 * DAY_MS;

/** Refuses a range that is empty, reversed or longer than MAX_RANGE_MS, in words. */
export function checkHourRange(from: Date, to: Date): void {
  if (!(to > from)) throw new AppError('VALIDATION_FAILED', '"to" must be after "from".');
  if (to.getTime() - from.getTime() > MAX_RANGE_MS) throw new AppError('VALIDATION_FAILED', 'Ask for at most 400 days at a time.');
}

/** The tag hours of one tag between two instants (hour starts in [from, to)). */
export async function tagHoursOf(siteId: string, tagName: string, from: Date, to: Date) {
  checkHourRange(from, to);
  const [tag] = await db()
    .select()
    .from(tags)
    .where(and(eq(tags.siteId, siteId), eq(tags.name, tagName)))
    .limit(1);
  if (!tag) throw new AppError('NOT_FOUND', `No tag named "${tagName}" at this site.`);
  const rows = await db()
    .select()
    .from(tagHours)
    .where(and(eq(tagHours.tagId, tag.seq), gte(tagHours.hourStart, from), lt(tagHours.hourStart, to)))
    .orderBy(asc(tagHours.hourStart));
  // The uploads that brought hours of the tag in the range, newest first (one row per upload and tag).
  const ups = await db()
    .select({ id: tagHourUploads.uploadId, first: tagHourUploads.firstHour, last: tagHourUploads.lastHour })
    .from(tagHourUploads)
    .innerJoin(uploads, eq(uploads.id, tagHourUploads.uploadId))
    .where(and(eq(tagHourUploads.tagId, tag.seq), lt(tagHourUploads.firstHour, to), gte(tagHourUploads.lastHour, from)))
    .orderBy(desc(uploads.createdAt));
  // An hour a newer file replaced (same readings again) holds the newest file's figures only.
  const uploadsAt = (t: Date, flags: number) => {
    const ids = ups.filter((u) => u.first <= t && u.last >= t).map((u) => u.id);
    return flags & TAG_HOUR_FLAGS['replaced-older-file'] && !(flags & TAG_HOUR_FLAGS['combined-files']) ? ids.slice(0, 1) : ids;
  };
  return {
    tag: { id: tag.id, name: tag.name, unitHint: tag.unitHint, kind: tag.kind },
    hours: rows.map((r) => ({
      hourStart: r.hourStart.toISOString(),
      mean: r.mean,
      min: r.min,
      max: r.max,
      std: r.std,
      first: r.first,
      last: r.last,
      samples: r.samples,
      coveredFraction: r.coveredSeconds / HOUR_S,
      nonNumeric: r.nonNumeric,
      outOfRange: r.outOfRange,
      flatline: tagHourFlagNames(r.flags).includes('flatline'),
      /** what the reader noticed (duplicate-times, bad-quality, combined-files ...; the counts are in the upload's report) */
      flags: tagHourFlagNames(r.flags).filter((f) => f !== 'flatline'),
      /** uploads whose samples fall in the hour, newest first */
      uploadIds: uploadsAt(r.hourStart, r.flags),
    })),
  };
}

/** A tag hour as the engine reads it (src/lib/engine TagHour; counts and flag optional), for one tag (tags.seq) and hour. */
export type TagHourWrite = Omit<EngineTagHour, 'nonNumeric' | 'outOfRange' | 'flatline'> &
  Partial<Pick<EngineTagHour, 'nonNumeric' | 'outOfRange' | 'flatline'>> & {
    tagId: number;
    hourStart: Date;
    first?: number | null;
    last?: number | null;
  };

/**
 * Writes tag hours given as the engine reads them (fixtures, tests, tools; files go through the
 * ingest worker), replacing what the hours held. Makes the month partitions they need first.
 */
export async function writeTagHours(rows: readonly TagHourWrite[]): Promise<void> {
  if (!rows.length) return;
  const ms = rows.map((r) => r.hourStart.getTime());
  await ensureMonthPartitions(null, 'tag_hours', Math.min(...ms), Math.max(...ms));
  const values = rows.map((r) => ({
    tagId: r.tagId,
    hourStart: r.hourStart,
    mean: r.mean,
    min: r.min,
    max: r.max,
    std: r.std,
    first: r.first ?? null,
    last: r.last ?? null,
    samples: r.samples,
    coveredSeconds: Math.round(r.coveredFraction * HOUR_S),
    nonNumeric: Math.min(32767, r.nonNumeric ?? 0),
    outOfRange: Math.min(32767, r.outOfRange ?? 0),
    flags: r.flatline ? TAG_HOUR_FLAGS.flatline : 0,
  }));
  for (let i = 0; i < values.length; i += 1000) {
    await db()
      .insert(tagHours)
      .values(values.slice(i, i + 1000))
      .onConflictDoUpdate({
        target: [tagHours.tagId, tagHours.hourStart],
        set: replacedByExcluded(tagHours, ['mean', 'min', 'max', 'std', 'first', 'last', 'samples', 'coveredSeconds', 'nonNumeric', 'outOfRange', 'flags']),
      });
  }
}
