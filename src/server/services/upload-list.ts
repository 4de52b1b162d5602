import { and, desc, eq, inArray, lt, or, sql } from 'drizzle-orm';
import { z } from 'zod';
import { db } from '../db/client';
import { apiTokens, tagHourUploads, uploads, user } from '../db/schema';
import { uploadView } from './uploads';

/** One page of a site's uploads, newest first: `before` is the cursor the previous page gave as `next`. */
export const UploadListQuery = z.object({
  before: z
    .string()
    .max(80)
    .regex(/^\d{4}-\d{2}-\d{2}T[\d:.]+Z_[0-9a-f-]{36}$/, 'must be the `next` cursor of an earlier page')
    .optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});

const cursorOf = (u: { createdAt: Date; id: string }) => `${u.createdAt.toISOString()}_${u.id}`;

/** Who sent each upload, in words: the person's name, or the API token's name. */
function byWords(r: { personName: string | null; tokenName: string | null; source: string }): string | null {
  if (r.personName) return r.personName;
  if (r.tokenName) return `API token "${r.tokenName}"`;
  return r.source === 'demo' ? 'the demo loader' : null;
}

/**
 * A page of a site's uploads, newest first, each with who sent it, the span of tag hours it
 * produced (first and last hour start, UTC) and, for a repeat, the file it repeats; the cursor of the next older page (null on the last)
 * and the site's total.
 */
export async function listUploadPage(siteId: string, q: z.infer<typeof UploadListQuery> = { limit: 50 }) {
  const [t, id] = q.before ? q.before.split('_') : [];
  const older = t && id ? or(lt(uploads.createdAt, new Date(t)), and(eq(uploads.createdAt, new Date(t)), lt(uploads.id, id))) : undefined;
  const rows = await db()
    .select({ upload: uploads, personName: user.name, tokenName: apiTokens.name })
    .from(uploads)
    .leftJoin(user, eq(user.id, uploads.uploadedBy))
    .leftJoin(apiTokens, eq(apiTokens.id, uploads.apiTokenId))
    .where(and(eq(uploads.siteId, siteId), older))
    .orderBy(desc(uploads.createdAt), desc(uploads.id))
    .limit(q.limit + 1);
  const page = rows.slice(0, q.limit);
  const ids = page.map((r) => r.upload.id);
  const spans = ids.length
    ? await db()
        .select({ uploadId: tagHourUploads.uploadId, from: sql<Date>`min(${tagHourUploads.firstHour})`, to: sql<Date>`max(${tagHourUploads.lastHour})` })
        .from(tagHourUploads)
        .where(inArray(tagHourUploads.uploadId, ids))
        .groupBy(tagHourUploads.uploadId)
    : [];
  const spanOf = new Map(spans.map((s) => [s.uploadId, s]));
  const firstIds = [...new Set(page.map((r) => r.upload.duplicateOf).filter((d): d is string => d !== null))];
  const firsts = firstIds.length
    ? await db().select({ id: uploads.id, fileName: uploads.fileName, createdAt: uploads.createdAt }).from(uploads).where(inArray(uploads.id, firstIds))
    : [];
  const firstOf = new Map(firsts.map((f) => [f.id, f]));
  const [total] = await db().select({ n: sql<number>`count(*)::int` }).from(uploads).where(eq(uploads.siteId, siteId));
  return {
    uploads: page.map((r) => {
      const span = spanOf.get(r.upload.id);
      return {
        ...uploadView(r.upload),
        uploadedBy: byWords({ ...r, source: r.upload.source }),
        hoursFrom: span ? new Date(span.from).toISOString() : null,
        hoursTo: span ? new Date(span.to).toISOString() : null,
        duplicateOfFile: r.upload.duplicateOf ? (firstOf.get(r.upload.duplicateOf) ?? null) : null,
      };
    }),
    next: rows.length > q.limit ? cursorOf(page.at(-1)!.upload) : null,
    total: total?.n ?? 0,
  };
}
