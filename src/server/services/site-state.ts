/**
 * A site's processing state: what is still on its way from the files it was sent to the figures it
 * shows, so a script (or a page) can tell when the figures of what it sent are final. Read from the
 * uploads table and from pg-boss's own job table (the jobs a site's work is queued as).
 */
import { sql } from 'drizzle-orm';
import { QUEUES } from '~/jobs';
import { db } from '~/server/db/client';

export interface SiteWorkCounts {
  /** Jobs not yet started (created, or waiting to retry). */
  waiting: number;
  /** Jobs a worker holds now. */
  active: number;
}

export interface SiteProcessingState {
  siteId: string;
  /** True when nothing below is waiting or running: the site's figures are final for what it was sent. */
  settled: boolean;
  files: {
    /** Browser uploads whose bytes have not arrived, and files queued for reading. */
    waiting: number;
    /** Files a worker is reading now. */
    reading: number;
    /** Files stopped for a person's answer (a layout question); not counted against `settled`. */
    needsReview: number;
  };
  /** Unit hours waiting to be computed or being computed: the engine's requests, unit-months and the settle step that sends the drift check. */
  compute: SiteWorkCounts;
  /** Drift checks and the idle and limit rules of units, after the engine stored hours. */
  driftCheck: SiteWorkCounts;
  /** The newest hour any unit of the site has a computed balance for (ISO instant), or null. */
  latestComputedHour: string | null;
  /** The newest hour any tag of the site has statistics for (ISO instant), or null. */
  latestTagHour: string | null;
  asOf: string;
}

type Row = Record<string, unknown>;
const num = (v: unknown) => Number(v ?? 0);
const iso = (v: unknown) => (v == null ? null : new Date(v as string).toISOString());

async function fileCounts(siteId: string) {
  const { rows } = await db().execute(sql`
    select count(*) filter (where status in ('awaiting-file', 'queued')) as waiting,
           count(*) filter (where status = 'processing') as reading,
           count(*) filter (where status = 'needs-review') as needs_review
      from uploads where site_id = ${siteId}`);
  const r = (rows[0] ?? {}) as Row;
  return { waiting: num(r.waiting), reading: num(r.reading), needsReview: num(r.needs_review) };
}

/** Jobs of the named queues whose payload names this site, by state (pg-boss 10's job table). */
async function jobCounts(siteId: string, queues: readonly string[]): Promise<SiteWorkCounts> {
  const names = sql.join(queues.map((q) => sql`${q}`), sql`, `);
  const { rows } = await db().execute(sql`
    select count(*) filter (where state in ('created', 'retry')) as waiting,
           count(*) filter (where state = 'active') as active
      from pgboss.job
     where name in (${names}) and data->>'siteId' = ${siteId} and state in ('created', 'retry', 'active')`);
  const r = (rows[0] ?? {}) as Row;
  return { waiting: num(r.waiting), active: num(r.active) };
}

async function latestHours(siteId: string) {
  // Each max() reads the newest partition's index first: cheap on a ten-year site.
  const { rows } = await db().execute(sql`
    select (select max(uh.hour_start) from unit_hours uh join plant_units u on u.id = uh.unit_id
             where u.site_id = ${siteId}) as latest_unit_hour,
           (select max(th.hour_start) from tag_hours th join tags t on t.seq = th.tag_id
             where t.site_id = ${siteId}) as latest_tag_hour`);
  const r = (rows[0] ?? {}) as Row;
  return { latestComputedHour: iso(r.latest_unit_hour), latestTagHour: iso(r.latest_tag_hour) };
}

export async function siteProcessingState(siteId: string): Promise<SiteProcessingState> {
  const [files, compute, driftCheck, latest] = await Promise.all([
    fileCounts(siteId),
    jobCounts(siteId, [QUEUES.computeUnitHours, QUEUES.computeUnitMonth, QUEUES.computeSettle]),
    jobCounts(siteId, [QUEUES.checkDrift, QUEUES.checkUnitRules]),
    latestHours(siteId),
  ]);
  const busy = files.waiting + files.reading + compute.waiting + compute.active + driftCheck.waiting + driftCheck.active;
  return { siteId, settled: busy === 0, files, compute, driftCheck, ...latest, asOf: new Date().toISOString() };
}
