import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import { pgPool } from '../db/client';
import * as schema from '../db/schema';

export type Tx = NodePgDatabase<typeof schema>;
/** Runs SQL on the transaction's connection (pg-boss send inside the transaction). */
export type Exec = (text: string, values: unknown[]) => Promise<{ rows: unknown[] }>;

/**
 * Runs fn in one transaction on one pooled connection, with `exec` for pg-boss sends that must
 * commit together with the rows (no mail job without its marker, no marker without its job).
 */
export async function inInsightTx<T>(fn: (tx: Tx, exec: Exec) => Promise<T>): Promise<T> {
  const client = await pgPool().connect();
  try {
    await client.query('BEGIN');
    const tx = drizzle(client, { schema });
    const out = await fn(tx, (text, values) => client.query(text, values as unknown[]));
    await client.query('COMMIT');
    return out;
  } catch (err) {
    await client.query('ROLLBACK').catch(() => undefined);
    throw err;
  } finally {
    client.release();
  }
}
