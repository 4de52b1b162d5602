/**
 * How an upload ends when its read stops: a problem of the file fails it at once with a catalogued
 * message; anything outside the file (the database or the store unreachable) puts it back in the
 * queue, until MAX_ATTEMPTS attempts have failed. The transaction was rolled back before, so nothing
 * of the file is stored; the raw file stays in the store.
 */
import { eq, sql } from 'drizzle-orm';
import { IngestError } from '~/lib/ingest';
import { db } from '../db/client';
import { uploads } from '../db/schema';
import { storable, storableJson } from './ingest-text';

/** Attempts before an upload that keeps failing for reasons outside the file is marked failed. */
export const MAX_ATTEMPTS = 3;

export type IngestOutcome =
  | { kind: 'done'; summary: Record<string, unknown> }
  | { kind: 'read-with-problems'; summary: Record<string, unknown> }
  | { kind: 'needs-review' }
  | { kind: 'failed'; reason: string }
  | { kind: 'skipped'; why: string };

/**
 * The file's own problems, as catalogued errors: an IngestError; PostgreSQL refusing a value of the
 * file (data exceptions, class 22, and size limits, class 54: text it cannot store); a fault of the
 * reader itself on this file (a TypeError or RangeError from the reading code: retrying cannot
 * help). Anything else (the database or the store unreachable) is outside the file: null.
 */
function asFileError(err: unknown): IngestError | null {
  if (err instanceof IngestError) return err;
  const e = err as { code?: unknown; message?: string; $metadata?: unknown };
  if (typeof e?.code === 'string' && /^(22|54)[0-9A-Z]{3}$/.test(e.code)) {
    return new IngestError(
      'UNSTORABLE_TEXT',
      `The file holds a value the database cannot store (${e.message ?? e.code}). Nothing of it was stored; check the export for unusual characters or enormous cells.`,
      { sqlState: e.code },
    );
  }
  if ((err instanceof TypeError || err instanceof RangeError) && e.$metadata === undefined && typeof e.code !== 'string') {
    return new IngestError(
      'READER_FAULT',
      `Lossline's reader failed on this file (${err.message}): a fault in Lossline, not in the file. The raw file is kept; report the upload so it can be fixed and read again.`,
    );
  }
  return null;
}

/** Records why the read stopped; returns the outcome, or rethrows for the queue's retry. */
export async function failedRead(uploadId: string, err: unknown): Promise<IngestOutcome> {
  const fileError = asFileError(err);
  if (fileError) {
    const where = fileError.line ? ` (line ${fileError.line})` : '';
    const reason = storable(`${fileError.message}${where}`);
    await db()
      .update(uploads)
      .set({ status: 'failed', failureReason: reason, finishedAt: sql`clock_timestamp()`, summary: JSON.parse(storableJson({ code: fileError.code, details: fileError.details })) })
      .where(eq(uploads.id, uploadId));
    return { kind: 'failed', reason };
  }
  const [now] = await db().select({ attempts: uploads.attempts }).from(uploads).where(eq(uploads.id, uploadId));
  if ((now?.attempts ?? MAX_ATTEMPTS) >= MAX_ATTEMPTS) {
    const reason = `Reading stopped ${now?.attempts} times for a reason outside the file (${(err as Error).message}). The raw file is kept; retry when the service is back.`;
    await db().update(uploads).set({ status: 'failed', failureReason: reason, finishedAt: sql`clock_timestamp()` }).where(eq(uploads.id, uploadId));
    return { kind: 'failed', reason };
  }
  await db().update(uploads).set({ status: 'queued' }).where(eq(uploads.id, uploadId));
  throw err;
}
