/**
 * Reading a machine upload while it is uploading. The files endpoint (receiveApiUpload in
 * uploads.ts) tees the counted, hashed body into the store's PUT and into this reader, which reads
 * the bytes into the upload's transaction as they arrive; when the PUT has finished and the hash is
 * known, the repeat check runs and the read commits, so the upload is done when the endpoint answers.
 *
 * The reader only ever commits a successful read. At any doubt it gives up: its transaction rolls
 * back, its branch of the body keeps being drained (the PUT never stalls), and the upload is queued
 * for the worker exactly as before, which reads the stored file and reaches its own verdict. It gives
 * up when: the layout is not a settled profile without question; the file has a problem (an
 * IngestError: the worker fails it with the catalogued message); the database or the reader fails;
 * another read of the site holds the site's ingest lock (taken WITHOUT waiting: a slow client must
 * never keep other files of the site waiting, and the read must never wait while the client sends);
 * the pool gives it no connection at once.
 *
 * Settings (read per upload): INGEST_WHILE_UPLOADING_MAX_MB (default 256; 0 turns it off), the
 * largest declared Content-Length read this way [MiB]; INGEST_WHILE_UPLOADING_AT_ONCE (default 1),
 * how many such reads run at once in this process (another upload meanwhile goes the worker's way).
 * Memory: the two branches hold a few chunks each (the slower one throttles the body), and the read
 * itself holds what the worker's read holds (bounded batches), per read running.
 */
import { PassThrough } from 'node:stream';
import { isDeepStrictEqual } from 'node:util';
import { eq, sql } from 'drizzle-orm';
import type pg from 'pg';
import { db } from '../db/client';
import { READ_STATUSES, sites, uploads } from '../db/schema';
import { finish } from './ingest-finish';
import { LAYOUT_SAMPLE_BYTES, judgeLayout, saveDetectedProfile } from './ingest-layout';
import { withUploadLock } from './ingest-locks';
import { readIntoTransaction } from './ingest-stream';
import { storableJson } from './ingest-text';

type Upload = typeof uploads.$inferSelect;

const MIB = 1024 * 1024;

/** The settings of reading while uploading: the largest body read so [bytes] (0: off) and how many at once. */
export function earlyReadSettings(): { maxBytes: number; atOnce: number } {
  const mb = Number(process.env.INGEST_WHILE_UPLOADING_MAX_MB ?? 256);
  const atOnce = Number(process.env.INGEST_WHILE_UPLOADING_AT_ONCE ?? 1);
  return {
    maxBytes: Number.isFinite(mb) && mb >= 0 ? mb * MIB : 256 * MIB,
    atOnce: Number.isInteger(atOnce) && atOnce >= 0 ? atOnce : 1,
  };
}

/** How long the reader waits for a pooled connection before it leaves the upload to the worker [ms]. */
const CONNECT_WITHIN_MS = 1000;

/** Reads running in this process. */
let running = 0;

/** The upload's end as the reader leaves it. */
export type EarlyVerdict =
  /** Read and committed: done or read-with-problems. */
  | { kind: 'read'; state: string }
  /** The same bytes as an earlier upload: rolled back, marked as standing aside for it. */
  | { kind: 'repeat'; duplicateOf: string }
  /** Not read here (rolled back): the upload goes to the worker as before. */
  | { kind: 'gave-up'; why: string }
  /** The body broke or the PUT failed: rolled back; the upload fails as before. */
  | { kind: 'aborted' };

export interface EarlyRead {
  /** The reader's branch of the body: the counted body is piped into it beside the store's. */
  readonly branch: PassThrough;
  /** The PUT has finished: the whole body's SHA-256 and length. Resolves with the reader's verdict. */
  settle(put: { sha256: string; bytes: number }): Promise<EarlyVerdict>;
  /** The body broke or the PUT failed: the reader stops and rolls back; resolves when it has. */
  abort(err: Error): Promise<void>;
}

/**
 * Starts a reader for a machine upload whose body is `sizeBytes` long (its declared
 * Content-Length), or null when reading while uploading is off, the body is above its size limit or
 * as many such reads run as allowed. `repeatOf` is the repeat check of the upload (findDuplicate).
 */
export function startEarlyRead(up: Upload, sizeBytes: number, repeatOf: RepeatCheck): EarlyRead | null {
  const { maxBytes, atOnce } = earlyReadSettings();
  if (maxBytes <= 0 || sizeBytes > maxBytes || running >= atOnce) return null;
  running++;
  const branch = new PassThrough();
  // Its errors (the body broke) reach the reader through its reading; none goes unhandled.
  branch.on('error', () => undefined);
  let resolvePut!: (p: PutResult) => void;
  let rejectPut!: (err: Error) => void;
  const put = new Promise<PutResult>((resolve, reject) => {
    resolvePut = resolve;
    rejectPut = reject;
  });
  put.catch(() => undefined);
  const state = { aborted: false };
  const verdict = readEarly(up, branch, put, repeatOf, state)
    .catch((err: unknown): EarlyVerdict => (state.aborted ? { kind: 'aborted' } : { kind: 'gave-up', why: (err as Error).message }))
    .finally(() => {
      running--;
    });
  return {
    branch,
    settle(p) {
      resolvePut(p);
      return verdict;
    },
    async abort(err) {
      state.aborted = true;
      rejectPut(err);
      if (!branch.destroyed) branch.destroy(err);
      await verdict;
    },
  };
}

type PutResult = { sha256: string; bytes: number };
type RepeatCheck = (sha256: string) => Promise<{ id: string } | null>;

/** The branch's chunks until at least `n` bytes (or its end): the head the layout is decided from. */
async function readHead(chunks: AsyncIterator<Buffer>, n: number): Promise<{ head: Buffer[]; bytes: number }> {
  const head: Buffer[] = [];
  let bytes = 0;
  while (bytes < n) {
    const next = await chunks.next();
    if (next.done) break;
    head.push(next.value);
    bytes += next.value.length;
  }
  return { head, bytes };
}

/** The head's chunks again, then the rest of the branch (the branch is not ended when the read stops early). */
async function* headThenRest(head: Buffer[], chunks: AsyncIterator<Buffer>): AsyncGenerator<Buffer> {
  yield* head;
  for (;;) {
    const next = await chunks.next();
    if (next.done) return;
    yield next.value;
  }
}

async function readEarly(up: Upload, branch: PassThrough, put: Promise<PutResult>, repeatOf: RepeatCheck, state: { aborted: boolean }): Promise<EarlyVerdict> {
  const startedMs = performance.now();
  const chunks = branch.iterator({ destroyOnReturn: false }) as AsyncIterator<Buffer>;
  let draining = false;
  /** From now on the branch is read and dropped: the PUT never waits for a reader that stopped. */
  const drain = async () => {
    if (draining) return;
    draining = true;
    await chunks.return?.();
    if (branch.destroyed) return;
    branch.on('data', () => undefined);
    branch.resume();
  };
  try {
    await db().update(uploads).set({ startedAt: new Date() }).where(eq(uploads.id, up.id));
    const [site] = await db().select().from(sites).where(eq(sites.id, up.siteId));
    const timeZone = site?.timeZone ?? 'UTC';
    const out = await withUploadLock(
      up.id,
      async (client): Promise<EarlyVerdict> => {
        try {
          return await readLocked(up, client, timeZone, site?.createdAt ?? new Date(), chunks, put, repeatOf, startedMs);
        } catch (err) {
          await drain();
          await client.query('rollback').catch(() => undefined);
          if (state.aborted) return { kind: 'aborted' };
          // A commit whose answer was lost: the upload is read (the worker must not read it again).
          const [now] = await db().select({ status: uploads.status }).from(uploads).where(eq(uploads.id, up.id));
          if (now && (READ_STATUSES as readonly string[]).includes(now.status)) return { kind: 'read', state: now.status };
          return { kind: 'gave-up', why: (err as Error).message };
        }
      },
      { connectWithinMs: CONNECT_WITHIN_MS },
    );
    const verdict: EarlyVerdict = out ?? { kind: 'gave-up', why: 'no database connection or upload lock at once' };
    if (process.env.LOSSLINE_INGEST_TIMING) {
      const how = verdict.kind === 'gave-up' ? `gave up (${verdict.why}), left to the worker,` : verdict.kind === 'read' ? 'read while uploading and committed' : verdict.kind;
      console.log(`[ingest] ${up.id}: ${how} in ${((performance.now() - startedMs) / 1000).toFixed(2)} s`);
    }
    return verdict;
  } finally {
    await drain();
  }
}

async function readLocked(
  up: Upload,
  client: pg.PoolClient,
  timeZone: string,
  siteCreatedAt: Date,
  chunks: AsyncIterator<Buffer>,
  put: Promise<PutResult>,
  repeatOf: RepeatCheck,
  startedMs: number,
): Promise<EarlyVerdict> {
  const { head, bytes } = await readHead(chunks, LAYOUT_SAMPLE_BYTES);
  const judged = await judgeLayout(up, timeZone, new Uint8Array(Buffer.concat(head, bytes)));
  if (judged.kind === 'question') throw new Error('the layout has a question for a person');
  // Hashed by the upload's counter, not here; the site's lock only tried (SiteIngestBusy).
  const result = await readIntoTransaction(up, judged.profile, timeZone, siteCreatedAt, client, false, headThenRest(head, chunks), { waitForSite: false });
  if (process.env.LOSSLINE_INGEST_TIMING) console.log(`[ingest] ${up.id}: whole body read ${((performance.now() - startedMs) / 1000).toFixed(2)} s after the reader started`);
  const { sha256, bytes: size } = await put;
  await db().update(uploads).set({ sha256, sizeBytes: size, status: 'processing' }).where(eq(uploads.id, up.id));
  // The repeat check of the upload, under the site's ingest lock as the worker's before its commit.
  const duplicate = await repeatOf(sha256);
  if (duplicate) {
    await client.query('rollback');
    await db()
      .update(uploads)
      .set({ status: 'done', duplicateOf: duplicate.id, finishedAt: sql`clock_timestamp()`, summary: { duplicateOf: duplicate.id, note: 'Same bytes as an earlier upload: not read again.' } })
      .where(eq(uploads.id, up.id));
    return { kind: 'repeat', duplicateOf: duplicate.id };
  }
  let profileId = judged.profileId;
  if (judged.detected) {
    // The file's own layout is kept as the site's profile, as the worker keeps it (only now: an
    // upload that breaks leaves nothing). Another file of this shape saved a different one first:
    // give up, the worker reads with that one.
    const saved = await saveDetectedProfile(up, judged.profile);
    if (!isDeepStrictEqual(saved.profile, JSON.parse(storableJson(judged.profile)))) throw new Error('another profile of this layout was saved meanwhile');
    profileId = saved.profileId;
  }
  const { state } = await finish(up, judged.profile, result, profileId, client);
  return { kind: 'read', state };
}
