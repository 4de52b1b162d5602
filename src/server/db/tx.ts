import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import { pgPool, type db } from './client';
import * as schema from './schema';

export type Tx = NodePgDatabase<typeof schema>;
/** What a read runs on: a transaction, or the pool's client. */
export type Reader = Tx | ReturnType<typeof db>;
/** Runs SQL on the transaction's connection (a pg-boss send that must commit with the rows). */
export type Exec = (text: string, values: unknown[]) => Promise<{ rows: unknown[] }>;

/**
 * Runs fn in one transaction on one pooled connection. `exec` runs raw SQL on that same connection,
 * so jobs sent through it (pg-boss `send(..., { db: { executeSql: exec } })`) commit together with
 * the rows or not at all.
 */
export async function withTransaction<T>(fn: (tx: Tx, exec: Exec) => Promise<T>): Promise<T> {
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
