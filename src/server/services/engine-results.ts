/**
 * Reading the engine's unit hours: a unit's hours over a range (JSON or CSV, units in the field names),
 * one hour opened up (the stored audit trail), and the units of every site with their latest hour.
 */
import { and, asc, desc, eq, gte, lt, sql } from 'drizzle-orm';
import { db } from '../db/client';
import { AppError } from '../errors';
import { unitHours } from '../db/schema';
import { toCsv, type CsvCell } from '~/lib/csv-write';
import { rebuildUnitHour } from './engine';
import { unitWithSite } from './plant-site-model';
import { cachedHours } from '../hours-cache';
import { isId } from '../access';
import { MAX_RANGE_MS, checkHourRange } from './tag-hours';

/** Longest range one request may ask for (the one limit of tag-hours.ts). */
export { MAX_RANGE_MS };

/** A unit with its site, for the results API and page. */
export async function unitHeader(unitId: string | undefined) {
  // Kept in the read cache (src/server/hours-cache.ts) until units or sites change.
  const { unit, site } = isId(unitId) ? await cachedHours(`unit:${unitId}`, () => unitWithSite(unitId)) : await unitWithSite(unitId);
  return {
    id: unit.id,
    name: unit.name,
    kind: unit.kind,
    description: unit.description,
    parameters: unit.parameters,
    siteId: site.id,
    siteName: site.name,
    timeZone: site.timeZone,
    currency: site.currency,
  };
}
export type UnitHeader = Awaited<ReturnType<typeof unitHeader>>;

/** The columns of a unit hour without its detail, as the API names them (the trend reads a few of them). */
export const LIST_COLUMNS = {
  hourStart: unitHours.hourStart,
  state: unitHours.state,
  reasons: unitHours.reasons,
  load: unitHours.load,
  loadUnit: unitHours.loadUnit,
  T0_K: unitHours.T0_K,
  p0_Pa: unitHours.p0_Pa,
  fuel_W: unitHours.fuel_W,
  product_W: unitHours.product_W,
  loss_W: unitHours.loss_W,
  destruction_W: unitHours.destruction_W,
  efficiency: unitHours.efficiency,
  efficiency_U: unitHours.efficiency_U,
  destruction_U_W: unitHours.destruction_U_W,
  closure_pct: unitHours.closure_pct,
  entropyGeneration_W_per_K: unitHours.entropyGeneration_W_per_K,
  destructionCost_per_h: unitHours.destructionCost_per_h,
  modelVersion: unitHours.modelVersion,
  inputsHash: unitHours.inputsHash,
  computedAt: unitHours.computedAt,
};

const range = checkHourRange;

/**
 * A unit's hours with hour start in [from, to), oldest first, without the detail. Kept in the read
 * cache (src/server/hours-cache.ts) until unit hours change: the rows are shared, callers must not
 * change them.
 */
export async function unitHoursOf(unitId: string, from: Date, to: Date) {
  range(from, to);
  return cachedHours(`unit-hours:${unitId}:${from.getTime()}:${to.getTime()}`, () => readUnitHours(unitId, from, to), { large: true });
}

async function readUnitHours(unitId: string, from: Date, to: Date) {
  const rows = await db()
    .select(LIST_COLUMNS)
    .from(unitHours)
    .where(and(eq(unitHours.unitId, unitId), gte(unitHours.hourStart, from), lt(unitHours.hourStart, to)))
    .orderBy(asc(unitHours.hourStart));
  return rows.map((r) => ({ ...r, hourStart: r.hourStart.toISOString(), computedAt: r.computedAt.toISOString() }));
}
export type UnitHourRow = Awaited<ReturnType<typeof unitHoursOf>>[number];

/**
 * One hour of a unit with its audit trail (detail), or NOT_FOUND. The detail is not stored: it is
 * rebuilt from the stored tag hours and the link versions of the hour by the same engine that
 * stored the row (src/server/services/engine.ts rebuildUnitHour). `rebuilt` says whether the
 * rebuilt hour's model version and inputs hash are the stored ones (they differ only when a late
 * file or a plant-model change has not been recomputed yet; the detail then shows the hour as it
 * would be computed now).
 */
export async function unitHourDetail(unitId: string, hourStart: Date) {
  if (Number.isNaN(hourStart.getTime())) throw new AppError('VALIDATION_FAILED', 'Give the hour as an ISO 8601 instant (with Z or an offset) or in ms.');
  const [r] = await db()
    .select(LIST_COLUMNS)
    .from(unitHours)
    .where(and(eq(unitHours.unitId, unitId), eq(unitHours.hourStart, hourStart)))
    .limit(1);
  if (!r) throw new AppError('NOT_FOUND', 'This unit has no computed hour starting then.');
  const t0 = performance.now();
  let res = await rebuildUnitHour(unitId, hourStart.getTime(), true);
  // An hour stored without uncertainty (a job run with uncertainty off) hashes that choice too.
  if (res && res.inputsHash !== r.inputsHash) {
    const without = await rebuildUnitHour(unitId, hourStart.getTime(), false);
    if (without && without.inputsHash === r.inputsHash) res = without;
  }
  const rebuilt = {
    modelVersion: res?.modelVersion ?? null,
    inputsHash: res?.inputsHash ?? null,
    matches: !!res && res.inputsHash === r.inputsHash && res.modelVersion === r.modelVersion,
    ms: Math.round((performance.now() - t0) * 10) / 10,
  };
  return { ...r, hourStart: r.hourStart.toISOString(), computedAt: r.computedAt.toISOString(), detail: res?.detail ?? null, rebuilt };
}
export type UnitHourDetail = Awaited<ReturnType<typeof unitHourDetail>>;

/** The latest hour start of a unit, or null. */
export async function latestHourOf(unitId: string): Promise<Date | null> {
  const [r] = await db().select({ h: unitHours.hourStart }).from(unitHours).where(eq(unitHours.unitId, unitId)).orderBy(desc(unitHours.hourStart)).limit(1);
  return r?.h ?? null;
}

const CSV_FIELDS = [
  'hourStart',
  'state',
  'reasons',
  'load',
  'loadUnit',
  'T0_K',
  'p0_Pa',
  'fuel_W',
  'product_W',
  'loss_W',
  'destruction_W',
  'efficiency',
  'efficiency_U',
  'destruction_U_W',
  'closure_pct',
  'entropyGeneration_W_per_K',
  'destructionCost_per_h',
  'currency',
  'modelVersion',
  'inputsHash',
  'computedAt',
] as const;

/**
 * The hours as CSV (RFC 4180, CR LF, written by Papa.unparse), the JSON field names as the header;
 * reasons as their codes separated by '; '. Numbers are written as they are (a finite number is never
 * a formula, and -0.3 stays a number); a text cell a spreadsheet would run as a formula is neutralised.
 */
export function unitHoursCsv(rows: readonly UnitHourRow[], currency: string): string {
  const records = rows.map((r) => {
    const rec: Record<(typeof CSV_FIELDS)[number], CsvCell> = { ...r, reasons: r.reasons.map((x) => x.code).join('; '), currency };
    return CSV_FIELDS.map((f) => rec[f]);
  });
  return toCsv([[...CSV_FIELDS], ...records]);
}

/** Every site's units with the state of their latest computed hour, for the results index. */
export async function unitsOverview() {
  const res = await db().execute<{
    site_id: string;
    site_name: string;
    time_zone: string;
    unit_id: string;
    unit_name: string;
    kind: string;
    last_hour: Date | null;
    last_state: string | null;
    hours: number;
  }>(sql`
    select s.id as site_id, s.name as site_name, s.time_zone, u.id as unit_id, u.name as unit_name, u.kind,
           l.hour_start as last_hour, l.state as last_state, coalesce(c.n, 0)::int as hours
    from plant_units u
    join sites s on s.id = u.site_id
    left join lateral (select hour_start, state from unit_hours h where h.unit_id = u.id order by hour_start desc limit 1) l on true
    left join lateral (select count(*) as n from unit_hours h where h.unit_id = u.id) c on true
    order by s.name, u.name`);
  return res.rows.map((r) => ({
    siteId: r.site_id,
    siteName: r.site_name,
    timeZone: r.time_zone,
    unitId: r.unit_id,
    unitName: r.unit_name,
    kind: r.kind,
    lastHour: r.last_hour ? new Date(r.last_hour).toISOString() : null,
    lastState: r.last_state,
    hours: Number(r.hours),
  }));
}
