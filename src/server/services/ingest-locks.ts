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
 * Runs fn on a pooled connection holding the upload's advisory lock; null when another session holds
 * it. The lock is released after fn, and the connection returned to the pool.
 */
export async function withUploadLock<T>(uploadId: string, fn: (client: pg.PoolClient) => Promise<T>): Promise<T | null> {
  const client = await pgPool().connect();
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
