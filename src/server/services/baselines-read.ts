/**
 * Baselines, the read side: versions as screens see them (with the trust of their fit), a unit's
 * steady hours for a fit, the span of its hours, and the lists of the baselines page. The fitting,
 * accepting and expected values live in ./baselines.ts, which re-exports these.
 */
import { and, asc, desc, eq, gte, isNotNull, lt, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { meetsGuideline14, type BaselineModel } from '~/lib/analytics/baseline';
import { baselineTrust } from '~/lib/analytics/fit-trust';
import { baselineLabel, type BaselineSummary, type ModelSummary } from '~/lib/baseline-view';
import { db } from '../db/client';
import { baselines, plantUnits, sites, unitHours, user } from '../db/schema';
import { isId } from '../access';
import { AppError } from '../errors';

export function summariseModel(m: BaselineModel): ModelSummary {
  const { n, p, s, r2, ybar, cvRmse, nmbe } = m.stats;
  return { coefficients: m.coefficients, stats: { n, p, s, r2, ybar, cvRmse, nmbe }, guideline14: meetsGuideline14(m.stats, 'hourly') };
}

export { baselineLabel };

const creator = alias(user, 'creator');
const decider = alias(user, 'decider');

export function summaryQuery() {
  return db()
    .select({
      b: baselines,
      unitName: plantUnits.name,
      unitKind: plantUnits.kind,
      siteId: sites.id,
      siteName: sites.name,
      timeZone: sites.timeZone,
      createdByName: creator.name,
      decidedByName: decider.name,
    })
    .from(baselines)
    .innerJoin(plantUnits, eq(plantUnits.id, baselines.unitId))
    .innerJoin(sites, eq(sites.id, plantUnits.siteId))
    .leftJoin(creator, eq(creator.id, baselines.createdBy))
    .leftJoin(decider, eq(decider.id, baselines.decidedBy));
}

type SummaryRow = Awaited<ReturnType<ReturnType<typeof summaryQuery>['execute']>>[number];

export function toSummary(r: SummaryRow): BaselineSummary {
  const b = r.b;
  const efficiency = b.efficiencyModel ? summariseModel(b.efficiencyModel) : null;
  const destruction = summariseModel(b.destructionModel);
  return {
    id: b.id,
    unitId: b.unitId,
    unitName: r.unitName,
    unitKind: r.unitKind,
    siteId: r.siteId,
    siteName: r.siteName,
    timeZone: r.timeZone,
    version: b.version,
    status: b.status,
    periodFrom: b.periodFrom.toISOString(),
    periodTo: b.periodTo.toISOString(),
    terms: b.terms,
    hours: b.hours,
    loadUnit: b.loadUnit,
    note: b.note,
    efficiency,
    destruction,
    meetsGuideline14: destruction.guideline14.meets && (efficiency ? efficiency.guideline14.meets : true),
    trust: baselineTrust(b.destructionModel, b.efficiencyModel),
    createdBy: r.createdByName,
    createdAt: b.createdAt.toISOString(),
    decidedBy: r.decidedByName,
    decidedAt: b.decidedAt?.toISOString() ?? null,
    retiredAt: b.retiredAt?.toISOString() ?? null,
    label: baselineLabel(b.version, b.periodFrom, b.periodTo, r.timeZone),
  };
}

export async function unitRow(unitId: string) {
  if (!isId(unitId)) throw new AppError('NOT_FOUND', 'No such unit.');
  const [u] = await db()
    .select({ id: plantUnits.id, name: plantUnits.name, kind: plantUnits.kind, siteId: sites.id, siteName: sites.name, timeZone: sites.timeZone })
    .from(plantUnits)
    .innerJoin(sites, eq(sites.id, plantUnits.siteId))
    .where(eq(plantUnits.id, unitId));
  if (!u) throw new AppError('NOT_FOUND', 'No such unit.');
  return u;
}

/** One version by id. */
export async function getBaseline(baselineId: string): Promise<BaselineSummary> {
  if (!isId(baselineId)) throw new AppError('NOT_FOUND', 'No such baseline.');
  const [r] = await summaryQuery().where(eq(baselines.id, baselineId));
  if (!r) throw new AppError('NOT_FOUND', 'No such baseline.');
  return toSummary(r);
}

/** Every version of a unit, newest first. */
export async function unitBaselines(unitId: string): Promise<BaselineSummary[]> {
  await unitRow(unitId);
  const rows = await summaryQuery().where(eq(baselines.unitId, unitId)).orderBy(desc(baselines.version));
  return rows.map(toSummary);
}

/**
 * The unit's active baseline (the one named on every chart), or null when none is accepted yet.
 * @param unitId plant unit id
 */
export async function activeBaseline(unitId: string): Promise<BaselineSummary | null> {
  if (!isId(unitId)) return null;
  const [r] = await summaryQuery().where(and(eq(baselines.unitId, unitId), eq(baselines.status, 'active')));
  return r ? toSummary(r) : null;
}
/** A steady hour of the unit with what a baseline and the drift check need: load, T0 and destruction. */
export const usableSteadyHour = (unitId: string) =>
  and(eq(unitHours.unitId, unitId), eq(unitHours.state, 'steady'), isNotNull(unitHours.load), isNotNull(unitHours.T0_K), isNotNull(unitHours.destruction_W));

/** Steady hours of a unit with what a baseline needs, oldest first. */
export async function steadyHours(unitId: string, from: Date, to: Date) {
  return db()
    .select({
      hourStart: unitHours.hourStart,
      load: unitHours.load,
      loadUnit: unitHours.loadUnit,
      T0_K: unitHours.T0_K,
      efficiency: unitHours.efficiency,
      destruction_W: unitHours.destruction_W,
    })
    .from(unitHours)
    .where(
      and(usableSteadyHour(unitId), gte(unitHours.hourStart, from), lt(unitHours.hourStart, to)),
    )
    .orderBy(asc(unitHours.hourStart));
}

/** The span of a unit's hours, for proposing a reference period. */
export async function unitHourSpan(unitId: string) {
  await unitRow(unitId);
  const [r] = await db()
    .select({
      first: sql<string | null>`min(${unitHours.hourStart})`,
      last: sql<string | null>`max(${unitHours.hourStart})`,
      hours: sql<number>`count(*)::int`,
      steady: sql<number>`(count(*) filter (where ${unitHours.state} = 'steady'))::int`,
    })
    .from(unitHours)
    .where(eq(unitHours.unitId, unitId));
  return {
    first: r?.first ? new Date(r.first).toISOString() : null,
    last: r?.last ? new Date(r.last).toISOString() : null,
    hours: r?.hours ?? 0,
    steady: r?.steady ?? 0,
  };
}

/** Every unit of every site with its active baseline and the count of each status, for /baselines. */
export async function baselineOverview() {
  const units = await db()
    .select({ id: plantUnits.id, name: plantUnits.name, kind: plantUnits.kind, siteId: sites.id, siteName: sites.name, timeZone: sites.timeZone })
    .from(plantUnits)
    .innerJoin(sites, eq(sites.id, plantUnits.siteId))
    .orderBy(asc(sites.name), asc(plantUnits.name));
  const all = (await summaryQuery().orderBy(desc(baselines.version))).map(toSummary);
  return units.map((u) => {
    const versions = all.filter((b) => b.unitId === u.id);
    return {
      ...u,
      active: versions.find((b) => b.status === 'active') ?? null,
      drafts: versions.filter((b) => b.status === 'draft').map((b) => ({ id: b.id, version: b.version })),
      versions: versions.length,
    };
  });
}

/** The units for the builder's picker (id, name, site). */
export async function unitChoices() {
  return db()
    .select({ id: plantUnits.id, name: plantUnits.name, kind: plantUnits.kind, siteId: sites.id, siteName: sites.name, timeZone: sites.timeZone })
    .from(plantUnits)
    .innerJoin(sites, eq(sites.id, plantUnits.siteId))
    .orderBy(asc(sites.name), asc(plantUnits.name));
}
