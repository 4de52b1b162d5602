import { createHash, randomUUID } from 'node:crypto';
import { PassThrough, Transform, type Readable } from 'node:stream';
import { and, desc, eq, inArray, ne, sql } from 'drizzle-orm';
import { INGEST_ERROR_CATALOGUE } from '~/lib/ingest/errors';
import type { LayoutProfile } from '~/lib/ingest/profile';
import { z } from 'zod';
import { QUEUES, sendJob } from '~/jobs';
import { toCsv } from '~/lib/csv-write';
import { HOUR_S } from '~/lib/time';
import { db } from '../db/client';
import { AppError } from '../errors';
import { READ_STATUSES, layoutProfiles, sites, uploadRejects, uploads, type UploadStatus } from '../db/schema';
import { queue } from '../queue';
import { objectHead, objectSize, presignPut, putRawStream } from '../storage';
import { startEarlyRead } from './ingest-early';

/** Largest file accepted [bytes]: 4 GiB (a year of one-minute data for a few hundred tags fits easily). */
export const MAX_UPLOAD_BYTES = 4 * 1024 ** 3;

/** The one content type raw files are stored with (the presigned PUT signs it). */
export const RAW_CONTENT_TYPE = 'text/csv';

/** Control characters (NUL, line breaks ...) have no place in a file name. */
// eslint-disable-next-line no-control-regex
const CONTROL_CHARS = /[\u0000-\u001f\u007f]/;
export const FILE_NAME_RULE = 'A file name may not hold control characters (NUL, tabs, line breaks).';

/** Checks a machine upload's file name; throws VALIDATION_FAILED (400). */
export function checkFileName(name: string): string {
  if (CONTROL_CHARS.test(name)) throw new AppError('VALIDATION_FAILED', FILE_NAME_RULE);
  const trimmed = name.trim();
  if (!trimmed || trimmed.length > 255) throw new AppError('VALIDATION_FAILED', 'A file name has 1 to 255 characters.');
  return trimmed;
}

export const NewUploadInput = z.object({
  fileName: z
    .string()
    .refine((n) => !CONTROL_CHARS.test(n), FILE_NAME_RULE)
    .transform((n) => n.trim())
    .pipe(z.string().min(1).max(255)),
  sizeBytes: z.number().int().nonnegative().max(MAX_UPLOAD_BYTES, 'Files above 4 GiB are not accepted: split the export.'),
  /** Accepted for compatibility; the file is always stored as text/csv. */
  contentType: z.string().max(200).default(RAW_CONTENT_TYPE),
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
  if (!site) throw new AppError('NOT_FOUND', 'No such site.');
  return site;
}

/**
 * An earlier upload of the same bytes to the same site that was read (or is being read). `before`
 * limits it to uploads created before the one at hand, so two copies read at once never both stand
 * aside for each other.
 */
export async function findDuplicate(siteId: string, sha256: string, exceptId?: string, before?: { id: string; createdAt: Date }) {
  const rows = await db()
    .select({ id: uploads.id, status: uploads.status, fileName: uploads.fileName })
    .from(uploads)
    .where(
      and(
        eq(uploads.siteId, siteId),
        eq(uploads.sha256, sha256),
        inArray(uploads.status, ['queued', 'processing', ...READ_STATUSES, 'needs-review']),
        sql`${uploads.duplicateOf} is null`,
        exceptId ? ne(uploads.id, exceptId) : sql`true`,
        before ? sql`(${uploads.createdAt}, ${uploads.id}) < (${before.createdAt.toISOString()}::timestamptz, ${before.id}::uuid)` : sql`true`,
      ),
    )
    .orderBy(uploads.createdAt)
    .limit(1);
  return rows[0] ?? null;
}

/**
 * The upload a read of known bytes yields to before its commit (under the site's ingest lock): one
 * whose read of the same bytes is committed, whenever it was made, or one made earlier that waits to
 * be read. So two copies that arrive together are read once whichever is read first: the later-made
 * one yields to the earlier while both wait, and whichever commits second yields to the first.
 */
export async function repeatToYieldTo(siteId: string, sha256: string, up: { id: string; createdAt: Date }) {
  const rows = await db()
    .select({ id: uploads.id })
    .from(uploads)
    .where(
      and(
        eq(uploads.siteId, siteId),
        eq(uploads.sha256, sha256),
        ne(uploads.id, up.id),
        sql`${uploads.duplicateOf} is null`,
        sql`(${inArray(uploads.status, [...READ_STATUSES])} or (${inArray(uploads.status, ['queued', 'processing', 'needs-review'])}
          and (${uploads.createdAt}, ${uploads.id}) < (${up.createdAt.toISOString()}::timestamptz, ${up.id}::uuid)))`,
      ),
    )
    .orderBy(uploads.createdAt)
    .limit(1);
  return rows[0] ?? null;
}

/** NOTIFY channel that wakes the workers' ingest at once (src/worker/ingest-wake.ts). */
export const INGEST_WAKE_CHANNEL = 'lossline_ingest_queued';

/** How an upload's read job is queued, first or resumed: two retries, and two hours before pg-boss gives it up. */
export const INGEST_JOB_OPTIONS = { retryLimit: 2, retryDelay: 5, expireInSeconds: 2 * HOUR_S } as const;

export async function queueIngest(uploadId: string): Promise<void> {
  const boss = await queue();
  await sendJob(boss, QUEUES.ingestFile, { uploadId }, { singletonKey: uploadId, ...INGEST_JOB_OPTIONS });
  // Wakes a listening worker now instead of at its next poll (up to 0.5 s later); polling stays.
  await db()
    .execute(sql`select pg_notify(${INGEST_WAKE_CHANNEL}, '')`)
    .catch(() => undefined);
}

/** Marks an upload failed for a reason in the file (its code from the catalogue); the raw file stays. */
async function failUpload(uploadId: string, code: keyof typeof INGEST_ERROR_CATALOGUE, reason: string, details: Record<string, unknown> = {}) {
  await db()
    .update(uploads)
    .set({ status: 'failed', failureReason: reason, finishedAt: sql`clock_timestamp()`, summary: { code, details } })
    .where(eq(uploads.id, uploadId));
}

/**
 * Step 1 of a browser upload: the record is created first, then the browser PUTs the bytes straight
 * into the store with the presigned URL (they never pass through the web server). The declared
 * SHA-256 is only a hint (duplicateOf in the answer, so the browser may skip sending); the worker
 * hashes the stored bytes and that hash decides.
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
      sha256: null,
      declaredSha256: input.sha256 ?? null,
      objectKey,
      source: 'browser',
      uploadedBy: userId,
      status: 'awaiting-file',
      duplicateOf: null,
    });
  const url = await presignPut(objectKey, RAW_CONTENT_TYPE, undefined, input.sizeBytes);
  return { uploadId: id, objectKey, url, method: 'PUT' as const, headers: { 'content-type': RAW_CONTENT_TYPE }, duplicateOf: duplicate };
}

/**
 * Checks a stored browser upload against what was declared for it: its size and the fixed content
 * type. Returns the reason when they differ, else null.
 */
export async function storedObjectMismatch(up: typeof uploads.$inferSelect): Promise<string | null> {
  const head = await objectHead(up.objectKey);
  if (!head) return 'The raw file is not in the store.';
  if (up.sizeBytes !== null && head.size !== up.sizeBytes) {
    return `The stored file has ${head.size} bytes but ${up.sizeBytes} were declared for it, so it was not read. Upload the file again.`;
  }
  const type = (head.contentType ?? '').split(';')[0]!.trim().toLowerCase();
  if (type !== RAW_CONTENT_TYPE) {
    return `The stored file has the content type '${head.contentType ?? 'none'}' instead of ${RAW_CONTENT_TYPE}, so it was not read. Upload the file again.`;
  }
  return null;
}

/**
 * Step 2 of a browser upload: the bytes are in the store; check their size and type and queue the
 * reading. Whether they repeat an earlier file is decided by the worker from the stored bytes.
 */
export async function completeBrowserUpload(uploadId: string) {
  const up = await getUploadRow(uploadId);
  if (up.status !== 'awaiting-file') return { status: up.status };
  const size = await objectSize(up.objectKey);
  if (size === null) throw new AppError('CONFLICT', 'The file has not arrived in the store yet: upload it, then complete.');
  const mismatch = await storedObjectMismatch(up);
  if (mismatch) {
    await failUpload(uploadId, 'SIZE_MISMATCH', mismatch, { declaredBytes: up.sizeBytes, storedBytes: size });
    throw new AppError('VALIDATION_FAILED', mismatch);
  }
  await db().update(uploads).set({ status: 'queued', sizeBytes: size }).where(eq(uploads.id, uploadId));
  await queueIngest(uploadId);
  return { status: 'queued' as UploadStatus };
}

/** Counts bytes and hashes them on the way through. */
class HashCounter extends Transform {
  readonly hash = createHash('sha256');
  bytes = 0;
  constructor(
    private readonly limit: number,
    private readonly declared?: number,
  ) {
    super();
  }
  override _transform(chunk: Buffer, _enc: BufferEncoding, cb: (err?: Error | null, data?: Buffer) => void) {
    this.bytes += chunk.length;
    if (this.bytes > this.limit) return cb(new AppError('PAYLOAD_TOO_LARGE', 'Files above 4 GiB are not accepted: split the export.'));
    if (this.declared !== undefined && this.bytes > this.declared) {
      return cb(new AppError('VALIDATION_FAILED', `The file holds more than the ${this.declared} bytes its Content-Length declared, so it was not kept. Send it again.`));
    }
    this.hash.update(chunk);
    cb(null, chunk);
  }
  override _flush(cb: (err?: Error | null) => void) {
    if (this.declared !== undefined && this.bytes !== this.declared) {
      return cb(new AppError('VALIDATION_FAILED', `The file ended after ${this.bytes} of the ${this.declared} bytes its Content-Length declared, so it was not kept. Send it again.`));
    }
    cb();
  }
}

/**
 * A machine upload (scheduled export with a site API token): the body streams into the store while
 * it is hashed; nothing is held in memory beyond a few parts. With `sizeBytes` (the request's
 * Content-Length) it goes in as one streamed PUT, otherwise as a multipart upload (storage.ts).
 * With `sizeBytes` within INGEST_WHILE_UPLOADING_MAX_MB, the counted body is also read while it
 * arrives (ingest-early.ts): the upload is then read (or stands aside as a repeat) when this returns;
 * when that reader gives up, the worker reads the stored file as before.
 * Answers with the upload id, the earlier upload it repeats, and whether it was read while uploading.
 */
export async function receiveApiUpload(
  siteId: string,
  fileName: string,
  body: Readable,
  by: { apiTokenId?: string; userId?: string },
  sizeBytes?: number,
): Promise<{ uploadId: string; duplicateOf: string | null; readWhileUploading: boolean }> {
  const receivedMs = performance.now();
  fileName = checkFileName(fileName);
  if (sizeBytes !== undefined && !(Number.isSafeInteger(sizeBytes) && sizeBytes >= 0)) sizeBytes = undefined;
  if (sizeBytes !== undefined && sizeBytes > MAX_UPLOAD_BYTES) throw new AppError('PAYLOAD_TOO_LARGE', 'Files above 4 GiB are not accepted: split the export.');
  await requireSite(siteId);
  const id = randomUUID();
  const objectKey = objectKeyFor(siteId, id, fileName);
  const [row] = await db()
    .insert(uploads)
    .values({ id, siteId, fileName, objectKey, source: 'api', apiTokenId: by.apiTokenId ?? null, uploadedBy: by.userId ?? null, status: 'awaiting-file' })
    .returning();
  const counter = new HashCounter(MAX_UPLOAD_BYTES, sizeBytes);
  const early = sizeBytes !== undefined ? startEarlyRead(row!, sizeBytes, (sha256) => repeatToYieldTo(siteId, sha256, row!)) : null;
  try {
    // An error of the body (a broken connection) stops the counter, and so the store's request.
    body.on('error', (err) => counter.destroy(err));
    let stored: Readable = body.pipe(counter);
    if (early) {
      // Two branches of the counted body, the store's and the reader's: pipe() holds the body while
      // either branch is full, so the slower one sets the pace and memory stays bounded.
      const store = new PassThrough();
      store.on('error', () => undefined); // told through putRawStream
      counter.on('error', (err) => {
        store.destroy(err);
        early.branch.destroy(err);
      });
      counter.pipe(store);
      counter.pipe(early.branch);
      stored = store;
    }
    await putRawStream(objectKey, stored, RAW_CONTENT_TYPE, sizeBytes);
    if (early && process.env.LOSSLINE_INGEST_TIMING) console.log(`[ingest] ${id}: body in the store ${((performance.now() - receivedMs) / 1000).toFixed(2)} s after it began to arrive`);
  } catch (err) {
    // The reader stops and rolls back first: nothing of a broken body is ever committed.
    await early?.abort(err as Error);
    counter.destroy();
    const reason = err instanceof AppError ? err.message : `The file did not arrive whole: ${(err as Error).message}`;
    await db().update(uploads).set({ status: 'failed', failureReason: reason, finishedAt: sql`clock_timestamp()` }).where(eq(uploads.id, id));
    if (err instanceof AppError) throw err;
    throw new AppError('VALIDATION_FAILED', reason);
  }
  const sha256 = counter.hash.digest('hex');
  if (early) {
    const verdict = await early.settle({ sha256, bytes: counter.bytes });
    if (verdict.kind === 'read') return { uploadId: id, duplicateOf: null, readWhileUploading: true };
    if (verdict.kind === 'repeat') return { uploadId: id, duplicateOf: verdict.duplicateOf, readWhileUploading: false };
    // It gave up: the worker reads the stored file, as for any other upload.
  }
  const duplicate = await findDuplicate(siteId, sha256, id, { id, createdAt: row!.createdAt });
  if (duplicate) {
    await db()
      .update(uploads)
      .set({ sha256, sizeBytes: counter.bytes, status: 'done', duplicateOf: duplicate.id, finishedAt: sql`clock_timestamp()`, summary: { duplicateOf: duplicate.id, note: 'Same bytes as an earlier upload: not read again.' } })
      .where(eq(uploads.id, id));
    return { uploadId: id, duplicateOf: duplicate.id, readWhileUploading: false };
  }
  await db().update(uploads).set({ sha256, sizeBytes: counter.bytes, status: 'queued' }).where(eq(uploads.id, id));
  await queueIngest(id);
  return { uploadId: id, duplicateOf: null, readWhileUploading: false };
}

export async function getUploadRow(uploadId: string) {
  const [row] = await db().select().from(uploads).where(eq(uploads.id, uploadId)).limit(1);
  if (!row) throw new AppError('NOT_FOUND', 'No such upload.');
  return row;
}

/** The public view of an upload (API and uploads page). */
export function uploadView(u: typeof uploads.$inferSelect) {
  const progress = (READ_STATUSES as readonly string[]).includes(u.status) ? 1 : u.sizeBytes ? Math.min(1, (u.bytesRead ?? 0) / u.sizeBytes) : 0;
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
    // The layout and its questions while a person must answer (a machine upload stopped with a
    // layout question is failed, with the same detection).
    detection: u.status === 'needs-review' || (u.status === 'failed' && u.summary?.code === 'LAYOUT_QUESTION') ? u.detection : undefined,
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
  if (up.status !== 'failed') throw new AppError('CONFLICT', `Only a failed upload can be retried; this one is ${up.status}.`);
  if ((await objectSize(up.objectKey)) === null) throw new AppError('CONFLICT', 'The raw file is not in the store, so it cannot be read again.');
  await db().update(uploads).set({ status: 'queued', failureReason: null, rowsRead: 0, bytesRead: 0 }).where(eq(uploads.id, uploadId));
  await queueIngest(uploadId);
}

/** Saves the operator's confirmed layout as a profile of the site and queues the reading. A machine
 * upload stopped with a layout question (failed, LAYOUT_QUESTION) may be answered the same way. */
export async function confirmLayout(uploadId: string, profile: LayoutProfile, name: string, userId: string) {
  const up = await getUploadRow(uploadId);
  const askedMachine = up.status === 'failed' && up.summary?.code === 'LAYOUT_QUESTION';
  if (up.status !== 'needs-review' && !askedMachine) throw new AppError('CONFLICT', `This upload is ${up.status}, not waiting for a layout.`);
  const [saved] = await db()
    .insert(layoutProfiles)
    .values({ siteId: up.siteId, fingerprint: profile.fingerprint, name, profile, confirmedBy: userId })
    .onConflictDoUpdate({ target: [layoutProfiles.siteId, layoutProfiles.fingerprint], set: { profile, name, confirmedBy: userId } })
    .returning({ id: layoutProfiles.id });
  await db().update(uploads).set({ status: 'queued', profileId: saved!.id, failureReason: null }).where(eq(uploads.id, uploadId));
  await queueIngest(uploadId);
  return { profileId: saved!.id };
}

/** Every rejected cell of an upload as CSV (line, tag, time, text, reason), written by toCsv
 * (src/lib/csv-write.ts), so a formula-like cell never runs in a spreadsheet. */
export async function rejectsCsv(uploadId: string): Promise<string> {
  const rows = await db().select().from(uploadRejects).where(eq(uploadRejects.uploadId, uploadId)).orderBy(uploadRejects.seq);
  return toCsv([['line', 'tag', 'time', 'text', 'reason'], ...rows.map((r) => [r.line, r.tag, r.time, r.raw, r.reason])]);
}
