/**
 * The energy lead's views of unit hours: a unit's trend against its expected band, the loss ledger
 * (units ranked by the cost of their destruction), and the site's exergy flow over a period.
 *
 * Only steady hours feed figures (lines, sums, means); unsettled, idle and suspect hours are counted
 * and shown as context. Energies are sums of hourly powers over one hour each: sum(W) x 1 h = Wh,
 * reported in MWh. Expanded uncertainties (k = 2) of sums and means add the hourly U linearly, i.e.
 * they treat the hours' errors as fully correlated (instrument bias dominates an hour's uncertainty,
 * and a bias does not average out); that is the cautious choice and is said beside every figure.
 */
import { and, asc, eq, gte, lt, sql } from 'drizzle-orm';
import { kindSpec, type UnitKind } from '~/lib/plant/kinds';
import { db } from '../db/client';
import { HOUR_STATES, plantUnits, sites, unitHours, type HourState } from '../db/schema';
import { AppError } from '../errors';
import { isId } from '../access';
import { localStamp, resolvePeriod, type Period, type PeriodQuery } from './views-period';
import { expectedBand, openNoticeCount, siteNotices, type BaselineInfo, type ExpectedHour, type NoticeMark } from './views-insight';

export const HOUR_ms = 3_600_000;
/** Watt-hours in one MWh: a sum of hourly W divided by this is MWh. */
const WH_PER_MWH = 1e6;
/** Periods longer than this many hours are drawn per local day instead of per hour. */
export const HOURLY_LIMIT_h = 62 * 24;

export type { StateCounts, TrendPoint, ContextSpan } from '~/lib/trend-view';
import type { StateCounts, TrendPoint, ContextSpan } from '~/lib/trend-view';
const zeroCounts = (): StateCounts => ({ steady: 0, unsettled: 0, idle: 0, suspect: 0 });

async function siteOf(siteId: string) {
  if (!isId(siteId)) throw new AppError('NOT_FOUND', 'No such site.');
  const [site] = await db().select().from(sites).where(eq(sites.id, siteId)).limit(1);
  if (!site) throw new AppError('NOT_FOUND', 'No such site.');
  return site;
}

async function unitWithSite(unitId: string) {
  if (!isId(unitId)) throw new AppError('NOT_FOUND', 'No such unit.');
  const [row] = await db()
    .select({ unit: plantUnits, site: sites })
    .from(plantUnits)
    .innerJoin(sites, eq(sites.id, plantUnits.siteId))
    .where(eq(plantUnits.id, unitId))
    .limit(1);
  if (!row) throw new AppError('NOT_FOUND', 'No such unit.');
  return row;
}

/**
 * Without an anchor a period shows the latest data, not an empty "now": files arrive in batches and
 * a site's newest unit hour may be weeks old (the demo plant's is). Falls back to now.
 */
async function defaultNowMs(q: PeriodQuery, siteId: string, unitId?: string): Promise<number> {
  const now = Date.now();
  if (q.anchor || q.range === 'custom') return now;
  const rows = await db().execute<{ last: string | null }>(
    unitId
      ? sql`select max(hour_start)::text as last from unit_hours where unit_id = ${unitId} and hour_start <= now()`
      : sql`select max(h.hour_start)::text as last from unit_hours h join plant_units u on u.id = h.unit_id where u.site_id = ${siteId} and h.hour_start <= now()`,
  );
  const last = rows.rows[0]?.last;
  return last ? Date.parse(last) : now;
}

function periodOrError(q: PeriodQuery, timeZone: string, nowMs?: number): Period {
  try {
    return resolvePeriod(q, timeZone, nowMs);
  } catch (err) {
    throw new AppError('VALIDATION_FAILED', (err as Error).message);
  }
}

export const kindLabel = (kind: string): string => {
  try {
    return kindSpec(kind as UnitKind).label;
  } catch {
    return kind;
  }
};

// ---- trend -------------------------------------------------------------------------------------



export interface TrendAnswer {
  unit: { id: string; name: string; kind: string; kindLabel: string };
  site: { id: string; name: string; timeZone: string; currency: string };
  period: Period;
  bucket: 'hour' | 'day';
  points: TrendPoint[];
  context: ContextSpan[];
  stateHours: StateCounts;
  /** Hours of the period with no unit hour at all (no data or not computed). */
  missingHours: number;
  summary: {
    steadyHours: number;
    efficiencyMean: number | null;
    efficiencyMean_U: number | null;
    destructionMean_W: number | null;
    destructionMean_U_W: number | null;
    expectedEfficiencyMean: number | null;
    expectedDestructionMean_W: number | null;
  };
  loadUnit: string | null;
  /** Steady hours for the scatter against load (efficiency null for dissipative units). */
  scatter: { t: number; load: number; efficiency: number | null; efficiency_U: number | null; destruction_W: number | null }[];
  /** The baseline's curve over the load range at the period's mean ambient temperature, with its k = 2 band. */
  curve: { load: number; efficiency: number | null; lo: number | null; hi: number | null; destruction_W: number | null; dLo_W: number | null; dHi_W: number | null }[];
  baseline: BaselineInfo | null;
  notices: NoticeMark[];
}

const mean = (xs: number[]) => (xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : null);
const num = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));

/** A unit's hours over a period, with its expected band, context spans and notices. */
export async function unitTrend(unitId: string, q: PeriodQuery, nowMs?: number): Promise<TrendAnswer> {
  const { unit, site } = await unitWithSite(unitId);
  const period = periodOrError(q, site.timeZone, nowMs ?? (await defaultNowMs(q, site.id, unit.id)));
  const rows = await db()
    .select({
      hourStart: unitHours.hourStart,
      state: unitHours.state,
      reasons: unitHours.reasons,
      load: unitHours.load,
      loadUnit: unitHours.loadUnit,
      T0_K: unitHours.T0_K,
      efficiency: unitHours.efficiency,
      efficiency_U: unitHours.efficiency_U,
      destruction_W: unitHours.destruction_W,
      destruction_U_W: unitHours.destruction_U_W,
    })
    .from(unitHours)
    .where(and(eq(unitHours.unitId, unitId), gte(unitHours.hourStart, new Date(period.fromMs)), lt(unitHours.hourStart, new Date(period.toMs))))
    .orderBy(asc(unitHours.hourStart));

  const steady = rows.filter((r) => r.state === 'steady');
  const { baseline, expected } = await expectedBand(
    unitId,
    steady.map((r) => ({ hourStart: r.hourStart, load: r.load, T0_K: r.T0_K })),
  );
  const expectedAt = new Map<number, ExpectedHour>();
  steady.forEach((r, i) => {
    const e = expected[i];
    if (e) expectedAt.set(r.hourStart.getTime(), e);
  });

  const stateHours = zeroCounts();
  for (const r of rows) stateHours[r.state] += 1;

  // Context: runs of consecutive hours of the same non-steady state.
  const context: ContextSpan[] = [];
  for (const r of rows) {
    if (r.state === 'steady') continue;
    const t = r.hourStart.getTime();
    const last = context[context.length - 1];
    if (last && last.state === r.state && last.toMs === t) {
      last.toMs = t + HOUR_ms;
      last.hours += 1;
    } else context.push({ state: r.state, fromMs: t, toMs: t + HOUR_ms, hours: 1 });
  }

  const bucket: 'hour' | 'day' = period.hours > HOURLY_LIMIT_h ? 'day' : 'hour';
  const points: TrendPoint[] = [];
  if (bucket === 'hour') {
    const byHour = new Map(rows.map((r) => [r.hourStart.getTime(), r]));
    for (let t = period.fromMs; t < period.toMs; t += HOUR_ms) {
      const r = byHour.get(t);
      const states = zeroCounts();
      if (r) states[r.state] = 1;
      const isSteady = r?.state === 'steady';
      points.push({
        t,
        states,
        state: r?.state ?? null,
        reasons: r ? r.reasons.slice(0, 2).map((x) => x.message) : [],
        efficiency: isSteady ? r.efficiency : null,
        efficiency_U: isSteady ? r.efficiency_U : null,
        destruction_W: isSteady ? r.destruction_W : null,
        destruction_U_W: isSteady ? r.destruction_U_W : null,
        load: r?.load ?? null,
        T0_K: r?.T0_K ?? null,
        expected: isSteady ? (expectedAt.get(t) ?? null) : null,
      });
    }
  } else {
    // Local days: group by the site's calendar date.
    const groups = new Map<string, typeof rows>();
    for (const r of rows) {
      const key = localStamp(r.hourStart.getTime(), site.timeZone, 'yyyy-MM-dd');
      const g = groups.get(key) ?? [];
      g.push(r);
      groups.set(key, g);
    }
    let cursor = resolvePeriod({ range: 'day', anchor: period.firstDay }, site.timeZone);
    while (cursor.fromMs < period.toMs) {
      const g = groups.get(cursor.firstDay) ?? [];
      const states = zeroCounts();
      for (const r of g) states[r.state] += 1;
      const s = g.filter((r) => r.state === 'steady');
      const pick = (f: (r: (typeof rows)[number]) => number | null) => mean(s.map(f).filter((v): v is number => v !== null));
      const ex = s.map((r) => expectedAt.get(r.hourStart.getTime())).filter((e): e is ExpectedHour => !!e);
      points.push({
        t: cursor.fromMs,
        states,
        efficiency: pick((r) => r.efficiency),
        efficiency_U: pick((r) => r.efficiency_U),
        destruction_W: pick((r) => r.destruction_W),
        destruction_U_W: pick((r) => r.destruction_U_W),
        load: pick((r) => r.load),
        T0_K: pick((r) => r.T0_K),
        expected: ex.length ? meanExpected(ex) : null,
      });
      cursor = resolvePeriod({ range: 'day', anchor: cursor.nextAnchor }, site.timeZone);
    }
  }

  // Per local day, hourly runs would be slivers: shade a day by its most frequent state when most of
  // its hours with data are not steady.
  const shading: ContextSpan[] = bucket === 'hour' ? context : [];
  if (bucket === 'day') {
    points.forEach((p, i) => {
      const end = points[i + 1]?.t ?? period.toMs;
      const other = (['unsettled', 'idle', 'suspect'] as const).map((s) => [s, p.states[s]] as const).sort((a, b) => b[1] - a[1]);
      const notSteady = other.reduce((a, [, n]) => a + n, 0);
      if (notSteady === 0 || notSteady <= p.states.steady) return;
      const state = other[0]![0];
      const last = shading[shading.length - 1];
      const hours = p.states.steady + notSteady;
      if (last && last.state === state && last.toMs === p.t) {
        last.toMs = end;
        last.hours += hours;
      } else shading.push({ state, fromMs: p.t, toMs: end, hours });
    });
  }

  const effs = steady.map((r) => r.efficiency).filter((v): v is number => v !== null);
  const effU = steady.map((r) => r.efficiency_U).filter((v): v is number => v !== null);
  const ds = steady.map((r) => r.destruction_W).filter((v): v is number => v !== null);
  const dU = steady.map((r) => r.destruction_U_W).filter((v): v is number => v !== null);
  const exAll = [...expectedAt.values()];

  const scatter = steady
    .filter((r) => r.load !== null && (r.efficiency !== null || r.destruction_W !== null))
    .map((r) => ({ t: r.hourStart.getTime(), load: r.load!, efficiency: r.efficiency, efficiency_U: r.efficiency_U, destruction_W: r.destruction_W }));

  let curve: TrendAnswer['curve'] = [];
  if (baseline && scatter.length >= 2) {
    const loads = scatter.map((s) => s.load);
    const lo = Math.min(...loads);
    const hi = Math.max(...loads);
    const T0 = mean(steady.map((r) => r.T0_K).filter((v): v is number => v !== null)) ?? site.T0_K;
    const N = 24;
    const synth = Array.from({ length: N + 1 }, (_, i) => ({ hourStart: new Date(period.fromMs), load: lo + ((hi - lo) * i) / N, T0_K: T0 }));
    const band = await expectedBand(unitId, synth);
    curve = synth.map((s, i) => ({
      load: s.load,
      efficiency: band.expected[i]?.efficiency ?? null,
      lo: band.expected[i]?.efficiencyLo ?? null,
      hi: band.expected[i]?.efficiencyHi ?? null,
      destruction_W: band.expected[i]?.destruction_W ?? null,
      dLo_W: band.expected[i]?.destructionLo_W ?? null,
      dHi_W: band.expected[i]?.destructionHi_W ?? null,
    }));
  }

  return {
    unit: { id: unit.id, name: unit.name, kind: unit.kind, kindLabel: kindLabel(unit.kind) },
    site: { id: site.id, name: site.name, timeZone: site.timeZone, currency: site.currency },
    period,
    bucket,
    points,
    context: shading,
    stateHours,
    missingHours: Math.max(0, period.hours - rows.length),
    summary: {
      steadyHours: steady.length,
      efficiencyMean: mean(effs),
      efficiencyMean_U: mean(effU),
      destructionMean_W: mean(ds),
      destructionMean_U_W: mean(dU),
      expectedEfficiencyMean: mean(exAll.map((e) => e.efficiency).filter((v): v is number => v !== null)),
      expectedDestructionMean_W: mean(exAll.map((e) => e.destruction_W).filter((v): v is number => v !== null)),
    },
    loadUnit: rows.find((r) => r.loadUnit)?.loadUnit ?? null,
    scatter,
    curve,
    baseline,
    notices: await siteNotices({ unitIds: [unitId], fromMs: period.fromMs, toMs: period.toMs }),
  };
}

function meanExpected(xs: ExpectedHour[]): ExpectedHour {
  const m = (f: (e: ExpectedHour) => number | null) => mean(xs.map(f).filter((v): v is number => v !== null));
  return {
    efficiency: m((e) => e.efficiency),
    efficiencyLo: m((e) => e.efficiencyLo),
    efficiencyHi: m((e) => e.efficiencyHi),
    destruction_W: m((e) => e.destruction_W),
    destructionLo_W: m((e) => e.destructionLo_W),
    destructionHi_W: m((e) => e.destructionHi_W),
  };
}

// ---- ledger ------------------------------------------------------------------------------------

export interface LedgerRow {
  rank: number;
  unitId: string;
  name: string;
  kind: string;
  kindLabel: string;
  hours: StateCounts;
  /** Sums over steady hours [MWh], with expanded (k = 2) uncertainty of the destruction. */
  destruction_MWh: number;
  destruction_U_MWh: number;
  fuel_MWh: number;
  product_MWh: number;
  loss_MWh: number;
  /** Sum of destructionCost_per_h over steady hours [site currency]; null when no steady hour has a cost. */
  cost: number | null;
  cost_U: number | null;
  /** Steady hours without a cost (no price for the unit's fuel). */
  hoursWithoutCost: number;
  /** Share of the site total [-]: of cost when the site has costs, else of destruction. */
  share: number | null;
  /** Mean efficiency over steady hours [-] and the mean of their U; null for dissipative units. */
  efficiencyMean: number | null;
  efficiencyMean_U: number | null;
}

export interface LedgerAnswer {
  site: { id: string; name: string; timeZone: string; currency: string };
  period: Period;
  rows: LedgerRow[];
  shareBasis: 'cost' | 'destruction';
  totals: {
    hours: StateCounts;
    destruction_MWh: number;
    destruction_U_MWh: number;
    fuel_MWh: number;
    product_MWh: number;
    loss_MWh: number;
    cost: number | null;
    cost_U: number | null;
  };
}

interface Aggregate {
  unit_id: string;
  name: string;
  kind: string;
  steady: number;
  unsettled: number;
  idle: number;
  suspect: number;
  d_w: number | null;
  du_w: number | null;
  f_w: number | null;
  p_w: number | null;
  l_w: number | null;
  cost: number | null;
  cost_hours: number;
  eff: number | null;
  eff_u: number | null;
}

/** Per unit of a site: hours by state and sums over steady hours in [fromMs, toMs). */
export async function unitAggregates(siteId: string, fromMs: number, toMs: number): Promise<Aggregate[]> {
  const from = new Date(fromMs).toISOString();
  const to = new Date(toMs).toISOString();
  const steady = sql`h.state = 'steady'`;
  const res = await db().execute<Record<string, unknown>>(sql`
    select u.id as unit_id, u.name, u.kind,
      count(h.hour_start) filter (where ${steady}) as steady,
      count(h.hour_start) filter (where h.state = 'unsettled') as unsettled,
      count(h.hour_start) filter (where h.state = 'idle') as idle,
      count(h.hour_start) filter (where h.state = 'suspect') as suspect,
      sum(h.destruction_w) filter (where ${steady}) as d_w,
      sum(h.destruction_u_w) filter (where ${steady}) as du_w,
      sum(h.fuel_w) filter (where ${steady}) as f_w,
      sum(h.product_w) filter (where ${steady}) as p_w,
      sum(h.loss_w) filter (where ${steady}) as l_w,
      sum(h.destruction_cost_per_h) filter (where ${steady}) as cost,
      count(h.destruction_cost_per_h) filter (where ${steady}) as cost_hours,
      avg(h.efficiency) filter (where ${steady}) as eff,
      avg(h.efficiency_u) filter (where ${steady} and h.efficiency is not null) as eff_u
    from plant_units u
    left join unit_hours h on h.unit_id = u.id and h.hour_start >= ${from}::timestamptz and h.hour_start < ${to}::timestamptz
    where u.site_id = ${siteId}
    group by u.id, u.name, u.kind
    order by u.name`);
  return res.rows.map((r) => ({
    unit_id: String(r.unit_id),
    name: String(r.name),
    kind: String(r.kind),
    steady: Number(r.steady),
    unsettled: Number(r.unsettled),
    idle: Number(r.idle),
    suspect: Number(r.suspect),
    d_w: num(r.d_w),
    du_w: num(r.du_w),
    f_w: num(r.f_w),
    p_w: num(r.p_w),
    l_w: num(r.l_w),
    cost: num(r.cost),
    cost_hours: Number(r.cost_hours),
    eff: num(r.eff),
    eff_u: num(r.eff_u),
  }));
}

/** Rows of the ledger from aggregates: ranked by cost (then destruction), with shares and totals. */
export function ledgerFrom(aggs: Aggregate[]): Pick<LedgerAnswer, 'rows' | 'totals' | 'shareBasis'> {
  const rows: LedgerRow[] = aggs.map((a) => {
    const D = (a.d_w ?? 0) / WH_PER_MWH;
    const DU = (a.du_w ?? 0) / WH_PER_MWH;
    const cost = a.cost_hours > 0 ? a.cost : null;
    return {
      rank: 0,
      unitId: a.unit_id,
      name: a.name,
      kind: a.kind,
      kindLabel: kindLabel(a.kind),
      hours: { steady: a.steady, unsettled: a.unsettled, idle: a.idle, suspect: a.suspect },
      destruction_MWh: D,
      destruction_U_MWh: DU,
      fuel_MWh: (a.f_w ?? 0) / WH_PER_MWH,
      product_MWh: (a.p_w ?? 0) / WH_PER_MWH,
      loss_MWh: (a.l_w ?? 0) / WH_PER_MWH,
      cost,
      // Cost is proportional to destruction at a fixed price, so it carries the same relative U.
      cost_U: cost !== null && D > 0 ? (cost * DU) / D : null,
      hoursWithoutCost: a.steady - a.cost_hours,
      share: null,
      efficiencyMean: a.eff,
      efficiencyMean_U: a.eff === null ? null : a.eff_u,
    };
  });
  rows.sort((x, y) => (y.cost ?? -Infinity) - (x.cost ?? -Infinity) || y.destruction_MWh - x.destruction_MWh || x.name.localeCompare(y.name));
  const hours = zeroCounts();
  for (const r of rows) for (const s of HOUR_STATES) hours[s] += r.hours[s];
  const sum = (f: (r: LedgerRow) => number) => rows.reduce((a, r) => a + f(r), 0);
  const costs = rows.filter((r) => r.cost !== null);
  const totalCost = costs.length ? sum((r) => r.cost ?? 0) : null;
  const totals = {
    hours,
    destruction_MWh: sum((r) => r.destruction_MWh),
    destruction_U_MWh: sum((r) => r.destruction_U_MWh),
    fuel_MWh: sum((r) => r.fuel_MWh),
    product_MWh: sum((r) => r.product_MWh),
    loss_MWh: sum((r) => r.loss_MWh),
    cost: totalCost,
    cost_U: costs.length ? sum((r) => r.cost_U ?? 0) : null,
  };
  const shareBasis: 'cost' | 'destruction' = totalCost !== null && totalCost > 0 ? 'cost' : 'destruction';
  rows.forEach((r, i) => {
    r.rank = i + 1;
    if (shareBasis === 'cost') r.share = r.cost !== null ? r.cost / totalCost! : null;
    else r.share = totals.destruction_MWh > 0 ? r.destruction_MWh / totals.destruction_MWh : null;
  });
  return { rows, totals, shareBasis };
}

/** The loss ledger of a site over a period. */
export async function siteLedger(siteId: string, q: PeriodQuery, nowMs?: number): Promise<LedgerAnswer> {
  const site = await siteOf(siteId);
  const period = periodOrError(q, site.timeZone, nowMs ?? (await defaultNowMs(q, site.id)));
  const aggs = await unitAggregates(site.id, period.fromMs, period.toMs);
  return { site: { id: site.id, name: site.name, timeZone: site.timeZone, currency: site.currency }, period, ...ledgerFrom(aggs) };
}

// ---- flow --------------------------------------------------------------------------------------

/** Where a unit's fuel exergy comes from, by kind (docs/domain.md section 3). */
export type FlowSource = 'fuel' | 'power' | 'streams';
export const FLOW_SOURCE_LABELS: Record<FlowSource, string> = {
  fuel: 'Fuel burned',
  power: 'Power in',
  streams: 'Steam and process streams',
};
export function flowSourceOf(kind: string): FlowSource {
  if (kind === 'boiler') return 'fuel';
  if (kind === 'compressor' || kind === 'pump' || kind === 'fan' || kind === 'motor-generator') return 'power';
  return 'streams';
}

export interface FlowAnswer {
  site: { id: string; name: string; timeZone: string; currency: string };
  period: Period;
  /** Exergy in [MWh] by source, over steady hours. */
  sources: { key: FlowSource; label: string; MWh: number }[];
  /** Each unit with fuel exergy: where it came from and where it went [MWh]. */
  units: { unitId: string; name: string; kindLabel: string; source: FlowSource; fuel_MWh: number; product_MWh: number; loss_MWh: number; destruction_MWh: number; destruction_U_MWh: number }[];
  totals: { fuel_MWh: number; product_MWh: number; loss_MWh: number; destruction_MWh: number };
  steadyHours: number;
}

/**
 * The site's exergy flow over a period: fuels, power and streams into each unit, and out as product,
 * loss and destruction. A unit's product may be the next unit's fuel (a boiler's steam drives a
 * turbine), so each unit is shown with its own balance and the sources are not a site boundary.
 */
export async function siteFlow(siteId: string, q: PeriodQuery, nowMs?: number): Promise<FlowAnswer> {
  const site = await siteOf(siteId);
  const period = periodOrError(q, site.timeZone, nowMs ?? (await defaultNowMs(q, site.id)));
  const aggs = await unitAggregates(site.id, period.fromMs, period.toMs);
  const units = aggs
    .filter((a) => (a.f_w ?? 0) > 0)
    .map((a) => {
      const fuel = (a.f_w ?? 0) / WH_PER_MWH;
      const product = Math.max(0, (a.p_w ?? 0) / WH_PER_MWH);
      const loss = Math.max(0, (a.l_w ?? 0) / WH_PER_MWH);
      const destruction = Math.max(0, (a.d_w ?? 0) / WH_PER_MWH);
      return {
        unitId: a.unit_id,
        name: a.name,
        kindLabel: kindLabel(a.kind),
        source: flowSourceOf(a.kind),
        fuel_MWh: fuel,
        product_MWh: product,
        loss_MWh: loss,
        destruction_MWh: destruction,
        destruction_U_MWh: (a.du_w ?? 0) / WH_PER_MWH,
      };
    })
    .sort((x, y) => y.fuel_MWh - x.fuel_MWh);
  const sources = (Object.keys(FLOW_SOURCE_LABELS) as FlowSource[])
    .map((key) => ({ key, label: FLOW_SOURCE_LABELS[key], MWh: units.filter((u) => u.source === key).reduce((a, u) => a + u.fuel_MWh, 0) }))
    .filter((s) => s.MWh > 0);
  const sum = (f: (u: (typeof units)[number]) => number) => units.reduce((a, u) => a + f(u), 0);
  return {
    site: { id: site.id, name: site.name, timeZone: site.timeZone, currency: site.currency },
    period,
    sources,
    units,
    totals: { fuel_MWh: sum((u) => u.fuel_MWh), product_MWh: sum((u) => u.product_MWh), loss_MWh: sum((u) => u.loss_MWh), destruction_MWh: sum((u) => u.destruction_MWh) },
    steadyHours: aggs.reduce((a, x) => a + x.steady, 0),
  };
}

// ---- overview ----------------------------------------------------------------------------------

export interface OverviewSite {
  id: string;
  name: string;
  timeZone: string;
  currency: string;
  units: {
    id: string;
    name: string;
    kindLabel: string;
    hours: StateCounts;
    efficiencyMean: number | null;
    efficiencyMean_U: number | null;
    /** Mean destruction over steady hours [W] and the mean of its U. */
    destructionMean_W: number | null;
    destructionMean_U_W: number | null;
    cost: number | null;
  }[];
  /** The 24-hour window shown, in the site's clock. */
  windowFrom: string;
  windowTo: string;
  /** Start of the latest unit hour, site clock; null when the site has none. */
  lastHour: string | null;
  /** Drift notices not closed (open or acknowledged). */
  openNotices: number;
}

/**
 * Every site with its units over the 24 hours up to its latest unit hour (steady hours only), for the
 * overview page: with historian files uploaded in batches, "the last 24 hours" means the last day
 * with data, and the page says which.
 */
export async function overview(nowMs = Date.now()): Promise<OverviewSite[]> {
  const all = await db().select().from(sites).orderBy(asc(sites.name));
  const out: OverviewSite[] = [];
  for (const site of all) {
    const last = await db().execute<{ last: string | null }>(
      sql`select max(h.hour_start)::text as last from unit_hours h join plant_units u on u.id = h.unit_id where u.site_id = ${site.id} and h.hour_start <= ${new Date(nowMs).toISOString()}::timestamptz`,
    );
    const lastRaw = last.rows[0]?.last;
    const endMs = lastRaw ? Date.parse(lastRaw) + HOUR_ms : nowMs;
    const aggs = await unitAggregates(site.id, endMs - 24 * HOUR_ms, endMs);
    out.push({
      id: site.id,
      name: site.name,
      timeZone: site.timeZone,
      currency: site.currency,
      units: aggs.map((a) => ({
        id: a.unit_id,
        name: a.name,
        kindLabel: kindLabel(a.kind),
        hours: { steady: a.steady, unsettled: a.unsettled, idle: a.idle, suspect: a.suspect },
        efficiencyMean: a.eff,
        efficiencyMean_U: a.eff === null ? null : a.eff_u,
        destructionMean_W: a.steady > 0 && a.d_w !== null ? a.d_w / a.steady : null,
        destructionMean_U_W: a.steady > 0 && a.du_w !== null ? a.du_w / a.steady : null,
        cost: a.cost_hours > 0 ? a.cost : null,
      })),
      windowFrom: localStamp(endMs - 24 * HOUR_ms, site.timeZone),
      windowTo: localStamp(endMs, site.timeZone),
      lastHour: lastRaw ? localStamp(Date.parse(lastRaw), site.timeZone) : null,
      openNotices: await openNoticeCount(site.id),
    });
  }
  return out;
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
