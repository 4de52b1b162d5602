import { createHash, randomUUID } from 'node:crypto';
import { Transform, type Readable } from 'node:stream';
import { Upload } from '@aws-sdk/lib-storage';
import { and, desc, eq, inArray, ne, sql } from 'drizzle-orm';
import { z } from 'zod';
import { QUEUES } from '../../jobs';
import { db } from '../db/client';
import { layoutProfiles, sites, uploadRejects, uploads, type UploadStatus } from '../db/schema';
import { queue } from '../queue';
import { bucket, objectSize, presignPut, s3 } from '../storage';

/** Largest file accepted [bytes]: 4 GiB (a year of one-minute data for a few hundred tags fits easily). */
export const MAX_UPLOAD_BYTES = 4 * 1024 ** 3;

export class UploadRuleError extends Error {
  constructor(
    readonly code: 'NOT_FOUND' | 'CONFLICT' | 'VALIDATION_FAILED' | 'PAYLOAD_TOO_LARGE',
    message: string,
  ) {
    super(message);
  }
}

export const NewUploadInput = z.object({
  fileName: z.string().trim().min(1).max(255),
  sizeBytes: z.number().int().nonnegative().max(MAX_UPLOAD_BYTES, 'Files above 4 GiB are not accepted: split the export.'),
  contentType: z.string().max(200).default('text/csv'),
  sha256: z
    .string()
    .regex(/^[0-9a-f]{64}$/)
    .optional(),
});

function safeName(fileName: string): string {
  return fileName.replace(/[^\w.\-]+/g, '_').slice(0, 120) || 'export.csv';
}

function objectKeyFor(siteId: string, uploadId: string, fileName: string): string {
  const d = new Date();
  return `sites/${siteId}/raw/${d.getUTCFullYear()}/${String(d.getUTCMonth() + 1).padStart(2, '0')}/${uploadId}/${safeName(fileName)}`;
}

async function requireSite(siteId: string) {
  const [site] = await db().select().from(sites).where(eq(sites.id, siteId)).limit(1);
  if (!site) throw new UploadRuleError('NOT_FOUND', 'No such site.');
  return site;
}

/** An earlier upload of the same bytes to the same site that was read (or is being read). */
async function findDuplicate(siteId: string, sha256: string, exceptId?: string) {
  const rows = await db()
    .select({ id: uploads.id, status: uploads.status, fileName: uploads.fileName })
    .from(uploads)
    .where(
      and(
        eq(uploads.siteId, siteId),
        eq(uploads.sha256, sha256),
        inArray(uploads.status, ['queued', 'processing', 'done', 'needs-review']),
        sql`${uploads.duplicateOf} is null`,
        exceptId ? ne(uploads.id, exceptId) : sql`true`,
      ),
    )
    .orderBy(uploads.createdAt)
    .limit(1);
  return rows[0] ?? null;
}

export async function queueIngest(uploadId: string): Promise<void> {
  const boss = await queue();
  await boss.send(QUEUES.ingestFile, { uploadId }, { singletonKey: uploadId, retryLimit: 2, retryDelay: 5, expireInSeconds: 60 * 60 * 2 });
}

/**
 * Step 1 of a browser upload: the record is created first, then the browser PUTs the bytes straight
 * into the store with the presigned URL (they never pass through the web server).
 */
export async function createBrowserUpload(siteId: string, input: z.infer<typeof NewUploadInput>, userId: string) {
  await requireSite(siteId);
  const id = randomUUID();
  const objectKey = objectKeyFor(siteId, id, input.fileName);
  const duplicate = input.sha256 ? await findDuplicate(siteId, input.sha256) : null;
  await db()
    .insert(uploads)
    .values({
      id,
      siteId,
      fileName: input.fileName,
      sizeBytes: input.sizeBytes,
      sha256: input.sha256 ?? null,
      objectKey,
      source: 'browser',
      uploadedBy: userId,
      status: 'awaiting-file',
      duplicateOf: duplicate?.id ?? null,
    });
  const url = await presignPut(objectKey, input.contentType || 'text/csv');
  return { uploadId: id, objectKey, url, method: 'PUT' as const, headers: { 'content-type': input.contentType || 'text/csv' }, duplicateOf: duplicate };
}

/** Step 2 of a browser upload: the bytes are in the store; queue the reading (or recognise a repeat). */
export async function completeBrowserUpload(uploadId: string) {
  const up = await getUploadRow(uploadId);
  if (up.status !== 'awaiting-file') return { status: up.status };
  const size = await objectSize(up.objectKey);
  if (size === null) throw new UploadRuleError('CONFLICT', 'The file has not arrived in the store yet: upload it, then complete.');
  if (up.duplicateOf) {
    await db()
      .update(uploads)
      .set({ status: 'done', sizeBytes: size, finishedAt: new Date(), summary: { duplicateOf: up.duplicateOf, note: 'Same bytes as an earlier upload: not read again.' } })
      .where(eq(uploads.id, uploadId));
    return { status: 'done' as UploadStatus, duplicateOf: up.duplicateOf };
  }
  await db().update(uploads).set({ status: 'queued', sizeBytes: size }).where(eq(uploads.id, uploadId));
  await queueIngest(uploadId);
  return { status: 'queued' as UploadStatus };
}

/** Counts bytes and hashes them on the way through. */
class HashCounter extends Transform {
  readonly hash = createHash('sha256');
  bytes = 0;
  constructor(private readonly limit: number) {
    super();
  }
  override _transform(chunk: Buffer, _enc: BufferEncoding, cb: (err?: Error | null, data?: Buffer) => void) {
    this.bytes += chunk.length;
    if (this.bytes > this.limit) return cb(new UploadRuleError('PAYLOAD_TOO_LARGE', 'Files above 4 GiB are not accepted: split the export.'));
    this.hash.update(chunk);
    cb(null, chunk);
  }
}

/**
 * A machine upload (scheduled export with a site API token): the body streams into the store as a
 * multipart upload while it is hashed; nothing is held in memory. Answers with the upload id.
 */
export async function receiveApiUpload(siteId: string, fileName: string, body: Readable, by: { apiTokenId?: string; userId?: string }) {
  await requireSite(siteId);
  const id = randomUUID();
  const objectKey = objectKeyFor(siteId, id, fileName);
  await db().insert(uploads).values({ id, siteId, fileName, objectKey, source: 'api', apiTokenId: by.apiTokenId ?? null, uploadedBy: by.userId ?? null, status: 'awaiting-file' });
  const counter = new HashCounter(MAX_UPLOAD_BYTES);
  try {
    const upload = new Upload({
      client: s3(),
      params: { Bucket: bucket(), Key: objectKey, Body: body.pipe(counter), ContentType: 'text/csv' },
      queueSize: 4,
      partSize: 8 * 1024 * 1024,
    });
    await upload.done();
  } catch (err) {
    const reason = err instanceof UploadRuleError ? err.message : `The file did not arrive whole: ${(err as Error).message}`;
    await db().update(uploads).set({ status: 'failed', failureReason: reason, finishedAt: new Date() }).where(eq(uploads.id, id));
    if (err instanceof UploadRuleError) throw err;
    throw new UploadRuleError('VALIDATION_FAILED', reason);
  }
  const sha256 = counter.hash.digest('hex');
  const duplicate = await findDuplicate(siteId, sha256, id);
  if (duplicate) {
    await db()
      .update(uploads)
      .set({ sha256, sizeBytes: counter.bytes, status: 'done', duplicateOf: duplicate.id, finishedAt: new Date(), summary: { duplicateOf: duplicate.id, note: 'Same bytes as an earlier upload: not read again.' } })
      .where(eq(uploads.id, id));
    return { uploadId: id, duplicateOf: duplicate.id };
  }
  await db().update(uploads).set({ sha256, sizeBytes: counter.bytes, status: 'queued' }).where(eq(uploads.id, id));
  await queueIngest(id);
  return { uploadId: id, duplicateOf: null };
}

export async function getUploadRow(uploadId: string) {
  const [row] = await db().select().from(uploads).where(eq(uploads.id, uploadId)).limit(1);
  if (!row) throw new UploadRuleError('NOT_FOUND', 'No such upload.');
  return row;
}

/** The public view of an upload (API and uploads page). */
export function uploadView(u: typeof uploads.$inferSelect) {
  const progress = u.status === 'done' ? 1 : u.sizeBytes ? Math.min(1, (u.bytesRead ?? 0) / u.sizeBytes) : 0;
  return {
    uploadId: u.id,
    siteId: u.siteId,
    fileName: u.fileName,
    sizeBytes: u.sizeBytes,
    sha256: u.sha256,
    source: u.source,
    status: u.status,
    progress,
    rowsRead: u.rowsRead,
    duplicateOf: u.duplicateOf,
    summary: u.summary,
    detection: u.status === 'needs-review' ? u.detection : undefined,
    reason: u.status === 'failed' ? u.failureReason : null,
    createdAt: u.createdAt,
    finishedAt: u.finishedAt,
  };
}

export async function listUploads(siteId: string, limit = 50) {
  const rows = await db().select().from(uploads).where(eq(uploads.siteId, siteId)).orderBy(desc(uploads.createdAt)).limit(limit);
  return rows.map(uploadView);
}

/** Retry a failed upload from the start (its partial work was never committed). */
export async function retryUpload(uploadId: string) {
  const up = await getUploadRow(uploadId);
  if (up.status !== 'failed') throw new UploadRuleError('CONFLICT', `Only a failed upload can be retried; this one is ${up.status}.`);
  if ((await objectSize(up.objectKey)) === null) throw new UploadRuleError('CONFLICT', 'The raw file is not in the store, so it cannot be read again.');
  await db().update(uploads).set({ status: 'queued', failureReason: null, rowsRead: 0, bytesRead: 0 }).where(eq(uploads.id, uploadId));
  await queueIngest(uploadId);
}

/** Saves the operator's confirmed layout as a profile of the site and queues the reading. */
export async function confirmLayout(uploadId: string, profile: Record<string, unknown> & { fingerprint: string }, name: string, userId: string) {
  const up = await getUploadRow(uploadId);
  if (up.status !== 'needs-review') throw new UploadRuleError('CONFLICT', `This upload is ${up.status}, not waiting for a layout.`);
  const [saved] = await db()
    .insert(layoutProfiles)
    .values({ siteId: up.siteId, fingerprint: profile.fingerprint, name, profile, confirmedBy: userId })
    .onConflictDoUpdate({ target: [layoutProfiles.siteId, layoutProfiles.fingerprint], set: { profile, name, confirmedBy: userId } })
    .returning({ id: layoutProfiles.id });
  await db().update(uploads).set({ status: 'queued', profileId: saved!.id }).where(eq(uploads.id, uploadId));
  await queueIngest(uploadId);
  return { profileId: saved!.id };
}

/** A cell a spreadsheet would run as a formula gets a leading apostrophe (CSV injection). */
export function csvCell(value: unknown): string {
  let s = value === null || value === undefined ? '' : String(value);
  if (/^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\n\r;]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** Every rejected cell of an upload as CSV (line, tag, time, text, reason). */
export async function rejectsCsv(uploadId: string): Promise<string> {
  const rows = await db().select().from(uploadRejects).where(eq(uploadRejects.uploadId, uploadId)).orderBy(uploadRejects.seq);
  const lines = ['line,tag,time,text,reason'];
  for (const r of rows) lines.push([r.line, r.tag, r.time, r.raw, r.reason].map(csvCell).join(','));
  return lines.join('\r\n') + '\r\n';
}
