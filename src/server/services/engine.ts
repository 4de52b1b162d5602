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
import { and, asc, eq, gte, inArray, lt, sql } from 'drizzle-orm';
import { CheckDriftPayload, ComputeUnitHoursPayload, QUEUES, sendJob } from '~/jobs';
import {
  computeUnitHour,
  costKindOf,
  electricityCost,
  fuelExergyCost,
  steamCost,
  type BoilerHour,
  type CostBasis,
  type EngineLink,
  type EngineSite,
  type EngineUnit,
  type FlueGasSource,
  type TagHour,
  type UnitHourInput,
  type UnitHourResult,
  unitHourHashes,
} from '~/lib/engine';
import type { UnitKind } from '~/lib/plant/kinds';
import type { Fluid } from '~/lib/plant/model';
import { db } from '../db/client';
import { coveredFractionSql, flatlineSql, plantPorts, plantUnits, sites, tagHours, tags, unitHours } from '../db/schema';
import { ensureMonthPartitions } from '../db/partitions';
import { queue } from '../queue';
import { linksForRange, type ResolvedLink } from './plant-links';
import type { Tx } from './plant-tx';

const HOUR_ms = 3_600_000;
/** Rows per INSERT ... ON CONFLICT statement. */
const WRITE_BATCH = 200;

export interface ComputeOptions {
  /** propagate uncertainties (default true) */
  uncertainty?: boolean;
  /** send check-drift for what was written (default true) */
  sendDrift?: boolean;
  /** called with every unit hour the job computes (tests compare it with the hour rebuilt on demand) */
  onResult?: (unitId: string, hourStartMs: number, result: UnitHourResult) => void;
}

type Reader = Tx | ReturnType<typeof db>;

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

/** The first instant of the UTC month after t [ms]. */
function nextMonth(t: number): number {
  const d = new Date(t);
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + 1, 1);
}

function toEngineLink(l: ResolvedLink): EngineLink {
  return {
    id: l.id,
    portName: l.portName,
    quantity: l.quantity,
    tagName: l.tagName,
    engUnit: l.engUnit,
    basis: l.basis,
    uncertaintyMode: l.uncertaintyMode,
    uncertainty: l.uncertainty,
    validMin: l.validMin,
    validMax: l.validMax,
    validFromMs: l.validFrom.getTime(),
    validToMs: l.validTo ? l.validTo.getTime() : null,
  };
}

const holdsAt = (l: { validFromMs: number; validToMs: number | null }, t: number) => l.validFromMs <= t && (l.validToMs === null || l.validToMs > t);

interface SiteContext {
  site: typeof sites.$inferSelect;
  engineSite: EngineSite;
  t0Tag: { id: string; seq: number; name: string } | null;
  /** tags.id -> tags.seq (the key of tag hours) */
  tagSeq: Map<string, number>;
  units: EngineUnit[];
  unitIds: Set<string>;
  boilers: EngineUnit[];
}

async function siteContext(siteId: string, r: Reader = db()): Promise<SiteContext | null> {
  const [site] = await r.select().from(sites).where(eq(sites.id, siteId)).limit(1);
  if (!site) return null;
  const unitRows = await r.select().from(plantUnits).where(eq(plantUnits.siteId, siteId)).orderBy(asc(plantUnits.name));
  const portRows = unitRows.length
    ? await r
        .select()
        .from(plantPorts)
        .where(inArray(plantPorts.unitId, unitRows.map((u) => u.id)))
        .orderBy(asc(plantPorts.position), asc(plantPorts.name))
    : [];
  const tagRows = await r.select({ id: tags.id, seq: tags.seq, name: tags.name }).from(tags).where(eq(tags.siteId, siteId));
  const tagSeq = new Map(tagRows.map((t) => [t.id, t.seq]));
  let t0Tag: SiteContext['t0Tag'] = null;
  if (site.t0TagId) t0Tag = tagRows.find((t) => t.id === site.t0TagId) ?? null;
  const units: EngineUnit[] = unitRows.map((u) => ({
    id: u.id,
    name: u.name,
    kind: u.kind as UnitKind,
    parameters: u.parameters,
    fuel: u.fuel ?? null,
    ports: portRows
      .filter((p) => p.unitId === u.id)
      .map((p) => ({ name: p.name, slot: p.slot, fluid: (p.fluid as Fluid | null) ?? null, boundaryT_K: p.boundaryT_K, account: p.account })),
  }));
  return {
    site,
    engineSite: {
      p_atm_Pa: site.p_atm_Pa,
      T0_K: site.T0_K,
      p0_Pa: site.p0_Pa,
      t0Tag: t0Tag ? { name: t0Tag.name, engUnit: site.t0TagUnit ?? 'degC' } : null,
      currency: site.currency,
      prices: site.prices,
    },
    t0Tag,
    tagSeq,
    units,
    unitIds: new Set(units.map((u) => u.id)),
    boilers: units.filter((u) => u.kind === 'boiler'),
  };
}

/** [first, last] hour with tag hours or unit hours of the site within [from, to), or null. */
async function dataSpan(siteId: string, unitIds: string[], fromMs: number, toMs: number): Promise<[number, number] | null> {
  const from = new Date(fromMs);
  const to = new Date(toMs);
  // Per tag, the first and last hour in range by the primary key (an index seek each, not a scan).
  const a = await db().execute<{ lo: Date | null; hi: Date | null }>(
    sql`select min(f.h) as lo, max(l.h) as hi from tags t
        cross join lateral (select hour_start as h from tag_hours where tag_id = t.seq and hour_start >= ${from.toISOString()}::timestamptz and hour_start < ${to.toISOString()}::timestamptz order by hour_start asc limit 1) f
        cross join lateral (select hour_start as h from tag_hours where tag_id = t.seq and hour_start >= ${from.toISOString()}::timestamptz and hour_start < ${to.toISOString()}::timestamptz order by hour_start desc limit 1) l
        where t.site_id = ${siteId}`,
  );
  const b = unitIds.length
    ? await db().execute<{ lo: Date | null; hi: Date | null }>(
        sql`select min(hour_start) as lo, max(hour_start) as hi from unit_hours
            where unit_id in (${sql.join(
              unitIds.map((u) => sql`${u}::uuid`),
              sql`, `,
            )}) and hour_start >= ${from.toISOString()}::timestamptz and hour_start < ${to.toISOString()}::timestamptz`,
      )
    : { rows: [] };
  const ts = [...a.rows, ...b.rows].flatMap((r) => [r.lo, r.hi]).filter((v): v is Date => v !== null).map((v) => new Date(v).getTime());
  if (!ts.length) return null;
  return [Math.min(...ts), Math.max(...ts) + 1];
}

/**
 * Computes and stores the unit hours of a site over [fromMs, toMs) (hour starts), for the given units
 * or all of them. Idempotent: an hour whose inputs hash is unchanged is not written again.
 */
export async function computeUnitHours(payload: { siteId: string; fromMs: number; toMs: number; unitIds?: string[] }, options: ComputeOptions = {}): Promise<ComputeSummary> {
  const p = ComputeUnitHoursPayload.parse(payload);
  const summary: ComputeSummary = { siteId: p.siteId, computed: 0, written: 0, unchanged: 0, chunks: 0, touched: null };
  // Hours outside a sane span (stored before uploads checked their times: a year 9999 from a broken
  // clock) are left out and reported, so they can never stop the site's recomputes.
  const [saneLo, saneHi] = saneSpan();
  if (p.fromMs < saneLo || p.toMs > saneHi) {
    summary.outsideSaneSpan = { fromMs: p.fromMs, toMs: p.toMs };
    p.fromMs = Math.max(p.fromMs, saneLo);
    p.toMs = Math.min(p.toMs, saneHi);
    if (p.toMs <= p.fromMs) return summary;
  }
  const ctx = await siteContext(p.siteId);
  if (!ctx) return summary;
  let targets = ctx.units;
  if (p.unitIds?.length) {
    const wanted = new Set(p.unitIds);
    const touchesBoiler = ctx.boilers.some((b) => wanted.has(b.id));
    targets = touchesBoiler ? ctx.units : ctx.units.filter((u) => wanted.has(u.id));
  }
  if (!targets.length) return summary;
  // Boilers first: their hours price the steam of the units downstream.
  targets = [...targets].sort((a, b) => Number(b.kind === 'boiler') - Number(a.kind === 'boiler'));
  const span = await dataSpan(p.siteId, targets.map((u) => u.id), Math.floor(p.fromMs / HOUR_ms) * HOUR_ms, p.toMs);
  if (!span) return summary;
  const [lo, hi] = [Math.max(span[0], p.fromMs), Math.min(span[1], p.toMs)];
  const touchedUnits = new Set<string>();
  let tFrom = Infinity;
  let tTo = -Infinity;
  for (let a = lo; a < hi; ) {
    const b = Math.min(nextMonth(a), hi);
    await ensureMonthPartitions(null, 'unit_hours', a, b - 1);
    const out = await computeChunk(ctx, targets, a, b, options.uncertainty ?? true, options.onResult);
    summary.chunks++;
    summary.computed += out.computed;
    summary.written += out.written;
    summary.unchanged += out.computed - out.written;
    summary.faults = (summary.faults ?? 0) + out.faults;
    for (const u of out.units) touchedUnits.add(u);
    if (out.written) {
      tFrom = Math.min(tFrom, out.fromMs);
      tTo = Math.max(tTo, out.toMs);
    }
    a = b;
  }
  if (touchedUnits.size) {
    summary.touched = { fromMs: tFrom, toMs: tTo, unitIds: [...touchedUnits] };
    if (options.sendDrift ?? true) {
      const boss = await queue();
      await sendJob(boss, QUEUES.checkDrift, CheckDriftPayload.parse({ siteId: p.siteId, ...summary.touched }), { retryLimit: 2, retryDelay: 10 });
    }
  }
  return summary;
}


/** Everything of a month of a site that every unit's hours share: links, flue-gas O2, prices, boilers. */
interface ChunkEnv {
  linksByUnit: Map<string, { link: EngineLink; tagSeq: number }[]>;
  o2ByBoiler: Map<string, { link: EngineLink; tagSeq: number }[]>;
  elec: CostBasis | null;
  fuelCost: (b: EngineUnit) => CostBasis | null;
  /** boiler hours by hour start: stored ones of boilers the job leaves alone, then those it computes */
  boilerHours: Map<number, BoilerHour[]>;
  boilerIds: Set<string>;
}

async function chunkEnv(ctx: SiteContext, targets: EngineUnit[], from: Date, to: Date, r: Reader): Promise<ChunkEnv> {
  const all = await linksForRange(ctx.site.id, from, to, r);
  const linksByUnit = new Map<string, { link: EngineLink; tagSeq: number }[]>();
  for (const l of all) {
    const list = linksByUnit.get(l.unitId) ?? [];
    list.push({ link: toEngineLink(l), tagSeq: ctx.tagSeq.get(l.tagId) ?? -1 });
    linksByUnit.set(l.unitId, list);
  }
  // Flue-gas ports outside boilers take the fuel and O2 of the boiler they come from.
  const o2ByBoiler = new Map<string, { link: EngineLink; tagSeq: number }[]>();
  for (const b of ctx.boilers) o2ByBoiler.set(b.name, (linksByUnit.get(b.id) ?? []).filter((x) => x.link.quantity === 'o2Fraction'));
  const elec = electricityCost(ctx.site.prices, ctx.site.currency);
  // The fuel's exergy/LHV ratio is taken at the site's T0 (it moves by less than 0.1 % over the seasons).
  const fuelCostCache = new Map<string, CostBasis | null>();
  const fuelCost = (b: EngineUnit) => {
    if (!fuelCostCache.has(b.id)) fuelCostCache.set(b.id, fuelExergyCost(ctx.site.prices, b.fuel, ctx.site.currency, ctx.engineSite.T0_K));
    return fuelCostCache.get(b.id)!;
  };
  // Boiler hours of this month: computed by this job, or as stored when the job leaves the boilers alone.
  const boilerHours = new Map<number, BoilerHour[]>();
  const stored = ctx.boilers.filter((b) => !targets.includes(b));
  if (stored.length && targets.some((u) => costKindOf(u) === 'steam')) {
    const rows = await r
      .select({ unitId: unitHours.unitId, hourStart: unitHours.hourStart, fuel_W: unitHours.fuel_W, product_W: unitHours.product_W })
      .from(unitHours)
      .where(and(inArray(unitHours.unitId, stored.map((b) => b.id)), gte(unitHours.hourStart, from), lt(unitHours.hourStart, to)));
    for (const row of rows) {
      const b = stored.find((x) => x.id === row.unitId)!;
      const list = boilerHours.get(row.hourStart.getTime()) ?? [];
      list.push({ name: b.name, fuel_W: row.fuel_W, product_W: row.product_W, cF_per_J: fuelCost(b)?.cF_per_J ?? null });
      boilerHours.set(row.hourStart.getTime(), list);
    }
  }
  return { linksByUnit, o2ByBoiler, elec, fuelCost, boilerHours, boilerIds: new Set(ctx.boilers.map((b) => b.id)) };
}

/** The tag hours of some tags over [from, to), as the engine reads them. */
async function readTagHours(r: Reader, tagSeqs: number[], from: Date, to: Date) {
  if (!tagSeqs.length) return [];
  return r
    .select({
      tagId: tagHours.tagId,
      hourStart: tagHours.hourStart,
      mean: tagHours.mean,
      min: tagHours.min,
      max: tagHours.max,
      std: tagHours.std,
      samples: tagHours.samples,
      coveredFraction: coveredFractionSql,
      nonNumeric: tagHours.nonNumeric,
      outOfRange: tagHours.outOfRange,
      flatline: flatlineSql,
    })
    .from(tagHours)
    .where(and(inArray(tagHours.tagId, tagSeqs), gte(tagHours.hourStart, from), lt(tagHours.hourStart, to)));
}

/**
 * One unit over [from, to): its tag hours read, and the engine's input for any hour of it. The same
 * code serves the job (every hour) and the hour opened up (one hour, rebuilt on demand).
 */
async function unitInputs(ctx: SiteContext, env: ChunkEnv, unit: EngineUnit, from: Date, to: Date, r: Reader) {
  const own = env.linksByUnit.get(unit.id) ?? [];
  const flueGasSources: Record<string, FlueGasSource> = {};
  const extraTags: number[] = [];
  for (const port of unit.ports) {
    const fluid = port.fluid;
    if (fluid?.kind === 'flue-gas' && fluid.fuelFrom && unit.kind !== 'boiler') {
      const src = ctx.boilers.find((b) => b.name === fluid.fuelFrom);
      const o2 = src ? (env.o2ByBoiler.get(src.name) ?? []) : [];
      flueGasSources[fluid.fuelFrom] = { fuel: src?.fuel ?? null, o2Link: o2[0]?.link ?? null };
      extraTags.push(...o2.map((x) => x.tagSeq));
    }
  }
  const ownTags = [...new Set(own.map((x) => x.tagSeq))];
  const tagSeqs = [...new Set([...ownTags, ...extraTags, ...(ctx.t0Tag ? [ctx.t0Tag.seq] : [])])].filter((x) => x >= 0);
  const thRows = await readTagHours(r, tagSeqs, from, to);
  const tagName = new Map<number, string>();
  for (const x of own) tagName.set(x.tagSeq, x.link.tagName);
  for (const o of env.o2ByBoiler.values()) for (const x of o) tagName.set(x.tagSeq, x.link.tagName);
  if (ctx.t0Tag) tagName.set(ctx.t0Tag.seq, ctx.t0Tag.name);
  const ownSet = new Set(ownTags);
  const byHour = new Map<number, Map<string, TagHour>>();
  /** hours with a tag hour of the unit's own tags */
  const withData = new Set<number>();
  for (const row of thRows) {
    const t = row.hourStart.getTime();
    if (ownSet.has(row.tagId)) withData.add(t);
    let m = byHour.get(t);
    if (!m) byHour.set(t, (m = new Map()));
    m.set(tagName.get(row.tagId)!, {
      mean: row.mean,
      min: row.min,
      max: row.max,
      std: row.std,
      samples: row.samples,
      coveredFraction: Number(row.coveredFraction),
      nonNumeric: row.nonNumeric,
      outOfRange: row.outOfRange,
      flatline: Boolean(row.flatline),
    });
  }
  const linkSets = new Map<string, EngineLink[]>();
  /** The engine's input for hour t; null when no link of the unit holds then. */
  const inputAt = (t: number): UnitHourInput | null => {
    // The same array for every hour the same link versions hold (the engine keeps per-set work by it).
    const current = own.filter((x) => holdsAt(x.link, t)).map((x) => x.link);
    const setKey = current.map((l) => l.id).join(',');
    let links = linkSets.get(setKey);
    if (!links) linkSets.set(setKey, (links = current));
    const th = byHour.get(t) ?? new Map<string, TagHour>();
    const srcs: Record<string, FlueGasSource> = {};
    for (const [k, v] of Object.entries(flueGasSources)) {
      const b = ctx.boilers.find((x) => x.name === k);
      const o2 = b ? (env.o2ByBoiler.get(b.name) ?? []).find((x) => holdsAt(x.link, t)) : undefined;
      srcs[k] = { fuel: v.fuel, o2Link: o2?.link ?? null };
    }
    let cost: CostBasis | null = null;
    const ck = costKindOf(unit);
    if (ck === 'electricity') cost = env.elec;
    else if (ck === 'own-fuel') cost = env.fuelCost(unit);
    else {
      const fb = ctx.boilers[0] ? env.fuelCost(ctx.boilers[0]) : null;
      // Sorted by name: the same sum in the same order whether the boilers were computed or read.
      const list = [...(env.boilerHours.get(t) ?? [])].sort((x, y) => (x.name < y.name ? -1 : x.name > y.name ? 1 : 0));
      cost = ck === 'steam' ? steamCost(list, fb, ctx.site.currency) : fb;
    }
    return { unit, links, tagHours: th, site: ctx.engineSite, hourStartMs: t, cost, flueGasSources: Object.keys(srcs).length ? srcs : undefined };
  };
  return { withData, inputAt, hasLinks: (t: number) => own.some((x) => holdsAt(x.link, t)) };
}

/** One month of one site: read, compute, write in one transaction. */
async function computeChunk(ctx: SiteContext, targets: EngineUnit[], fromMs: number, toMs: number, withU: boolean, onResult?: ComputeOptions['onResult']) {
  return db().transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${'lossline-engine:' + ctx.site.id}))`);
    const from = new Date(fromMs);
    const to = new Date(toMs);
    const env = await chunkEnv(ctx, targets, from, to, tx);

    let computed = 0;
    let written = 0;
    let faults = 0;
    let wFrom = Infinity;
    let wTo = -Infinity;
    const units: string[] = [];
    for (const unit of targets) {
      const ui = await unitInputs(ctx, env, unit, from, to, tx);
      const existing = await tx
        .select({ hourStart: unitHours.hourStart, inputsHash: unitHours.inputsHash, fuel_W: unitHours.fuel_W, product_W: unitHours.product_W })
        .from(unitHours)
        .where(and(eq(unitHours.unitId, unit.id), gte(unitHours.hourStart, from), lt(unitHours.hourStart, to)));
      const known = new Map(existing.map((r) => [r.hourStart.getTime(), r.inputsHash]));
      const knownRow = new Map(existing.map((r) => [r.hourStart.getTime(), r]));
      const hours = new Set<number>([...known.keys(), ...ui.withData]);
      const rows: (typeof unitHours.$inferInsert)[] = [];
      const now = new Date();
      const isBoiler = env.boilerIds.has(unit.id);
      for (const t of [...hours].sort((x, y) => x - y)) {
        const input = ui.inputAt(t)!;
        if (!input.links.length && !known.has(t)) continue;
        computed++;
        // Same inputs, same row: an hour whose inputs hash is unchanged is neither computed nor written.
        let res: UnitHourResult | null = null;
        try {
          const hashes = unitHourHashes(input, { uncertainty: withU });
          if (known.get(t) !== hashes.inputsHash) res = computeUnitHour(input, { uncertainty: withU, hashes });
        } catch (err) {
          // One hour that cannot be computed is marked suspect with the reason; the job goes on.
          rows.push(faultRow(unit.id, t, (err as Error).message, now));
          faults++;
          continue;
        }
        if (res === null) {
          if (isBoiler) {
            const k = knownRow.get(t)!;
            const list = env.boilerHours.get(t) ?? [];
            list.push({ name: unit.name, fuel_W: k.fuel_W, product_W: k.product_W, cF_per_J: input.cost?.cF_per_J ?? null });
            env.boilerHours.set(t, list);
          }
          continue;
        }
        onResult?.(unit.id, t, res);
        if (isBoiler) {
          const list = env.boilerHours.get(t) ?? [];
          list.push({ name: unit.name, fuel_W: res.fuel_W, product_W: res.product_W, cF_per_J: input.cost?.cF_per_J ?? null });
          env.boilerHours.set(t, list);
        }
        rows.push(unitHourRowOf(unit.id, t, res, now));
        wFrom = Math.min(wFrom, t);
        wTo = Math.max(wTo, t + HOUR_ms);
      }
      await writeUnitHours(tx, rows);
      written += rows.length;
      if (rows.length) units.push(unit.id);
    }
    return { computed, written, units, fromMs: wFrom, toMs: wTo, faults };
  });
}

/** The span of hours the engine computes: 1900 to two days from now (uploads accept up to one). */
function saneSpan(nowMs = Date.now()): [number, number] {
  return [Date.UTC(1900, 0, 1), Math.ceil((nowMs + 2 * 86_400_000) / HOUR_ms) * HOUR_ms];
}

/** The row of an hour whose computation failed: suspect, with the reason, no figures. */
function faultRow(unitId: string, t: number, message: string, now: Date): typeof unitHours.$inferInsert {
  return {
    unitId,
    hourStart: new Date(t),
    state: 'suspect',
    reasons: [{ code: 'COMPUTE_FAILED', message: `This hour could not be computed (${message.slice(0, 300)}); the other hours were.` }],
    load: null,
    loadUnit: null,
    T0_K: null,
    p0_Pa: null,
    fuel_W: null,
    product_W: null,
    loss_W: null,
    destruction_W: null,
    efficiency: null,
    efficiency_U: null,
    destruction_U_W: null,
    closure_pct: null,
    entropyGeneration_W_per_K: null,
    destructionCost_per_h: null,
    modelVersion: 'fault',
    inputsHash: `fault:${now.getTime()}`,
    computedAt: now,
  };
}

/** The unit_hours row of a computed hour. */
export function unitHourRowOf(unitId: string, t: number, res: UnitHourResult, now: Date): typeof unitHours.$inferInsert {
  return {
    unitId,
    hourStart: new Date(t),
    state: res.state,
    reasons: res.reasons,
    load: res.load,
    loadUnit: res.loadUnit,
    T0_K: res.T0_K,
    p0_Pa: res.p0_Pa,
    fuel_W: res.fuel_W,
    product_W: res.product_W,
    loss_W: res.loss_W,
    destruction_W: res.destruction_W,
    efficiency: res.efficiency,
    efficiency_U: res.efficiency_U,
    destruction_U_W: res.destruction_U_W,
    closure_pct: res.closure_pct,
    entropyGeneration_W_per_K: res.entropyGeneration_W_per_K,
    destructionCost_per_h: res.destructionCost_per_h,
    modelVersion: res.modelVersion,
    inputsHash: res.inputsHash,
    computedAt: now,
  };
}

/** Writes unit hours (insert or replace), in batches. */
export async function writeUnitHours(tx: Reader, rows: (typeof unitHours.$inferInsert)[]) {
  for (let i = 0; i < rows.length; i += WRITE_BATCH) {
    await tx
      .insert(unitHours)
      .values(rows.slice(i, i + WRITE_BATCH))
      .onConflictDoUpdate({
        target: [unitHours.unitId, unitHours.hourStart],
        set: {
          state: sql`excluded.state`,
          reasons: sql`excluded.reasons`,
          load: sql`excluded.load`,
          loadUnit: sql`excluded.load_unit`,
          T0_K: sql`excluded.t0_k`,
          p0_Pa: sql`excluded.p0_pa`,
          fuel_W: sql`excluded.fuel_w`,
          product_W: sql`excluded.product_w`,
          loss_W: sql`excluded.loss_w`,
          destruction_W: sql`excluded.destruction_w`,
          efficiency: sql`excluded.efficiency`,
          efficiency_U: sql`excluded.efficiency_u`,
          destruction_U_W: sql`excluded.destruction_u_w`,
          closure_pct: sql`excluded.closure_pct`,
          entropyGeneration_W_per_K: sql`excluded.entropy_generation_w_per_k`,
          destructionCost_per_h: sql`excluded.destruction_cost_per_h`,
          modelVersion: sql`excluded.model_version`,
          inputsHash: sql`excluded.inputs_hash`,
          computedAt: sql`excluded.computed_at`,
        },
      });
  }
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
  const to = new Date(hourStartMs + HOUR_ms);
  const env = await chunkEnv(ctx, [unit], from, to, db());
  const ui = await unitInputs(ctx, env, unit, from, to, db());
  const input = ui.inputAt(hourStartMs)!;
  return computeUnitHour(input, { uncertainty });
}

/** The worker's handler of `compute-unit-hours`. */
export async function handleComputeUnitHours(data: unknown): Promise<ComputeSummary> {
  return computeUnitHours(ComputeUnitHoursPayload.parse(data));
}
