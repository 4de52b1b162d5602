/**
 * The loss ledger (units ranked by the cost of their destruction), the site's exergy flow and the
 * overview's unit rows: the shapes the API answers with and the pure steps from per-unit sums.
 * No I/O: src/server/services/views.ts sums the unit hours in SQL and hands the sums over.
 *
 * Energies are sums of hourly powers over one hour each: sum(W) x 1 h = Wh, answered in MWh.
 * Expanded uncertainties (k = 2) of sums add the hourly U linearly, i.e. they treat the hours' errors
 * as fully correlated (instrument bias dominates an hour's uncertainty, and a bias does not average
 * out); that is the cautious choice and is said beside every figure.
 */
import { unitKindLabel } from '../kinds';
import { HOUR_STATES, zeroStateCounts, type StateCounts } from '../hour-states';
import type { Period, PeriodChoice } from './period';
import type { Freshness } from './freshness';

/** Watt-hours in one MWh: a sum of hourly W [Wh] divided by this is MWh. */
export const WH_PER_MWH = 1e6;

/** A unit kind's label ('Steam turbine'); the kind itself when the catalogue does not know it. */
export const kindLabel = (kind: string): string => unitKindLabel(kind);

/** The site as every view answer names it. */
export interface ViewSite {
  id: string;
  name: string;
  timeZone: string;
  currency: string;
}

/** One unit's hours by state and its sums over steady hours in a period (what the SQL gives). */
export interface UnitSums {
  unitId: string;
  name: string;
  kind: string;
  hours: StateCounts;
  /** Sums over steady hours of the hourly powers [Wh]; null when no steady hour has one. */
  destruction_Wh: number | null;
  destructionU_Wh: number | null;
  fuel_Wh: number | null;
  product_Wh: number | null;
  loss_Wh: number | null;
  /** Sum of destructionCost_per_h over steady hours [site currency]. */
  cost: number | null;
  /** Steady hours that carry a cost. */
  costHours: number;
  /** Mean efficiency over steady hours [-] and the mean of its U. */
  efficiencyMean: number | null;
  efficiencyMean_U: number | null;
}

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

/** The site's totals: the rows' sums (cost null when no row has one). */
export type LedgerTotals = Pick<LedgerRow, 'hours' | 'destruction_MWh' | 'destruction_U_MWh' | 'fuel_MWh' | 'product_MWh' | 'loss_MWh' | 'cost' | 'cost_U'>;

/** GET /api/sites/:siteId/ledger. */
export interface LedgerAnswer {
  site: ViewSite;
  period: Period;
  /** Why the view opened on this period (the asked one, or the latest full one with data). */
  opened: PeriodChoice;
  /** How fresh the site's figures are. */
  freshness: Freshness;
  rows: LedgerRow[];
  shareBasis: 'cost' | 'destruction';
  totals: LedgerTotals;
}

const MWh = (Wh: number | null) => (Wh ?? 0) / WH_PER_MWH;

function ledgerRow(a: UnitSums): LedgerRow {
  const D = MWh(a.destruction_Wh);
  const DU = MWh(a.destructionU_Wh);
  const cost = a.costHours > 0 ? a.cost : null;
  return {
    rank: 0,
    unitId: a.unitId,
    name: a.name,
    kind: a.kind,
    kindLabel: kindLabel(a.kind),
    hours: { ...a.hours },
    destruction_MWh: D,
    destruction_U_MWh: DU,
    fuel_MWh: MWh(a.fuel_Wh),
    product_MWh: MWh(a.product_Wh),
    loss_MWh: MWh(a.loss_Wh),
    cost,
    // Cost is proportional to destruction at a fixed price, so it carries the same relative U.
    cost_U: cost !== null && D > 0 ? (cost * DU) / D : null,
    hoursWithoutCost: a.hours.steady - a.costHours,
    share: null,
    efficiencyMean: a.efficiencyMean,
    efficiencyMean_U: a.efficiencyMean === null ? null : a.efficiencyMean_U,
  };
}

/** Rows of the ledger from per-unit sums: ranked by cost (then destruction, then name), with shares and totals. */
export function ledgerFrom(sums: readonly UnitSums[]): Pick<LedgerAnswer, 'rows' | 'totals' | 'shareBasis'> {
  const rows = sums.map(ledgerRow);
  rows.sort((x, y) => (y.cost ?? -Infinity) - (x.cost ?? -Infinity) || y.destruction_MWh - x.destruction_MWh || x.name.localeCompare(y.name));
  const hours = zeroStateCounts();
  for (const r of rows) for (const s of HOUR_STATES) hours[s] += r.hours[s];
  const sum = (f: (r: LedgerRow) => number) => rows.reduce((a, r) => a + f(r), 0);
  const costs = rows.filter((r) => r.cost !== null);
  const totalCost = costs.length ? sum((r) => r.cost ?? 0) : null;
  const totals: LedgerTotals = {
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

/** One unit with fuel exergy: where it came from and where it went [MWh]. */
export interface FlowUnit {
  unitId: string;
  name: string;
  kindLabel: string;
  source: FlowSource;
  fuel_MWh: number;
  product_MWh: number;
  loss_MWh: number;
  destruction_MWh: number;
  destruction_U_MWh: number;
}

/** GET /api/sites/:siteId/flow. */
export interface FlowAnswer {
  site: ViewSite;
  period: Period;
  /** Why the view opened on this period (the asked one, or the latest full one with data). */
  opened: PeriodChoice;
  /** How fresh the site's figures are. */
  freshness: Freshness;
  /** Exergy in [MWh] by source, over steady hours. */
  sources: { key: FlowSource; label: string; MWh: number }[];
  units: FlowUnit[];
  totals: { fuel_MWh: number; product_MWh: number; loss_MWh: number; destruction_MWh: number };
  steadyHours: number;
}

/**
 * The site's exergy flow from per-unit sums: fuels, power and streams into each unit, and out as
 * product, loss and destruction. A unit's product may be the next unit's fuel (a boiler's steam drives
 * a turbine), so each unit is shown with its own balance and the sources are not a site boundary.
 */
export function flowFrom(sums: readonly UnitSums[]): Pick<FlowAnswer, 'sources' | 'units' | 'totals' | 'steadyHours'> {
  const units: FlowUnit[] = sums
    .filter((a) => (a.fuel_Wh ?? 0) > 0)
    .map((a) => ({
      unitId: a.unitId,
      name: a.name,
      kindLabel: kindLabel(a.kind),
      source: flowSourceOf(a.kind),
      fuel_MWh: MWh(a.fuel_Wh),
      product_MWh: Math.max(0, MWh(a.product_Wh)),
      loss_MWh: Math.max(0, MWh(a.loss_Wh)),
      destruction_MWh: Math.max(0, MWh(a.destruction_Wh)),
      destruction_U_MWh: MWh(a.destructionU_Wh),
    }))
    .sort((x, y) => y.fuel_MWh - x.fuel_MWh);
  const sources = (Object.keys(FLOW_SOURCE_LABELS) as FlowSource[])
    .map((key) => ({ key, label: FLOW_SOURCE_LABELS[key], MWh: units.filter((u) => u.source === key).reduce((a, u) => a + u.fuel_MWh, 0) }))
    .filter((s) => s.MWh > 0);
  const sum = (f: (u: FlowUnit) => number) => units.reduce((a, u) => a + f(u), 0);
  return {
    sources,
    units,
    totals: { fuel_MWh: sum((u) => u.fuel_MWh), product_MWh: sum((u) => u.product_MWh), loss_MWh: sum((u) => u.loss_MWh), destruction_MWh: sum((u) => u.destruction_MWh) },
    steadyHours: sums.reduce((a, x) => a + x.hours.steady, 0),
  };
}

// ---- overview ----------------------------------------------------------------------------------

/** A unit on the overview page: its last 24 hours with data. */
export interface OverviewUnit {
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
}

export interface OverviewSite extends ViewSite {
  units: OverviewUnit[];
  /** The 24-hour window shown, in the site's clock. */
  windowFrom: string;
  windowTo: string;
  /** Start of the latest unit hour, site clock; null when the site has none. */
  lastHour: string | null;
  /** How fresh the site's figures are. */
  freshness: Freshness;
  /** Drift notices not closed (open or acknowledged). */
  openNotices: number;
}

/** A unit's overview row from its sums: means are the energy over the steady hours [Wh / h = W]. */
export function overviewUnit(a: UnitSums): OverviewUnit {
  const n = a.hours.steady;
  return {
    id: a.unitId,
    name: a.name,
    kindLabel: kindLabel(a.kind),
    hours: { ...a.hours },
    efficiencyMean: a.efficiencyMean,
    efficiencyMean_U: a.efficiencyMean === null ? null : a.efficiencyMean_U,
    destructionMean_W: n > 0 && a.destruction_Wh !== null ? a.destruction_Wh / n : null,
    destructionMean_U_W: n > 0 && a.destructionU_Wh !== null ? a.destructionU_Wh / n : null,
    cost: a.costHours > 0 ? a.cost : null,
  };
}
