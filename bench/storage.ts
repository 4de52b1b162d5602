/**
 * Bytes per row of a partitioned table as stored: the total relation size of every partition (heap,
 * TOAST, indexes, free-space and visibility maps) over the number of rows. Used by the benches to
 * print tag_hour_bytes and unit_hour_bytes.
 */
import { sql } from 'drizzle-orm';
import { db } from '../src/server/db/client';

export async function bytesPerRow(table: 'tag_hours' | 'unit_hours'): Promise<{ bytes: number; rows: number; perRow: number }> {
  await db().execute(sql.raw(`analyze ${table}`));
  const res = await db().execute<{ bytes: string; rows: string }>(
    sql.raw(`select (select coalesce(sum(pg_total_relation_size(c.oid)), 0) from pg_inherits i join pg_class c on c.oid = i.inhrelid
                      where i.inhparent = '${table}'::regclass)::bigint as bytes,
                    (select count(*) from ${table})::bigint as rows`),
  );
  const bytes = Number(res.rows[0]!.bytes);
  const rows = Number(res.rows[0]!.rows);
  return { bytes, rows, perRow: rows ? bytes / rows : NaN };
}

/** `npm run bench:storage`: the figures of the database DATABASE_URL points at (a demo, a test run). */
if (process.argv[1]?.endsWith('storage.ts')) {
  const { closeDb } = await import('../src/server/db/client');
  const u = await bytesPerRow('unit_hours');
  const t = await bytesPerRow('tag_hours');
  const states = await db().execute<{ state: string; n: string }>(sql`select state, count(*) as n from unit_hours group by state order by state`);
  console.log(`unit_hour_bytes ${u.perRow.toFixed(1)}  (${u.rows} rows, ${(u.bytes / 1e6).toFixed(2)} MB with indexes; target <= 400; states ${states.rows.map((r) => `${r.state} ${r.n}`).join(', ')})`);
  console.log(`tag_hour_bytes ${t.perRow.toFixed(1)}  (${t.rows} rows, ${(t.bytes / 1e6).toFixed(2)} MB with indexes; target <= 120)`);
  await closeDb();
}
