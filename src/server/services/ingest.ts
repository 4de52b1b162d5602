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
 *   ingest-early.ts   a machine upload read while it arrives, in the web process (else read here)
 */
import { createHash } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import type pg from 'pg';
import { IngestError } from '~/lib/ingest';
import { db } from '../db/client';
import { sites, uploads } from '../db/schema';
import { objectStream } from '../storage';
import { findDuplicate, repeatToYieldTo, storedObjectMismatch } from './uploads';
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

/** The hash the browser declared is a claim; only the stored bytes decide. Throws when they differ. */
function checkDeclaredHash(up: Upload, sha256: string) {
  if (up.declaredSha256 && up.declaredSha256 !== sha256) {
    throw new IngestError(
      'HASH_MISMATCH',
      `The stored file's SHA-256 is ${sha256}, not the ${up.declaredSha256} declared for it, so it was not read. Upload the file again.`,
      { declared: up.declaredSha256, stored: sha256 },
    );
  }
}

/** Ends an upload whose bytes repeat an earlier upload's: done, not read, pointing at the first. */
async function standAside(up: Upload, sha256: string, duplicateId: string): Promise<IngestOutcome> {
  const summary = { duplicateOf: duplicateId, note: 'Same bytes as an earlier upload: not read again.' };
  await db().update(uploads).set({ sha256, status: 'done', duplicateOf: duplicateId, finishedAt: sql`clock_timestamp()`, summary }).where(eq(uploads.id, up.id));
  return { kind: 'done', summary };
}

/**
 * An upload whose hash is not known yet (a browser upload) that stops for a layout question: its
 * stored bytes are hashed first (one download; the read after the answer is the second), so a repeat
 * of an earlier file is told as such instead of asking again. Returns the outcome of a repeat, else null.
 */
async function hashBeforeQuestion(up: Upload): Promise<IngestOutcome | null> {
  const sha256 = await hashObject(up.objectKey);
  checkDeclaredHash(up, sha256);
  await db().update(uploads).set({ sha256 }).where(eq(uploads.id, up.id));
  up.sha256 = sha256;
  const duplicate = await findDuplicate(up.siteId, sha256, up.id, { id: up.id, createdAt: up.createdAt });
  return duplicate ? standAside(up, sha256, duplicate.id) : null;
}

/**
 * The hash taken while the file was read (an upload not hashed before), checked before the commit:
 * a hash other than the declared one fails the read; a repeat of another upload rolls it back and
 * stands aside. Reads of one site are serialised by the site's ingest lock (ingest-stream.ts), so
 * any other upload of these bytes has either committed (and is the first) or is queued with its hash
 * known: it is the one read, whatever the order of creation. Returns the outcome of a repeat, else null.
 */
async function repeatBeforeCommit(up: Upload, sha256: string, client: pg.PoolClient): Promise<IngestOutcome | null> {
  checkDeclaredHash(up, sha256);
  const duplicate = await findDuplicate(up.siteId, sha256, up.id);
  if (!duplicate) return null;
  await client.query('rollback');
  return standAside(up, sha256, duplicate.id);
}

/**
 * An upload whose hash was known before the read (a machine upload): another copy of the same bytes
 * may have been read meanwhile (two copies sent together each found no earlier one read), so before
 * the commit it yields as repeatToYieldTo says. Returns the outcome of a repeat, else null.
 */
async function knownRepeatBeforeCommit(up: Upload, sha256: string, client: pg.PoolClient): Promise<IngestOutcome | null> {
  const first = await repeatToYieldTo(up.siteId, sha256, up);
  if (!first) return null;
  await client.query('rollback');
  return standAside(up, sha256, first.id);
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
    if (up.source === 'browser') {
      const mismatch = await storedObjectMismatch(up);
      if (mismatch) throw new IngestError('SIZE_MISMATCH', mismatch, { declaredBytes: up.sizeBytes });
    }
    const layout = await settleLayout(up, timeZone, up.sha256 ? undefined : () => hashBeforeQuestion(up));
    if ('kind' in layout) return layout;
    // Not hashed yet (a browser upload): hashed during the read, checked for a repeat before the commit.
    const result = await readIntoTransaction(up, layout.profile, timeZone, site?.createdAt ?? new Date(), client, !up.sha256);
    const repeat = result.sha256 ? await repeatBeforeCommit(up, result.sha256, client) : up.sha256 ? await knownRepeatBeforeCommit(up, up.sha256, client) : null;
    if (repeat) return repeat;
    const { summary, state } = await finish(up, layout.profile, result, layout.profileId, client);
    if (process.env.LOSSLINE_INGEST_TIMING) console.log(`[ingest] ${uploadId}: read and committed in ${((performance.now() - startedMs) / 1000).toFixed(2)} s`);
    return { kind: state === 'done' ? 'done' : 'read-with-problems', summary };
  } catch (err) {
    await client.query('rollback').catch(() => undefined);
    return failedRead(uploadId, err);
  }
}
