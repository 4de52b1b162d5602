/**
 * Two worker processes share a site's compute through pg-boss (src/server/services/engine-jobs.ts):
 * the request is cut into unit-month jobs; every unit hour is computed exactly once, none is missed,
 * and the drift check is sent once when the work has settled. Real pg-boss on the test PostgreSQL,
 * two `src/worker/engine-worker.ts` processes.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { and, eq, inArray, sql } from 'drizzle-orm';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { QUEUES } from '~/jobs';
import { db } from '~/server/db/client';
import { plantUnits, tags, unitHours } from '~/server/db/schema';
import { queue } from '~/server/queue';
import { writeTagHours } from '~/server/services/tag-hours';
import { createSiteFromModel } from '~/server/services/plant-model';
import { describeIntegration } from '../support/integration';
import { uniqueName } from '../plant/support';
import { ALL_CASES, steadyHour } from './cases';
import { modelOf } from './model-file';

const H = 3_600_000;
/** Eight hours across a month boundary: four in January, four in February. */
const H0 = Date.UTC(2024, 0, 31, 20);
const HOURS = 8;

function startWorker(): Promise<ChildProcess> {
  const w = spawn(process.execPath, ['--import', 'tsx', 'src/worker/engine-worker.ts'], { env: process.env, stdio: ['ignore', 'pipe', 'pipe'] });
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('engine worker did not start in 60 s')), 60_000);
    w.stdout!.on('data', (b: Buffer) => {
      if (b.toString().includes('ready')) {
        clearTimeout(timer);
        resolve(w);
      }
    });
    w.stderr!.on('data', (b: Buffer) => process.stderr.write(b));
    w.once('exit', (code) => reject(new Error(`engine worker exited with ${code}`)));
  });
}

async function openJobs(siteId: string): Promise<number> {
  const names = [QUEUES.computeUnitHours, QUEUES.computeUnitMonth, QUEUES.computeSettle];
  const r = await db().execute<{ n: number }>(
    sql`select count(*)::int as n from pgboss.job where name in (${sql.join(names.map((n) => sql`${n}`), sql`, `)})
        and state in ('created', 'retry', 'active') and data->>'siteId' = ${siteId}`,
  );
  return r.rows[0]!.n;
}

describeIntegration('compute shared by two worker processes', () => {
  const cases = ALL_CASES();
  let siteId: string;
  let unitIds: string[];
  const workers: ChildProcess[] = [];

  beforeAll(async () => {
    siteId = (await createSiteFromModel(modelOf(uniqueName('Two workers mill'), cases))).siteId;
    unitIds = (await db().select({ id: plantUnits.id }).from(plantUnits).where(eq(plantUnits.siteId, siteId))).map((u) => u.id);
    for (const c of cases) {
      for (const l of c.links) {
        const [t] = await db().insert(tags).values({ siteId, name: l.tag }).onConflictDoNothing().returning({ seq: tags.seq });
        const seq = t?.seq ?? (await db().select({ seq: tags.seq }).from(tags).where(and(eq(tags.siteId, siteId), eq(tags.name, l.tag))))[0]!.seq;
        await writeTagHours(Array.from({ length: HOURS }, (_, h) => ({ tagId: seq, hourStart: new Date(H0 + h * H), ...steadyHour(l.reading) })));
      }
    }
    workers.push(...(await Promise.all([startWorker(), startWorker()])));
  }, 120_000);

  afterAll(async () => {
    for (const w of workers) w.kill('SIGTERM');
  });

  it('computes every unit hour once, misses none, and checks drift once', async () => {
    const boss = await queue();
    await boss.send(QUEUES.computeUnitHours, { siteId, fromMs: H0 - 24 * H, toMs: H0 + 48 * H });
    const t0 = Date.now();
    await new Promise((r) => setTimeout(r, 1500));
    while ((await openJobs(siteId)) > 0) {
      if (Date.now() - t0 > 120_000) throw new Error('the compute did not settle in 120 s');
      await new Promise((r) => setTimeout(r, 300));
    }
    // Every hour of every unit stored, once (the primary key is unit and hour).
    const rows = await db().select({ unitId: unitHours.unitId, hourStart: unitHours.hourStart }).from(unitHours).where(inArray(unitHours.unitId, unitIds));
    expect(rows.length).toBe(cases.length * HOURS);
    for (const id of unitIds) {
      expect(rows.filter((r) => r.unitId === id).map((r) => r.hourStart.getTime()).sort((a, b) => a - b)).toEqual(Array.from({ length: HOURS }, (_, h) => H0 + h * H));
    }
    // The unit-month jobs: one that computed per unit and month, each hour computed and written once.
    const done = await db().execute<{ output: { computed: number; written: number; waiting?: boolean; pid: number }; unit: string; from: string }>(
      sql`select output, data->>'unitId' as unit, data->>'fromMs' as from from pgboss.job
          where name = ${QUEUES.computeUnitMonth} and state = 'completed' and data->>'siteId' = ${siteId}`,
    );
    const worked = done.rows.filter((r) => !r.output.waiting);
    expect(worked.length).toBe(cases.length * 2);
    expect(new Set(worked.map((r) => `${r.unit}|${r.from}`)).size).toBe(cases.length * 2);
    expect(worked.reduce((s, r) => s + r.output.computed, 0)).toBe(cases.length * HOURS);
    expect(worked.reduce((s, r) => s + r.output.written, 0)).toBe(cases.length * HOURS);
    const pids = new Set(worked.map((r) => r.output.pid));
    console.log(`unit-month jobs: ${worked.length} computed by ${pids.size} worker process(es), ${done.rows.length - worked.length} waited for their month's boiler`);
    // The drift check: once, for all the units and hours written.
    const drift = await db().execute<{ data: { fromMs: number; toMs: number; unitIds: string[] } }>(
      sql`select data from pgboss.job where name = ${QUEUES.checkDrift} and data->>'siteId' = ${siteId}`,
    );
    expect(drift.rows.length).toBe(1);
    expect(drift.rows[0]!.data.fromMs).toBe(H0);
    expect(drift.rows[0]!.data.toMs).toBe(H0 + HOURS * H);
    expect([...drift.rows[0]!.data.unitIds].sort()).toEqual([...unitIds].sort());
  }, 180_000);
});
