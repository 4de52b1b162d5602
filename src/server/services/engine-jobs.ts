/**
 * The engine's work shared by any number of worker processes through pg-boss, on any number of
 * machines against one database:
 *
 * - `compute-unit-hours` (a site's request, as the web side and the ingest send it) is cut into one
 *   `compute-unit-month` job per unit and month, boilers' jobs first, plus one `compute-settle` job;
 * - `compute-unit-month` computes one unit over one month (engine.ts computeChunk with that unit). The
 *   queue's policy is 'stately' with the key unit:month: the same unit-month is never queued twice
 *   (one may wait while another runs with older data). A unit whose cost is the steam's waits, by
 *   sending itself again a moment later, while a boiler-month of its site and month is still queued
 *   or running: the boilers' hours of that month price its steam. Its summary is the job's output;
 * - `compute-settle` waits (sending itself again) until no unit-month of its request is queued or
 *   running, then sends `check-drift` once for the hours the request's jobs wrote.
 */
import { randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { ComputeSettlePayload, ComputeUnitHoursPayload, ComputeUnitMonthPayload, QUEUES, sendJob } from '~/jobs';
import { costKindOf } from '~/lib/engine';
import { db } from '../db/client';
import { ensureMonthPartitions, monthStart, nextMonthStart } from '../db/partitions';
import { queue } from '../queue';
import { siteContext } from './engine-inputs';
import { addChunk, computeChunk, monthsOf, planCompute, sendDriftCheck, type ComputeSummary } from './engine';

/** Seconds before a waiting unit-month or settle job looks again. */
const WAIT_S = 1;
const OPEN_STATES = sql`('created', 'retry', 'active')`;

const monthKey = (unitId: string, fromMs: number) => {
  const d = new Date(fromMs);
  return `${unitId}:${d.getUTCFullYear()}-${String(d.getUTCMonth() + 1).padStart(2, '0')}`;
};

/** What a fan-out sent. */
export interface FanOut {
  runId: string | null;
  /** unit-month jobs queued (not counting those already queued by an earlier request) */
  queued: number;
  /** unit-month jobs the queue already held */
  alreadyQueued: number;
}

/** The worker's handler of `compute-unit-hours`: the request cut into unit-month jobs and a settle job. */
export async function fanOutCompute(data: unknown): Promise<FanOut> {
  const p = ComputeUnitHoursPayload.parse(data);
  const summary: ComputeSummary = { siteId: p.siteId, computed: 0, written: 0, unchanged: 0, chunks: 0, touched: null };
  const plan = await planCompute(p, summary);
  if (!plan) return { runId: null, queued: 0, alreadyQueued: 0 };
  const boss = await queue();
  const runId = randomUUID();
  const out: FanOut = { runId, queued: 0, alreadyQueued: 0 };
  // Month by month, boilers first within each (plan.targets is sorted so). A job always covers its
  // whole month: the key is the unit's month, so a job already queued for it (from another file's
  // request) must cover this request's hours too. Hours whose inputs are unchanged cost only a hash.
  for (const [lo] of monthsOf(plan.lo, plan.hi)) {
    const a = monthStart(lo);
    const b = nextMonthStart(a);
    for (const unit of plan.targets) {
      const payload = ComputeUnitMonthPayload.parse({ runId, siteId: p.siteId, unitId: unit.id, fromMs: a, toMs: b });
      const id = await sendJob(boss, QUEUES.computeUnitMonth, payload, { singletonKey: monthKey(unit.id, a), retryLimit: 2, retryDelay: 5 });
      if (id) out.queued++;
      else out.alreadyQueued++;
    }
  }
  await sendJob(boss, QUEUES.computeSettle, ComputeSettlePayload.parse({ runId, siteId: p.siteId }), { singletonKey: runId, startAfter: WAIT_S, retryLimit: 5, retryDelay: 5 });
  return out;
}

/** True while a boiler-month of the site and month is queued or running (its steam prices this unit). */
async function boilersPending(boilerIds: string[], fromMs: number): Promise<boolean> {
  if (!boilerIds.length) return false;
  const keys = boilerIds.map((id) => monthKey(id, fromMs));
  const r = await db().execute<{ n: number }>(
    sql`select count(*)::int as n from pgboss.job where name = ${QUEUES.computeUnitMonth} and state in ${OPEN_STATES}
        and singleton_key in (${sql.join(keys.map((k) => sql`${k}`), sql`, `)})`,
  );
  return (r.rows[0]?.n ?? 0) > 0;
}

/** The worker's handler of `compute-unit-month`: one unit over one month; its summary is the job's output. */
export async function computeUnitMonth(data: unknown): Promise<ComputeSummary & { waiting?: boolean }> {
  const p = ComputeUnitMonthPayload.parse(data);
  const summary: ComputeSummary = { siteId: p.siteId, computed: 0, written: 0, unchanged: 0, chunks: 0, touched: null };
  const ctx = await siteContext(p.siteId);
  const unit = ctx?.units.find((u) => u.id === p.unitId);
  if (!ctx || !unit) return summary;
  if (unit.kind !== 'boiler' && costKindOf(unit) === 'steam' && (await boilersPending(ctx.boilers.map((b) => b.id), p.fromMs))) {
    const boss = await queue();
    await sendJob(boss, QUEUES.computeUnitMonth, p, { singletonKey: monthKey(unit.id, p.fromMs), startAfter: WAIT_S, retryLimit: 2, retryDelay: 5 });
    return { ...summary, waiting: true };
  }
  await ensureMonthPartitions(null, 'unit_hours', p.fromMs, p.toMs - 1);
  addChunk(summary, await computeChunk(ctx, [unit], p.fromMs, p.toMs, true));
  return summary;
}

/** The worker's handler of `compute-settle`: check-drift once, when every unit-month of the request is done. */
export async function settleCompute(data: unknown): Promise<{ settled: boolean; touched: ComputeSummary['touched'] }> {
  const p = ComputeSettlePayload.parse(data);
  const open = await db().execute<{ n: number }>(
    sql`select count(*)::int as n from pgboss.job where name = ${QUEUES.computeUnitMonth} and state in ${OPEN_STATES} and data->>'runId' = ${p.runId}`,
  );
  if ((open.rows[0]?.n ?? 0) > 0) {
    const boss = await queue();
    await sendJob(boss, QUEUES.computeSettle, p, { singletonKey: p.runId, startAfter: WAIT_S, retryLimit: 5, retryDelay: 5 });
    return { settled: false, touched: null };
  }
  const done = await db().execute<{ output: ComputeSummary | null }>(
    sql`select output from pgboss.job where name = ${QUEUES.computeUnitMonth} and state = 'completed' and data->>'runId' = ${p.runId}`,
  );
  const all: ComputeSummary = { siteId: p.siteId, computed: 0, written: 0, unchanged: 0, chunks: 0, touched: null };
  for (const { output: o } of done.rows) {
    const t = o?.touched;
    if (!t) continue;
    all.touched = { fromMs: Math.min(all.touched?.fromMs ?? Infinity, t.fromMs), toMs: Math.max(all.touched?.toMs ?? -Infinity, t.toMs), unitIds: [...new Set([...(all.touched?.unitIds ?? []), ...t.unitIds])] };
  }
  if (all.touched) await sendDriftCheck(p.siteId, all.touched);
  return { settled: true, touched: all.touched };
}
