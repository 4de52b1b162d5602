import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import { env } from '../env';
import * as schema from './schema';

let pool: pg.Pool | undefined;
let database: ReturnType<typeof drizzle<typeof schema>> | undefined;

/** The shared connection pool (one per process). */
export function pgPool(): pg.Pool {
  pool ??= new pg.Pool({ connectionString: env().DATABASE_URL, max: 10 });
  return pool;
}

/** The Drizzle client over the shared pool. */
export function db() {
  database ??= drizzle(pgPool(), { schema });
  return database;
}

export type Db = ReturnType<typeof db>;

export async function closeDb(): Promise<void> {
  const p = pool;
  pool = undefined;
  database = undefined;
  await p?.end();
}
