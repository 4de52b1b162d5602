import { and, asc, eq, gte, lt } from 'drizzle-orm';
import { db } from '../db/client';
import { tagHours, tags } from '../db/schema';

export class TagHourQueryError extends Error {
  constructor(
    readonly code: 'NOT_FOUND' | 'VALIDATION_FAILED',
    message: string,
  ) {
    super(message);
  }
}

/** Longest range one request may ask for: 400 days of hours. */
export const MAX_RANGE_MS = 400 * 24 * 3600 * 1000;

/** The tag hours of one tag between two instants (hour starts in [from, to)). */
export async function tagHoursOf(siteId: string, tagName: string, from: Date, to: Date) {
  if (!(to > from)) throw new TagHourQueryError('VALIDATION_FAILED', '"to" must be after "from".');
  if (to.getTime() - from.getTime() > MAX_RANGE_MS) throw new TagHourQueryError('VALIDATION_FAILED', 'Ask for at most 400 days at a time.');
  const [tag] = await db()
    .select()
    .from(tags)
    .where(and(eq(tags.siteId, siteId), eq(tags.name, tagName)))
    .limit(1);
  if (!tag) throw new TagHourQueryError('NOT_FOUND', `No tag named "${tagName}" at this site.`);
  const rows = await db()
    .select()
    .from(tagHours)
    .where(and(eq(tagHours.tagId, tag.id), gte(tagHours.hourStart, from), lt(tagHours.hourStart, to)))
    .orderBy(asc(tagHours.hourStart));
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
      coveredFraction: r.coveredFraction,
      nonNumeric: r.nonNumeric,
      outOfRange: r.outOfRange,
      flatline: r.flatline,
      flags: r.flags,
      uploadIds: r.uploadIds,
    })),
  };
}
