/**
 * Month partitions of the two big tables, tag_hours and unit_hours (PostgreSQL declarative range
 * partitioning on hour_start; made partitioned by the migration scale-partitions).
 *
 * A month's partition is made before the first write into it: by the upkeep job ahead of time
 * (this month and the next ones), or on demand by the writer (an old file brings an older month).
 * It is made on its own short connection as a plain table and then ATTACHed: ATTACH PARTITION takes
 * only a SHARE UPDATE EXCLUSIVE lock on the parent, so the pages and an ingest transaction that is
 * writing into the parent at that moment are not blocked (CREATE TABLE ... PARTITION OF would take
 * an ACCESS EXCLUSIVE lock, and a long upload transaction would then wait on itself).
 *
 * Retention: a site may keep its tag hours and unit hours for a number of months (sites.retention_months;
 * null keeps them forever). The raw files in the object store are kept regardless, so older hours can
 * be read again. Partitions are shared by the sites of one database; a partition no site keeps any
 * more is dropped whole, otherwise the site's rows in it are deleted.
 */
import type pg from 'pg';
import { pgPool } from './client';
import { MINUTE_MS } from '~/lib/time';

export const PARTITIONED_TABLES = ['tag_hours', 'unit_hours'] as const;
export type PartitionedTable = (typeof PARTITIONED_TABLES)[number];

interface Queryable {
  query: pg.PoolClient['query'];
}

/** First instant of the UTC month holding t [ms]. */
export function monthStart(t: number): number {
  const d = new Date(t);
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), 1);
}
export function nextMonthStart(t: number): number {
  const d = new Date(t);
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + 1, 1);
}
/** Name of a month's partition, e.g. tag_hours_y2025m06. */
export function partitionName(table: PartitionedTable, t: number): string {
  const d = new Date(monthStart(t));
  return `${table}_y${d.getUTCFullYear()}m${String(d.getUTCMonth() + 1).padStart(2, '0')}`;
}

/**
 * Partitions seen to exist by this process, with when (a partition retention dropped in another
 * process is looked up again after a minute).
 */
const seen = new Map<string, number>();
const SEEN_FOR_MS = MINUTE_MS;
const known = {
  has: (name: string) => (seen.get(name) ?? -Infinity) > Date.now() - SEEN_FOR_MS,
  add: (name: string) => void seen.set(name, Date.now()),
  delete: (name: string) => void seen.delete(name),
};

/** True when every month partition of `table` covering [fromMs, toMs] was seen to exist lately. */
export function monthPartitionsKnown(table: PartitionedTable, fromMs: number, toMs: number): boolean {
  if (!Number.isFinite(fromMs) || !Number.isFinite(toMs)) return true;
  for (let m = monthStart(fromMs); m <= toMs; m = nextMonthStart(m)) if (!known.has(partitionName(table, m))) return false;
  return true;
}

/**
 * Makes sure the month partitions of `table` covering hour starts [fromMs, toMs] exist. Runs on its
 * own pooled connection, one short transaction per missing month.
 */
export async function ensureMonthPartitions(_caller: Queryable | null, table: PartitionedTable, fromMs: number, toMs: number): Promise<void> {
  if (!Number.isFinite(fromMs) || !Number.isFinite(toMs)) return;
  const missing: number[] = [];
  for (let m = monthStart(fromMs); m <= toMs; m = nextMonthStart(m)) if (!known.has(partitionName(table, m))) missing.push(m);
  if (!missing.length) return;
  const client = await pgPool().connect();
  try {
    for (const m of missing) {
      const name = partitionName(table, m);
      await client.query('begin');
      try {
        // Two workers making the same month wait for each other here, then see it made.
        await client.query('select pg_advisory_xact_lock(hashtext($1))', ['lossline-partition:' + name]);
        const { rows } = await client.query('select to_regclass($1) is not null as made', [name]);
        if (!rows[0].made) {
          const from = pgMonthBound(m);
          const to = pgMonthBound(nextMonthStart(m));
          await client.query(`create table ${name} (like ${table} including defaults including constraints)`);
          await client.query(`alter table ${table} attach partition ${name} for values from ('${from}') to ('${to}')`);
        }
        await client.query('commit');
        known.add(name);
      } catch (err) {
        await client.query('rollback').catch(() => undefined);
        throw err;
      }
    }
  } finally {
    client.release();
  }
}

/** The month partitions of a table with their ranges, oldest first. */
export async function monthPartitions(table: PartitionedTable, r: Queryable | null = null) {
  const run = r ?? { query: (q: string, p?: unknown[]) => pgPool().query(q, p) };
  const { rows } = await run.query(
    `select c.relname as name, pg_get_expr(c.relpartbound, c.oid) as bound
       from pg_inherits i join pg_class c on c.oid = i.inhrelid join pg_class p on p.oid = i.inhparent
      where p.relname = $1 order by c.relname`,
    [table],
  );
  return (rows as { name: string; bound: string }[]).map((x) => {
    const m = /FROM \('([^']+)'\) TO \('([^']+)'\)/.exec(x.bound);
    return { name: x.name, fromMs: m ? new Date(m[1]!).getTime() : NaN, toMs: m ? new Date(m[2]!).getTime() : NaN };
  });
}

/** How many months ahead of the current one the upkeep job makes partitions. */
export const MONTHS_AHEAD = 2;

/**
 * The upkeep job's work: partitions for this month and MONTHS_AHEAD more, then each site's retention.
 * Returns what it did, for the log and the tests.
 */
export async function partitionUpkeep(nowMs = Date.now()): Promise<{ made: number; deletedTagHours: number; deletedUnitHours: number; dropped: string[] }> {
  let ahead = nowMs;
  for (let i = 0; i < MONTHS_AHEAD; i++) ahead = nextMonthStart(ahead);
  let made = 0;
  for (const t of PARTITIONED_TABLES) {
    const had = new Set((await monthPartitions(t)).map((p) => p.name));
    await ensureMonthPartitions(null, t, nowMs, ahead);
    made += (await monthPartitions(t)).filter((p) => !had.has(p.name)).length;
  }
  const pool = pgPool();
  const { rows: siteRows } = await pool.query('select id, retention_months from sites');
  const sitesAll = siteRows as { id: string; retention_months: number | null }[];
  let deletedTagHours = 0;
  let deletedUnitHours = 0;
  const dropped: string[] = [];
  const cutoffOf = (months: number) => {
    const d = new Date(monthStart(nowMs));
    return Date.UTC(d.getUTCFullYear(), d.getUTCMonth() - months, 1);
  };
  for (const s of sitesAll) {
    if (s.retention_months === null) continue;
    const cutoff = new Date(cutoffOf(s.retention_months)).toISOString();
    const a = await pool.query(`delete from tag_hours where hour_start < $2 and tag_id in (select seq from tags where site_id = $1)`, [s.id, cutoff]);
    const b = await pool.query(`delete from unit_hours where hour_start < $2 and unit_id in (select id from plant_units where site_id = $1)`, [s.id, cutoff]);
    deletedTagHours += a.rowCount ?? 0;
    deletedUnitHours += b.rowCount ?? 0;
  }
  // A month every site lets go of is dropped whole (only when every site has a retention setting).
  if (sitesAll.length && sitesAll.every((s) => s.retention_months !== null)) {
    const keepFrom = Math.min(...sitesAll.map((s) => cutoffOf(s.retention_months!)));
    for (const t of PARTITIONED_TABLES) {
      for (const p of await monthPartitions(t)) {
        if (p.toMs <= keepFrom) {
          await pool.query(`drop table if exists ${p.name}`);
          known.delete(p.name);
          dropped.push(p.name);
        }
      }
    }
  }
  return { made, deletedTagHours, deletedUnitHours, dropped };
}

/** A month's first instant as PostgreSQL reads it (JS writes years past 9999 as '+010000-...', which it does not). */
function pgMonthBound(ms: number): string {
  const d = new Date(ms);
  return `${d.getUTCFullYear()}-${String(d.getUTCMonth() + 1).padStart(2, '0')}-01 00:00:00+00`;
}
