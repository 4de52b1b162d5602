/**
 * The hourly exergy engine's I/O: works the `compute-unit-hours` job. Reads the plant model, the link
 * versions and the tag hours of a site month by month (one transaction per month, memory flat), runs
 * the pure engine (src/lib/engine) per unit and hour, and writes only the unit hours whose inputs hash
 * changed; then sends `check-drift` for the units and hours it touched.
 *
 * Order within an hour: boilers first, so that the steam's cost of that hour (the boilers' product
 * cost, src/lib/engine/cost.ts) is known to the units downstream. A job that recomputes a boiler
 * recomputes every unit of the site (their cost depends on it); unchanged hours are skipped anyway.
 */
import { and, eq, gte, lt, sql } from 'drizzle-orm';
import { CheckDriftPayload, ComputeUnitHoursPayload, QUEUES, sendJob } from '~/jobs';
import { computeUnitHour, unitHourHashes, type EngineUnit, type UnitHourResult } from '~/lib/engine';
import { db } from '../db/client';
import { plantUnits, unitHours } from '../db/schema';
import { ensureMonthPartitions } from '../db/partitions';
import { queue } from '../queue';
import { chunkEnv, dataSpan, nextMonth, siteContext, unitInputs, type ChunkEnv, type Reader, type SiteContext } from './engine-inputs';
import { faultRow, saneSpan, unitHourRowOf, writeUnitHours } from './engine-rows';
import { HOUR_MS, hourFloor } from '~/lib/time';

export { unitHourRowOf, writeUnitHours } from './engine-rows';


export interface ComputeOptions {
  /** propagate uncertainties (default true) */
  uncertainty?: boolean;
  /** send check-drift for what was written (default true) */
  sendDrift?: boolean;
  /** called with every unit hour the job computes (tests compare it with the hour rebuilt on demand) */
  onResult?: (unitId: string, hourStartMs: number, result: UnitHourResult) => void;
}


export interface ComputeSummary {
  siteId: string;
  /** unit hours looked at (their inputs hashed; computed when the hash changed) */
  computed: number;
  /** rows written (new or changed inputs) */
  written: number;
  /** rows whose inputs hash was unchanged (left as they were) */
  unchanged: number;
  /** months worked, each in its own transaction */
  chunks: number;
  /** hours written, as a range, and the units concerned; null when nothing changed */
  touched: { fromMs: number; toMs: number; unitIds: string[] } | null;
  /** unit hours that could not be computed: stored as suspect with the reason, the job went on */
  faults?: number;
  /** the asked span when it reached outside 1900 .. now + 2 days (those hours were left out) */
  outsideSaneSpan?: { fromMs: number; toMs: number };
}

/** What a compute request resolves to: the site, the units to compute (boilers first) and the hours. */
export interface ComputePlan {
  ctx: SiteContext;
  targets: EngineUnit[];
  lo: number;
  hi: number;
}

/**
 * Resolves a compute request: hours outside a sane span (stored before uploads checked their times:
 * a year 9999 from a broken clock) are left out and reported in the summary, so they can never stop
 * the site's recomputes; a request that names a boiler recomputes every unit (their cost depends on
 * it); the hours are cut to those with data. Null when there is nothing to compute.
 */
export async function planCompute(payload: { siteId: string; fromMs: number; toMs: number; unitIds?: string[] }, summary: ComputeSummary): Promise<ComputePlan | null> {
  const p = ComputeUnitHoursPayload.parse(payload);
  const [saneLo, saneHi] = saneSpan();
  if (p.fromMs < saneLo || p.toMs > saneHi) {
    summary.outsideSaneSpan = { fromMs: p.fromMs, toMs: p.toMs };
    p.fromMs = Math.max(p.fromMs, saneLo);
    p.toMs = Math.min(p.toMs, saneHi);
    if (p.toMs <= p.fromMs) return null;
  }
  const ctx = await siteContext(p.siteId);
  if (!ctx) return null;
  let targets = ctx.units;
  if (p.unitIds?.length) {
    const wanted = new Set(p.unitIds);
    const touchesBoiler = ctx.boilers.some((b) => wanted.has(b.id));
    targets = touchesBoiler ? ctx.units : ctx.units.filter((u) => wanted.has(u.id));
  }
  if (!targets.length) return null;
  // Boilers first: their hours price the steam of the units downstream.
  targets = [...targets].sort((a, b) => Number(b.kind === 'boiler') - Number(a.kind === 'boiler'));
  const span = await dataSpan(p.siteId, targets.map((u) => u.id), hourFloor(p.fromMs), p.toMs);
  if (!span) return null;
  return { ctx, targets, lo: Math.max(span[0], p.fromMs), hi: Math.min(span[1], p.toMs) };
}

/** The months of [lo, hi) as [start, end) pairs (the first and last cut to the range). */
export function monthsOf(lo: number, hi: number): [number, number][] {
  const out: [number, number][] = [];
  for (let a = lo; a < hi; a = Math.min(nextMonth(a), hi)) out.push([a, Math.min(nextMonth(a), hi)]);
  return out;
}

/** Adds one month's outcome to a summary. */
export function addChunk(summary: ComputeSummary, out: ChunkOutcome): void {
  summary.chunks++;
  summary.computed += out.computed;
  summary.written += out.written;
  summary.unchanged += out.computed - out.written;
  summary.faults = (summary.faults ?? 0) + out.faults;
  if (!out.written) return;
  const t = summary.touched ?? { fromMs: Infinity, toMs: -Infinity, unitIds: [] };
  t.fromMs = Math.min(t.fromMs, out.fromMs);
  t.toMs = Math.max(t.toMs, out.toMs);
  t.unitIds = [...new Set([...t.unitIds, ...out.units])];
  summary.touched = t;
}

/** Sends the drift check of the hours a compute wrote (once per request or run). */
export async function sendDriftCheck(siteId: string, touched: NonNullable<ComputeSummary['touched']>): Promise<void> {
  const boss = await queue();
  await sendJob(boss, QUEUES.checkDrift, CheckDriftPayload.parse({ siteId, ...touched }), { retryLimit: 2, retryDelay: 10 });
}

/**
 * Computes and stores the unit hours of a site over [fromMs, toMs) (hour starts), for the given units
 * or all of them, in this process, month by month. Idempotent: an hour whose inputs hash is unchanged
 * is not written again. The worker shares the same work out by unit and month (engine-jobs.ts).
 */
export async function computeUnitHours(payload: { siteId: string; fromMs: number; toMs: number; unitIds?: string[] }, options: ComputeOptions = {}): Promise<ComputeSummary> {
  const summary: ComputeSummary = { siteId: payload.siteId, computed: 0, written: 0, unchanged: 0, chunks: 0, touched: null };
  const plan = await planCompute(payload, summary);
  if (!plan) return summary;
  for (const [a, b] of monthsOf(plan.lo, plan.hi)) {
    await ensureMonthPartitions(null, 'unit_hours', a, b - 1);
    addChunk(summary, await computeChunk(plan.ctx, plan.targets, a, b, options.uncertainty ?? true, options.onResult));
  }
  if (summary.touched && (options.sendDrift ?? true)) await sendDriftCheck(summary.siteId, summary.touched);
  return summary;
}

/** What one month of some units gave. */
export interface ChunkOutcome {
  computed: number;
  written: number;
  faults: number;
  /** units with rows written, and the span of hours written */
  units: string[];
  fromMs: number;
  toMs: number;
}

/**
 * One month of some units of a site: read, compute, write in one transaction. Each unit is locked for
 * the transaction (advisory, in id order), so two workers never compute the same unit at once.
 */
export async function computeChunk(ctx: SiteContext, targets: EngineUnit[], fromMs: number, toMs: number, withU: boolean, onResult?: ComputeOptions['onResult']): Promise<ChunkOutcome> {
  return db().transaction(async (tx) => {
    for (const id of targets.map((u) => u.id).sort()) await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${'lossline-engine:' + id}))`);
    const from = new Date(fromMs);
    const to = new Date(toMs);
    const env = await chunkEnv(ctx, targets, from, to, tx);
    const out: ChunkOutcome = { computed: 0, written: 0, faults: 0, units: [], fromMs: Infinity, toMs: -Infinity };
    for (const unit of targets) {
      const rows = await unitMonthRows(tx, ctx, env, unit, from, to, withU, out, onResult);
      await writeUnitHours(tx, rows);
      out.written += rows.length;
      if (rows.length) out.units.push(unit.id);
    }
    return out;
  });
}

/** The rows of one unit's month whose inputs changed; a boiler's hours are added to env.boilerHours. */
async function unitMonthRows(tx: Reader, ctx: SiteContext, env: ChunkEnv, unit: EngineUnit, from: Date, to: Date, withU: boolean, out: ChunkOutcome, onResult?: ComputeOptions['onResult']) {
  const ui = await unitInputs(ctx, env, unit, from, to, tx);
  const existing = await tx
    .select({ hourStart: unitHours.hourStart, inputsHash: unitHours.inputsHash, fuel_W: unitHours.fuel_W, product_W: unitHours.product_W })
    .from(unitHours)
    .where(and(eq(unitHours.unitId, unit.id), gte(unitHours.hourStart, from), lt(unitHours.hourStart, to)));
  const known = new Map(existing.map((r) => [r.hourStart.getTime(), r]));
  const hours = new Set<number>([...known.keys(), ...ui.withData]);
  const rows: (typeof unitHours.$inferInsert)[] = [];
  const now = new Date();
  const isBoiler = env.boilerIds.has(unit.id);
  const priceSteam = (t: number, fuel_W: number | null, product_W: number | null, cF_per_J: number | null) => {
    const list = env.boilerHours.get(t) ?? [];
    list.push({ name: unit.name, fuel_W, product_W, cF_per_J });
    env.boilerHours.set(t, list);
  };
  for (const t of [...hours].sort((x, y) => x - y)) {
    const input = ui.inputAt(t)!;
    const k = known.get(t);
    if (!input.links.length && !k) continue;
    out.computed++;
    // Same inputs, same row: an hour whose inputs hash is unchanged is neither computed nor written.
    let res: UnitHourResult | null = null;
    try {
      const hashes = unitHourHashes(input, { uncertainty: withU });
      if (k?.inputsHash !== hashes.inputsHash) res = computeUnitHour(input, { uncertainty: withU, hashes });
    } catch (err) {
      // One hour that cannot be computed is marked suspect with the reason; the job goes on.
      rows.push(faultRow(unit.id, t, (err as Error).message, now));
      out.faults++;
      continue;
    }
    if (res === null) {
      if (isBoiler) priceSteam(t, k!.fuel_W, k!.product_W, input.cost?.cF_per_J ?? null);
      continue;
    }
    onResult?.(unit.id, t, res);
    if (isBoiler) priceSteam(t, res.fuel_W, res.product_W, input.cost?.cF_per_J ?? null);
    rows.push(unitHourRowOf(unit.id, t, res, now));
    out.fromMs = Math.min(out.fromMs, t);
    out.toMs = Math.max(out.toMs, t + HOUR_MS);
  }
  return rows;
}

/**
 * One unit hour rebuilt on demand (the hour opened up): the same reads and the same engine as the job
 * that stored it, for that hour only. The caller compares the hashes with the stored row's.
 */
export async function rebuildUnitHour(unitId: string, hourStartMs: number, uncertainty = true): Promise<UnitHourResult | null> {
  const [u] = await db().select({ siteId: plantUnits.siteId }).from(plantUnits).where(eq(plantUnits.id, unitId)).limit(1);
  if (!u) return null;
  const ctx = await siteContext(u.siteId);
  const unit = ctx?.units.find((x) => x.id === unitId);
  if (!ctx || !unit) return null;
  const from = new Date(hourStartMs);
  const to = new Date(hourStartMs + HOUR_MS);
  const env = await chunkEnv(ctx, [unit], from, to, db());
  const ui = await unitInputs(ctx, env, unit, from, to, db());
  const input = ui.inputAt(hourStartMs)!;
  return computeUnitHour(input, { uncertainty });
}

/** The worker's handler of `compute-unit-hours`. */
export async function handleComputeUnitHours(data: unknown): Promise<ComputeSummary> {
  return computeUnitHours(ComputeUnitHoursPayload.parse(data));
}
