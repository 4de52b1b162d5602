/**
 * What the engine's jobs read: a site's plant model as engine units (siteContext), the span of hours
 * with data, the month's links, flue-gas O2 links, prices and boiler hours (chunkEnv), and per unit
 * the tag hours and the engine's input for any hour (unitInputs). The same code serves the job (every
 * hour) and the hour opened up (one hour, rebuilt on demand).
 */
import { and, asc, eq, gte, inArray, lt, sql } from 'drizzle-orm';
import {
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
} from '~/lib/engine';
import type { UnitKind } from '~/lib/kinds';
import type { Fluid } from '~/lib/plant/model';
import { db } from '../db/client';
import { coveredFractionSql, flatlineSql, plantPorts, plantUnits, sites, tagHours, tags, unitHours } from '../db/schema';
import { linksForRange, type ResolvedLink } from './plant-links';
import type { Tx } from './plant-tx';

export type Reader = Tx | ReturnType<typeof db>;

/** The first instant of the UTC month after t [ms]. */
export function nextMonth(t: number): number {
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
    ...(l.tagSpreadLimit !== null ? { spreadLimit: l.tagSpreadLimit } : {}),
    ...(l.tagMinCoverage !== null ? { minCoverage: l.tagMinCoverage } : {}),
  };
}

const holdsAt = (l: { validFromMs: number; validToMs: number | null }, t: number) => l.validFromMs <= t && (l.validToMs === null || l.validToMs > t);

export interface SiteContext {
  site: typeof sites.$inferSelect;
  engineSite: EngineSite;
  t0Tag: { id: string; seq: number; name: string } | null;
  /** tags.id -> tags.seq (the key of tag hours) */
  tagSeq: Map<string, number>;
  units: EngineUnit[];
  unitIds: Set<string>;
  boilers: EngineUnit[];
}

export async function siteContext(siteId: string, r: Reader = db()): Promise<SiteContext | null> {
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
export async function dataSpan(siteId: string, unitIds: string[], fromMs: number, toMs: number): Promise<[number, number] | null> {
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

/** Everything of a month of a site that every unit's hours share: links, flue-gas O2, prices, boilers. */
export interface ChunkEnv {
  linksByUnit: Map<string, { link: EngineLink; tagSeq: number }[]>;
  o2ByBoiler: Map<string, { link: EngineLink; tagSeq: number }[]>;
  elec: CostBasis | null;
  fuelCost: (b: EngineUnit) => CostBasis | null;
  /** boiler hours by hour start: stored ones of boilers the job leaves alone, then those it computes */
  boilerHours: Map<number, BoilerHour[]>;
  boilerIds: Set<string>;
}

export async function chunkEnv(ctx: SiteContext, targets: EngineUnit[], from: Date, to: Date, r: Reader): Promise<ChunkEnv> {
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
export async function unitInputs(ctx: SiteContext, env: ChunkEnv, unit: EngineUnit, from: Date, to: Date, r: Reader) {
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

