/**
 * Bytes per row of a partitioned table as stored: the total relation size of every partition (heap,
 * TOAST, indexes, free-space and visibility maps) over the number of rows. Used by the benches to
 * print tag_hour_bytes and unit_hour_bytes.
 */
import { sql } from 'drizzle-orm';
import { db } from '~/server/db/client';

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

/** Size of one month partition over its rows. */
export async function partitionBytes(name: string): Promise<{ bytes: number; rows: number; perRow: number }> {
  await db().execute(sql.raw(`analyze ${name}`));
  const res = await db().execute<{ bytes: string; rows: string }>(sql.raw(`select pg_total_relation_size('${name}')::bigint as bytes, (select count(*) from ${name})::bigint as rows`));
  const bytes = Number(res.rows[0]!.bytes);
  const rows = Number(res.rows[0]!.rows);
  return { bytes, rows, perRow: bytes / rows };
}

/**
 * Unit hours as the job writes them, for the bench's synthetic 50-unit site (bench/engine.ts): a
 * month (January 2031) of every unit computed by the engine and written through the job's writer, in
 * the month's own partition, measured, then removed.
 */
async function syntheticUnitHours(hours: number) {
  const { buildSite } = await import('./engine');
  const { computeUnitHour } = await import('~/lib/engine');
  const { plantUnits, sites, unitHours } = await import('~/server/db/schema');
  const { ensureMonthPartitions } = await import('~/server/db/partitions');
  const { unitHourRowOf, writeUnitHours } = await import('~/server/services/engine');
  const { eq } = await import('drizzle-orm');
  const T = Date.UTC(2031, 0, 1);
  await ensureMonthPartitions(null, 'unit_hours', T, T + hours * 3_600_000 - 1);
  const [site] = await db().insert(sites).values({ name: `Storage bench ${Date.now()}` }).returning();
  const units = buildSite();
  const ids: string[] = [];
  for (const u of units) {
    const [row] = await db().insert(plantUnits).values({ siteId: site!.id, name: u.input.unit.name, kind: u.input.unit.kind }).returning();
    ids.push(row!.id);
  }
  const { hourOf, rng } = await import('./engine');
  const r = rng(7);
  const now = new Date();
  for (let h = 0; h < hours; h++) {
    const rows = units.map((u, i) => unitHourRowOf(ids[i]!, T + h * 3_600_000, computeUnitHour({ ...u.input, tagHours: hourOf(u, h, r), hourStartMs: T + h * 3_600_000 }), now));
    await writeUnitHours(db(), rows);
  }
  const out = await partitionBytes('unit_hours_y2031m01');
  await db().delete(sites).where(eq(sites.id, site!.id));
  return out;
}

/** `npm run bench:storage`: the figures of the database DATABASE_URL points at (a demo, a test run). */
if (process.argv[1]?.endsWith('storage.ts')) {
  const { closeDb } = await import('~/server/db/client');
  const syn = await syntheticUnitHours(Number(process.argv.find((a) => a.startsWith('--hours='))?.split('=')[1] ?? 744));
  console.log(`unit_hour_bytes ${syn.perRow.toFixed(1)}  (synthetic 50-unit bench site, ${syn.rows} unit hours in one month partition, ${(syn.bytes / 1e6).toFixed(2)} MB with indexes; target <= 400)`);
  const u = await bytesPerRow('unit_hours');
  const t = await bytesPerRow('tag_hours');
  const states = await db().execute<{ state: string; n: string }>(sql`select state, count(*) as n from unit_hours group by state order by state`);
  console.log(`whole database: unit hours ${u.perRow.toFixed(1)} bytes per row (${u.rows} rows, ${(u.bytes / 1e6).toFixed(2)} MB with indexes; target <= 400; states ${states.rows.map((r) => `${r.state} ${r.n}`).join(', ')})`);
  console.log(`whole database: tag hours ${t.perRow.toFixed(1)} bytes per row (${t.rows} rows, ${(t.bytes / 1e6).toFixed(2)} MB with indexes, empty month partitions included; tag_hour_bytes is printed by bench:ingest)`);
  await closeDb();
}
