/**
 * Compute shared by worker processes through pg-boss (src/server/services/engine-jobs.ts): the
 * 50-unit bench site of bench/engine.ts as a plant model on the test PostgreSQL, `--months` of its tag
 * hours (default 1; 12 for the year), then the whole compute timed from the request to the settled
 * drift check with one and with two `src/worker/engine-worker.ts` processes.
 *
 *   (test services up, their variables exported) npm run bench:workers [-- --months=12]
 *
 * Prints two_workers_speedup = time with one worker / time with two (target >= 1.8 on 2 cores) and the
 * load average, since other processes on the machine take cores from the workers.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { loadavg } from 'node:os';
import { eq, inArray, sql } from 'drizzle-orm';
import { QUEUES } from '~/jobs';
import { closeDb, db } from '~/server/db/client';
import { plantUnits, tags, unitHours } from '~/server/db/schema';
import { queue, stopQueue } from '~/server/queue';
import { createSiteFromModel } from '~/server/services/plant-model';
import { writeTagHours } from '~/server/services/tag-hours';
import type { EngineCase } from '../tests/engine/cases';
import { modelOf } from '../tests/engine/model-file';
import { MIX, rng } from './engine';

const H = 3_600_000;
const T_START = Date.UTC(2025, 0, 1);

/** The bench site's units: copies of the reference units with their own names and tags. */
function benchCases(): EngineCase[] {
  const out: EngineCase[] = [];
  for (const [make, n] of MIX) {
    for (let k = 0; k < n; k++) {
      const c = make();
      const prefix = `U${String(out.length).padStart(2, '0')}_`;
      // Steam-priced units read the boilers' hours: the boilers keep their own names for fuelFrom.
      out.push({ ...c, id: c.kind === 'boiler' && k === 0 ? c.id : `${c.id} ${k + 1}`, links: c.links.map((l) => ({ ...l, tag: prefix + l.tag })) });
    }
  }
  return out;
}

async function loadSite(hours: number): Promise<{ siteId: string; unitIds: string[] }> {
  const cases = benchCases();
  const { siteId } = await createSiteFromModel(modelOf(`Workers bench ${Date.now()}`, cases));
  const r = rng(7);
  for (const [i, c] of cases.entries()) {
    const phase = (i * 0.37) % (2 * Math.PI);
    for (const l of c.links) {
      const [t] = await db().insert(tags).values({ siteId, name: l.tag }).onConflictDoNothing().returning({ seq: tags.seq });
      const seq = t?.seq ?? (await db().select({ seq: tags.seq }).from(tags).where(eq(tags.name, l.tag)))[0]!.seq;
      const follows = l.quantity === 'massFlow' || l.quantity === 'power' || l.quantity === 'standardVolumeFlow';
      const rows = Array.from({ length: hours }, (_, h) => {
        const load = 1 + 0.12 * Math.sin((2 * Math.PI * (h % 24)) / 24 + phase);
        const mean = (follows ? l.reading * load : l.reading) * (1 + 2e-4 * (r() - 0.5));
        const half = Math.abs(mean) * 0.004;
        return { tagId: seq, hourStart: new Date(T_START + h * H), mean, min: mean - half, max: mean + half, std: half / 2, samples: 60, coveredFraction: 1, nonNumeric: 0, outOfRange: 0, flatline: false };
      });
      await writeTagHours(rows);
    }
  }
  const unitIds = (await db().select({ id: plantUnits.id }).from(plantUnits).where(eq(plantUnits.siteId, siteId))).map((u) => u.id);
  return { siteId, unitIds };
}

function startWorker(): Promise<ChildProcess> {
  const w = spawn(process.execPath, ['--import', 'tsx', 'src/worker/engine-worker.ts'], { env: process.env, stdio: ['ignore', 'pipe', 'inherit'] });
  return new Promise((resolve, reject) => {
    w.stdout!.on('data', (b: Buffer) => b.toString().includes('ready') && resolve(w));
    w.once('exit', (code) => reject(new Error(`engine worker exited with ${code}`)));
  });
}

async function openJobs(siteId: string): Promise<number> {
  const r = await db().execute<{ n: number }>(
    sql`select count(*)::int as n from pgboss.job where name in (${QUEUES.computeUnitHours}, ${QUEUES.computeUnitMonth}, ${QUEUES.computeSettle})
        and state in ('created', 'retry', 'active') and data->>'siteId' = ${siteId}`,
  );
  return r.rows[0]!.n;
}

/** Seconds from the request to the settled compute with n worker processes. */
async function timed(siteId: string, unitIds: string[], hours: number, n: number): Promise<number> {
  await db().delete(unitHours).where(inArray(unitHours.unitId, unitIds));
  const workers = await Promise.all(Array.from({ length: n }, startWorker));
  const boss = await queue();
  const t0 = performance.now();
  await boss.send(QUEUES.computeUnitHours, { siteId, fromMs: T_START, toMs: T_START + hours * H });
  await new Promise((r) => setTimeout(r, 500));
  while ((await openJobs(siteId)) > 0) await new Promise((r) => setTimeout(r, 200));
  const s = (performance.now() - t0) / 1e3;
  for (const w of workers) w.kill('SIGTERM');
  const [{ n: rows }] = (await db().execute<{ n: number }>(sql`select count(*)::int as n from unit_hours where unit_id in (${sql.join(unitIds.map((u) => sql`${u}::uuid`), sql`, `)})`)).rows as [{ n: number }];
  console.log(`${n} worker process(es): ${rows} unit hours in ${s.toFixed(1)} s (${(rows / s).toFixed(0)} unit hours/s), load average ${loadavg()[0]!.toFixed(2)}`);
  return s;
}

const args = new Map(process.argv.slice(2).map((a) => [a.replace(/^--/, '').split('=')[0]!, a.split('=')[1] ?? 'true']));
const months = Number(args.get('months') ?? 1);
const hours = Math.round((Date.UTC(2025, months, 1) - T_START) / H);
const t0 = performance.now();
const { siteId, unitIds } = await loadSite(hours);
console.log(`bench site: ${unitIds.length} units, ${hours} hours of tag hours loaded in ${((performance.now() - t0) / 1e3).toFixed(1)} s`);
const one = await timed(siteId, unitIds, hours, 1);
const two = await timed(siteId, unitIds, hours, 2);
console.log(`two_workers_speedup ${(one / two).toFixed(2)}  (one worker ${one.toFixed(1)} s / two workers ${two.toFixed(1)} s; target >= 1.8; load average ${loadavg()[0]!.toFixed(2)} on 2 cores)`);
await stopQueue();
await closeDb();
