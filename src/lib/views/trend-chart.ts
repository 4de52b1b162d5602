/**
 * The trend charts' rows: a unit's trend points (src/lib/views/trend.ts) as the numbers the charts
 * draw, efficiency in percent and powers in the site's chosen power unit (`powerFactor` watts to one
 * unit of it). Pure shaping for src/components/insight/views/TrendCharts.tsx.
 */
import type { CurvePoint, ScatterPoint, TrendPoint } from './trend';

export type TrendChartKind = 'efficiency' | 'destruction';

/** One point of the time chart: measured, expected and its k = 2 band, in the chart's unit. */
export interface ChartRow {
  t: number;
  measured: number | null;
  expected: number | null;
  band: [number, number] | null;
  point: TrendPoint;
}

/** The time chart's rows: efficiency x 100 [%], destruction / powerFactor [the site's power unit]. */
export function timeChartRows(points: TrendPoint[], kind: TrendChartKind, powerFactor: number): ChartRow[] {
  return points.map((p) => {
    const e = p.expected;
    if (kind === 'efficiency') {
      return {
        t: p.t,
        measured: p.efficiency === null ? null : p.efficiency * 100,
        expected: e?.efficiency == null ? null : e.efficiency * 100,
        band: e?.efficiencyLo == null || e?.efficiencyHi == null ? null : [e.efficiencyLo * 100, e.efficiencyHi * 100],
        point: p,
      };
    }
    return {
      t: p.t,
      measured: p.destruction_W === null ? null : p.destruction_W / powerFactor,
      expected: e?.destruction_W == null ? null : e.destruction_W / powerFactor,
      band: e?.destructionLo_W == null || e?.destructionHi_W == null ? null : [e.destructionLo_W / powerFactor, e.destructionHi_W / powerFactor],
      point: p,
    };
  });
}

/** A steady hour of the scatter: load on the axis's scale against the chosen quantity. */
export interface ScatterRow {
  x: number;
  y: number | null;
  s: ScatterPoint;
}

/** The baseline's curve at one load, with its band, on the scatter's axes. */
export interface CurveRow {
  x: number;
  y: number | null;
  band: [number, number] | null;
  c: CurvePoint;
}

/**
 * The scatter's dots (steady hours with a value) and the baseline's curve; `loadScale` turns the
 * load into the axis's unit.
 */
export function loadScatterRows(
  scatter: ScatterPoint[],
  curve: CurvePoint[],
  kind: TrendChartKind,
  loadScale: number,
  powerFactor: number,
): { pts: ScatterRow[]; cur: CurveRow[] } {
  const y = (v: number | null) => (v === null ? null : kind === 'efficiency' ? v * 100 : v / powerFactor);
  const pts = scatter.map((s) => ({ x: s.load * loadScale, y: y(kind === 'efficiency' ? s.efficiency : s.destruction_W), s })).filter((p) => p.y !== null);
  const cur = curve.map((c) => ({
    x: c.load * loadScale,
    y: y(kind === 'efficiency' ? c.efficiency : c.destruction_W),
    band: (kind === 'efficiency' ? c.lo !== null && c.hi !== null : c.dLo_W !== null && c.dHi_W !== null) ? ([y(kind === 'efficiency' ? c.lo : c.dLo_W)!, y(kind === 'efficiency' ? c.hi : c.dHi_W)!] as [number, number]) : null,
    c,
  }));
  return { pts, cur };
}
