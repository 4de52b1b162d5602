/**
 * The energy lead's views of unit hours, the queries: a unit's trend against its expected band, the
 * loss ledger (units ranked by the cost of their destruction), the site's exergy flow over a period
 * and the overview. The shaping and its rules live in src/lib/views (trend.ts, ledger.ts, period.ts).
 */
import { and, asc, eq, gte, lt, sql } from 'drizzle-orm';
import { HOUR_MS, DAY_MS, MINUTE_MS } from '~/lib/time';
import { siteStamp } from '~/lib/site-time';
import { periodFor, type DataSpan, type Period, type PeriodChoice, type PeriodQuery } from '~/lib/views/period';
import { freshness, type Freshness } from '~/lib/views/freshness';
import {
  countStates,
  curveLoads,
  curveOf,
  meanOf,
  scatterOf,
  trendSeries,
  trendSummary,
  type ExpectedHour,
  type TrendAnswer,
} from '~/lib/views/trend';
import { flowFrom, kindLabel, ledgerFrom, overviewUnit, type FlowAnswer, type LedgerAnswer, type OverviewSite, type UnitSums } from '~/lib/views/ledger';
import { db } from '../db/client';
import { plantUnits, sites, unitHours } from '../db/schema';
import { AppError } from '../errors';
import { expectedBand, openNoticeCount, siteNotices } from './views-insight';
import { getSite, unitWithSite } from './plant-site-model';
import { cachedHours } from '../hours-cache';
import { LIST_COLUMNS } from './engine-results';

export type { TrendAnswer } from '~/lib/views/trend';
export type { FlowAnswer, LedgerAnswer, LedgerRow, OverviewSite } from '~/lib/views/ledger';

const viewSite = (s: typeof sites.$inferSelect) => ({ id: s.id, name: s.name, timeZone: s.timeZone, currency: s.currency });

/** The minute `nowMs` falls in: unit hours start on whole minutes, so "up to now" reads the same. */
const minuteOf = (nowMs: number) => Math.floor(nowMs / MINUTE_MS) * MINUTE_MS;

/**
 * First and last computed hour of a unit, or of a site's units (hours after now left out), for the
 * period a view opens on (src/lib/views/period.ts defaultPeriod). Each unit's first and last hour is
 * found through its key (unit, hour) in the month partitions at either end: a few index probes per
 * unit instead of reading every hour of the site. Kept in the read cache (src/server/hours-cache.ts)
 * until unit hours change.
 */
export async function dataSpan(siteId: string, unitId?: string, nowMs = Date.now()): Promise<DataSpan | null> {
  const upTo = minuteOf(nowMs);
  return cachedHours(`span:${unitId ?? siteId}:${upTo}`, async () => {
    const now = new Date(upTo).toISOString();
    const units = unitId ? sql`select ${unitId}::uuid as id` : sql`select id from plant_units where site_id = ${siteId}`;
    const rows = await db().execute<{ first: string | null; last: string | null }>(sql`
      select min(f.h)::text as first, max(l.h)::text as last
      from (${units}) u
      cross join lateral (select hour_start as h from unit_hours where unit_id = u.id and hour_start <= ${now}::timestamptz order by hour_start asc limit 1) f
      cross join lateral (select hour_start as h from unit_hours where unit_id = u.id and hour_start <= ${now}::timestamptz order by hour_start desc limit 1) l`);
    const r = rows.rows[0];
    return r?.first && r.last ? { firstMs: Date.parse(r.first), lastMs: Date.parse(r.last) } : null;
  });
}

/** How fresh a site's figures are (src/lib/views/freshness.ts), for the note every page of the site shows. */
export async function siteFreshness(siteId: string | typeof sites.$inferSelect, nowMs = Date.now()): Promise<Freshness> {
  const site = typeof siteId === 'string' ? await getSite(siteId) : siteId;
  const span = await dataSpan(site.id, undefined, nowMs);
  return freshness(span?.lastMs ?? null, site.timeZone, nowMs);
}

/** The period of a query (the default one when it names none), with why it was chosen. */
async function periodOrError(q: PeriodQuery, timeZone: string, span: () => Promise<DataSpan | null>, nowMs = Date.now()): Promise<{ period: Period; opened: PeriodChoice }> {
  try {
    const { period, choice } = periodFor(q, timeZone, q.anchor || q.range === 'custom' ? null : await span(), nowMs);
    return { period, opened: choice };
  } catch (err) {
    throw new AppError('VALIDATION_FAILED', (err as Error).message);
  }
}

/**
 * A unit with its site, kept in the read cache (plant units and sites notify it at every change). The
 * answer is shared: callers must not change it.
 */
export function cachedUnitWithSite(unitId: string) {
  return cachedHours(`unit:${unitId}`, () => unitWithSite(unitId));
}

/** A unit's hours over a period, with its expected band, context spans and notices. */
export async function unitTrend(unitId: string, q: PeriodQuery, nowMs?: number): Promise<TrendAnswer> {
  const { site, period, opened, now, body } = await trendParts(unitId, q, nowMs);
  return { ...(await body()), opened, freshness: await siteFreshness(site, now) };
}

/**
 * unitTrend's answer as JSON text (the trend endpoint sends it): the text of everything but the
 * freshness note and the period's choice is kept in the read cache too, so a request writes only
 * those two (JSON.stringify of a week's answer was a good part of a request's CPU).
 */
export async function unitTrendJson(unitId: string, q: PeriodQuery, nowMs?: number): Promise<string> {
  const { unit, site, period, opened, now, body } = await trendParts(unitId, q, nowMs);
  const text = await cachedHours(`trend-json:${unit.id}:${JSON.stringify(period)}`, async () => JSON.stringify(await body()), { large: true });
  const head = JSON.stringify({ opened, freshness: await siteFreshness(site, now) });
  return `${head.slice(0, -1)},${text.slice(1)}`;
}

async function trendParts(unitId: string, q: PeriodQuery, nowMs?: number) {
  const { unit, site } = await cachedUnitWithSite(unitId);
  const now = nowMs ?? Date.now();
  const { period, opened } = await periodOrError(q, site.timeZone, () => dataSpan(site.id, unit.id, now), now);
  // Everything but the freshness note (which moves with the clock) depends only on stored rows that
  // notify the read cache at every change: one computation per unit and period while nothing changes.
  const body = () => cachedHours(`trend:${unit.id}:${JSON.stringify(period)}`, () => trendBody(unit, site, period), { large: true });
  return { unit, site, period, opened, now, body };
}

/** The columns of the unit-hour list a trend reads. */
const TREND_COLUMNS = (({ hourStart, state, reasons, load, loadUnit, T0_K, efficiency, efficiency_U, destruction_W, destruction_U_W }) => ({
  hourStart, state, reasons, load, loadUnit, T0_K, efficiency, efficiency_U, destruction_W, destruction_U_W,
}))(LIST_COLUMNS);

async function trendBody(
  unit: typeof plantUnits.$inferSelect,
  site: typeof sites.$inferSelect,
  period: Period,
): Promise<Omit<TrendAnswer, 'opened' | 'freshness'>> {
  const unitId = unit.id;
  const rows = await db()
    .select(TREND_COLUMNS)
    .from(unitHours)
    .where(and(eq(unitHours.unitId, unitId), gte(unitHours.hourStart, new Date(period.fromMs)), lt(unitHours.hourStart, new Date(period.toMs))))
    .orderBy(asc(unitHours.hourStart));

  const steady = rows.filter((r) => r.state === 'steady');
  const { baseline, expected } = await expectedBand(unitId, steady);
  const expectedAt = new Map<number, ExpectedHour>();
  steady.forEach((r, i) => {
    const e = expected[i];
    if (e) expectedAt.set(r.hourStart.getTime(), e);
  });
  const { bucket, points, context } = trendSeries(rows, period, expectedAt);
  const scatter = scatterOf(steady);
  const loads = baseline ? curveLoads(scatter) : [];
  const T0_K = meanOf(steady.map((r) => r.T0_K)) ?? site.T0_K;
  const band = loads.length ? await expectedBand(unitId, loads.map((load) => ({ hourStart: new Date(period.fromMs), load, T0_K }))) : null;

  return {
    unit: { id: unit.id, name: unit.name, kind: unit.kind, kindLabel: kindLabel(unit.kind) },
    site: viewSite(site),
    period,
    bucket,
    points,
    context,
    stateHours: countStates(rows),
    missingHours: Math.max(0, period.hours - rows.length),
    summary: trendSummary(steady, [...expectedAt.values()]),
    loadUnit: rows.find((r) => r.loadUnit)?.loadUnit ?? null,
    scatter,
    curve: band ? curveOf(loads, band.expected) : [],
    baseline,
    notices: await siteNotices({ unitIds: [unitId], fromMs: period.fromMs, toMs: period.toMs }),
  };
}

// ---- ledger ------------------------------------------------------------------------------------

const num = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));

/** Per unit of a site: hours by state and sums over steady hours in [fromMs, toMs) (energies in Wh). */
export async function unitSums(siteId: string, fromMs: number, toMs: number): Promise<UnitSums[]> {
  const from = new Date(fromMs).toISOString();
  const to = new Date(toMs).toISOString();
  const steady = sql`h.state = 'steady'`;
  const res = await db().execute<Record<string, unknown>>(sql`
    select u.id as unit_id, u.name, u.kind,
      count(h.hour_start) filter (where ${steady}) as steady,
      count(h.hour_start) filter (where h.state = 'unsettled') as unsettled,
      count(h.hour_start) filter (where h.state = 'idle') as idle,
      count(h.hour_start) filter (where h.state = 'suspect') as suspect,
      sum(h.destruction_w) filter (where ${steady}) as d_wh,
      sum(h.destruction_u_w) filter (where ${steady}) as du_wh,
      sum(h.fuel_w) filter (where ${steady}) as f_wh,
      sum(h.product_w) filter (where ${steady}) as p_wh,
      sum(h.loss_w) filter (where ${steady}) as l_wh,
      sum(h.destruction_cost_per_h) filter (where ${steady}) as cost,
      count(h.destruction_cost_per_h) filter (where ${steady}) as cost_hours,
      avg(h.efficiency) filter (where ${steady}) as eff,
      avg(h.efficiency_u) filter (where ${steady} and h.efficiency is not null) as eff_u
    from plant_units u
    left join unit_hours h on h.unit_id = u.id and h.hour_start >= ${from}::timestamptz and h.hour_start < ${to}::timestamptz
    where u.site_id = ${siteId}
    group by u.id, u.name, u.kind
    order by u.name`);
  // Each hour's power [W] held for one hour: the sum of hourly W is the energy in Wh.
  return res.rows.map((r) => ({
    unitId: String(r.unit_id),
    name: String(r.name),
    kind: String(r.kind),
    hours: { steady: Number(r.steady), unsettled: Number(r.unsettled), idle: Number(r.idle), suspect: Number(r.suspect) },
    destruction_Wh: num(r.d_wh),
    destructionU_Wh: num(r.du_wh),
    fuel_Wh: num(r.f_wh),
    product_Wh: num(r.p_wh),
    loss_Wh: num(r.l_wh),
    cost: num(r.cost),
    costHours: Number(r.cost_hours),
    efficiencyMean: num(r.eff),
    efficiencyMean_U: num(r.eff_u),
  }));
}

/** The loss ledger of a site over a period. */
export async function siteLedger(siteId: string, q: PeriodQuery, nowMs?: number): Promise<LedgerAnswer> {
  const site = await getSite(siteId);
  const now = nowMs ?? Date.now();
  const { period, opened } = await periodOrError(q, site.timeZone, () => dataSpan(site.id, undefined, now), now);
  return { site: viewSite(site), period, opened, freshness: await siteFreshness(site, now), ...ledgerFrom(await unitSums(site.id, period.fromMs, period.toMs)) };
}

/** The site's exergy flow over a period (src/lib/views/ledger.ts flowFrom). */
export async function siteFlow(siteId: string, q: PeriodQuery, nowMs?: number): Promise<FlowAnswer> {
  const site = await getSite(siteId);
  const now = nowMs ?? Date.now();
  const { period, opened } = await periodOrError(q, site.timeZone, () => dataSpan(site.id, undefined, now), now);
  return { site: viewSite(site), period, opened, freshness: await siteFreshness(site, now), ...flowFrom(await unitSums(site.id, period.fromMs, period.toMs)) };
}

/**
 * Every site with its units over the 24 hours up to its latest unit hour (steady hours only), for the
 * overview page: with historian files uploaded in batches, "the last 24 hours" means the last day
 * with data, and the page says which.
 */
export async function overview(nowMs = Date.now()): Promise<OverviewSite[]> {
  const all = await cachedHours('sites', () => db().select().from(sites).orderBy(asc(sites.name)));
  return Promise.all(all.map((site) => overviewSite(site, nowMs)));
}

async function overviewSite(site: typeof sites.$inferSelect, nowMs: number): Promise<OverviewSite> {
  const [span, openNotices] = await Promise.all([dataSpan(site.id, undefined, nowMs), cachedHours(`open-notices:${site.id}`, () => openNoticeCount(site.id))]);
  const lastMs = span?.lastMs ?? null;
  const endMs = lastMs !== null ? lastMs + HOUR_MS : nowMs;
  // The sums of a site's last day change only with its unit hours (or units): kept in the read cache.
  const sums = lastMs !== null ? await cachedHours(`overview:${site.id}:${endMs}`, () => unitSums(site.id, endMs - DAY_MS, endMs)) : await unitSums(site.id, endMs - DAY_MS, endMs);
  return {
    ...viewSite(site),
    units: sums.map(overviewUnit),
    windowFrom: siteStamp(endMs - DAY_MS, site.timeZone),
    windowTo: siteStamp(endMs, site.timeZone),
    lastHour: lastMs !== null ? siteStamp(lastMs, site.timeZone) : null,
    freshness: freshness(lastMs, site.timeZone, nowMs),
    openNotices,
  };
}

// ---- page headers ------------------------------------------------------------------------------

/** A unit with its site, for a page's heading; null when there is no such unit. */
export async function unitHeading(unitId: string) {
  try {
    const { unit, site } = await unitWithSite(unitId);
    return { unit: { id: unit.id, name: unit.name, kind: unit.kind, kindLabel: kindLabel(unit.kind) }, site: { id: site.id, name: site.name, timeZone: site.timeZone } };
  } catch {
    return null;
  }
}

/** Every site with its units (name, kind), for the pickers of the views. */
export async function sitesWithUnits() {
  const all = await db().select().from(sites).orderBy(asc(sites.name));
  const units = await db().select({ id: plantUnits.id, siteId: plantUnits.siteId, name: plantUnits.name, kind: plantUnits.kind }).from(plantUnits).orderBy(asc(plantUnits.name));
  return all.map((s) => ({
    id: s.id,
    name: s.name,
    timeZone: s.timeZone,
    currency: s.currency,
    units: units.filter((u) => u.siteId === s.id).map((u) => ({ id: u.id, name: u.name, kind: u.kind, kindLabel: kindLabel(u.kind) })),
  }));
}
