import { pgPool } from '~/server/db/client';

/** A query as it reached the pool: its text and its parameters. */
export type SentQuery = { text: string; values: unknown[] };

/**
 * The queries sent through the app's pool while `run` runs, those that `keep` accepts. drizzle
 * sends ({ text, rowMode, types }, values); the values may also ride in the first argument.
 */
export async function queriesSent(keep: (q: SentQuery) => boolean, run: () => Promise<unknown>): Promise<SentQuery[]> {
  const pool = pgPool() as unknown as { query: (...a: unknown[]) => Promise<unknown> };
  const query = pool.query;
  const sent: SentQuery[] = [];
  pool.query = (...a: unknown[]) => {
    const first = typeof a[0] === 'string' ? { text: a[0] } : (a[0] as { text?: string; values?: unknown[] });
    const q = { text: first.text ?? '', values: (a[1] as unknown[] | undefined) ?? first.values ?? [] };
    if (keep(q)) sent.push(q);
    return query.apply(pool, a);
  };
  try {
    await run();
  } finally {
    pool.query = query;
  }
  return sent;
}
