/**
 * Reading one upload into tag hours, as the worker's ingest job does. The parts:
 *   ingest-locks.ts   the per-upload advisory lock (one reader per file; the test of life)
 *   ingest-layout.ts  which layout the file is read with, or the question that stops it
 *   ingest-stream.ts  the raw object streamed through the ingest core inside one transaction
 *   ingest-write.ts   the writes of that transaction (binary COPY by ingest-copy.ts, rejects)
 *   ingest-merge.ts   hours another file brought too, recomputed from the samples of both
 *   ingest-finish.ts  the summary, the engine's recompute queued, the commit
 *   ingest-failure.ts what a failed read leaves (failed with a reason, or queued again)
 *   ingest-resume.ts  uploads a dead worker left half-read, taken over
 */
import { createHash } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import type pg from 'pg';
import { IngestError } from '~/lib/ingest';
import { db } from '../db/client';
import { sites, uploads } from '../db/schema';
import { objectStream } from '../storage';
import { findDuplicate, storedObjectMismatch } from './uploads';
import { failedRead, type IngestOutcome } from './ingest-failure';
import { finish } from './ingest-finish';
import { settleLayout } from './ingest-layout';
import { withUploadLock } from './ingest-locks';
import { readIntoTransaction } from './ingest-stream';

export { MAX_ATTEMPTS, type IngestOutcome } from './ingest-failure';
export { MAX_STORED_REJECTS, goodQualityCodes, timeWindowFor } from './ingest-stream';
export { resumeInterruptedUploads, sweepSeconds } from './ingest-resume';

/** SHA-256 of a stored object, streamed (nothing held in memory). */
async function hashObject(key: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of await objectStream(key)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

/**
 * Reads one upload: decides its layout, then streams the raw object through the ingest core and
 * writes its tag hours in one transaction. A per-upload advisory lock keeps two workers off the same
 * file; a crash rolls the transaction back, so the next attempt starts from the start.
 */
export async function ingestUpload(uploadId: string): Promise<IngestOutcome> {
  const out = await withUploadLock(uploadId, (client) => ingestLocked(uploadId, client));
  return out ?? { kind: 'skipped', why: 'another worker is reading this upload' };
}

type Upload = typeof uploads.$inferSelect;

/**
 * The stored object: its size and type as declared (browser), and its hash computed here. The hash
 * the browser declared is a claim; only the stored bytes decide what is a repeat. Returns the
 * outcome when the upload repeats an earlier one, else null.
 */
async function checkStoredObject(up: Upload): Promise<IngestOutcome | null> {
  if (up.source === 'browser') {
    const mismatch = await storedObjectMismatch(up);
    if (mismatch) throw new IngestError('SIZE_MISMATCH', mismatch, { declaredBytes: up.sizeBytes });
  }
  if (up.sha256) return null;
  const sha256 = await hashObject(up.objectKey);
  if (up.declaredSha256 && up.declaredSha256 !== sha256) {
    throw new IngestError(
      'HASH_MISMATCH',
      `The stored file's SHA-256 is ${sha256}, not the ${up.declaredSha256} declared for it, so it was not read. Upload the file again.`,
      { declared: up.declaredSha256, stored: sha256 },
    );
  }
  await db().update(uploads).set({ sha256 }).where(eq(uploads.id, up.id));
  up.sha256 = sha256;
  const duplicate = await findDuplicate(up.siteId, sha256, up.id, { id: up.id, createdAt: up.createdAt });
  if (!duplicate) return null;
  const summary = { duplicateOf: duplicate.id, note: 'Same bytes as an earlier upload: not read again.' };
  await db().update(uploads).set({ status: 'done', duplicateOf: duplicate.id, finishedAt: sql`clock_timestamp()`, summary }).where(eq(uploads.id, up.id));
  return { kind: 'done', summary };
}

async function ingestLocked(uploadId: string, client: pg.PoolClient): Promise<IngestOutcome> {
  const startedMs = performance.now();
  const [up] = await db().select().from(uploads).where(eq(uploads.id, uploadId));
  if (!up) return { kind: 'skipped', why: 'no such upload' };
  if (up.status !== 'queued' && up.status !== 'processing') return { kind: 'skipped', why: `upload is ${up.status}` };
  const [site] = await db().select().from(sites).where(eq(sites.id, up.siteId));
  const timeZone = site?.timeZone ?? 'UTC';

  await db()
    .update(uploads)
    .set({ status: 'processing', attempts: sql`${uploads.attempts} + 1`, startedAt: new Date(), rowsRead: 0, bytesRead: 0, failureReason: null })
    .where(eq(uploads.id, uploadId));
  await client.query('delete from upload_rejects where upload_id = $1', [uploadId]);

  try {
    const repeat = await checkStoredObject(up);
    if (repeat) return repeat;
    const layout = await settleLayout(up, timeZone);
    if ('kind' in layout) return layout;
    const result = await readIntoTransaction(up, layout.profile, timeZone, site?.createdAt ?? new Date(), client);
    const { summary, state } = await finish(up, layout.profile, result, layout.profileId, client);
    if (process.env.LOSSLINE_INGEST_TIMING) console.log(`[ingest] ${uploadId}: read and committed in ${((performance.now() - startedMs) / 1000).toFixed(2)} s`);
    return { kind: state === 'done' ? 'done' : 'read-with-problems', summary };
  } catch (err) {
    await client.query('rollback').catch(() => undefined);
    return failedRead(uploadId, err);
  }
}
