/**
 * The locks of reading an upload. The per-upload advisory lock is held on the reading worker's own
 * database session for as long as it reads: a second worker does not start on the same file, and the
 * lock doubles as a test of life (PostgreSQL releases it the moment that session ends, so an upload
 * left 'processing' with its lock free has lost its reader; ingest-resume.ts). The per-site lock is
 * taken inside the upload's transaction (ingest-stream.ts).
 */
import type pg from 'pg';
import { pgPool } from '../db/client';

/**
 * A pooled connection, or null when the pool gives none within `ms` (a connection that comes later
 * goes straight back to the pool).
 */
async function connectWithin(ms: number): Promise<pg.PoolClient | null> {
  const pending = pgPool().connect();
  let timer: NodeJS.Timeout | undefined;
  const late = new Promise<null>((resolve) => {
    timer = setTimeout(() => resolve(null), ms);
  });
  const client = await Promise.race([pending, late]);
  clearTimeout(timer);
  if (!client) pending.then((c) => c.release(), () => undefined);
  return client;
}

/**
 * Runs fn on a pooled connection holding the upload's advisory lock; null when another session holds
 * it. The lock is released after fn, and the connection returned to the pool. With
 * `connectWithinMs`, also null when the pool gives no connection in that time (a caller that must
 * not wait).
 */
export async function withUploadLock<T>(uploadId: string, fn: (client: pg.PoolClient) => Promise<T>, options: { connectWithinMs?: number } = {}): Promise<T | null> {
  const client = options.connectWithinMs === undefined ? await pgPool().connect() : await connectWithin(options.connectWithinMs);
  if (!client) return null;
  try {
    const { rows } = await client.query('select pg_try_advisory_lock(hashtextextended($1, 0)) as ok', ['ingest:' + uploadId]);
    if (!rows[0].ok) return null;
    try {
      return await fn(client);
    } finally {
      await client.query('select pg_advisory_unlock(hashtextextended($1, 0))', ['ingest:' + uploadId]);
    }
  } finally {
    client.release();
  }
}
