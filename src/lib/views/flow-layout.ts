/**
 * The geometry of the exergy flow picture (src/components/insight/views/FlowPicture.tsx): where each
 * node of the three columns (sources, units, out) sits and the bands between them, in the picture's
 * own coordinates. Band widths are proportional to MWh. Pure: no words, no colours, no React.
 */
import type { FlowAnswer, FlowUnit } from './ledger';

export const FLOW_W = 1120;
export const FLOW_NODE_W = 14;
export const FLOW_GAP = 10;
/** Each node takes at least this much height, so that its two-line label never meets the next one. */
export const FLOW_MIN_SLOT = 34;
export const FLOW_TOP = 34;
export const FLOW_COL = { source: 210, unit: 520, out: 800 } as const;
export const FLOW_SOURCE_ORDER = ['fuel', 'power', 'streams'] as const;

export interface FlowNode {
  y: number;
  h: number;
}

/** One source's exergy into the units [MWh], with its label. */
export type FlowSourceTotal = FlowAnswer['sources'][number];

/** One band: from a source into a unit ('in'), or from a unit out to product, loss or its destruction. */
export interface FlowBand {
  key: string;
  kind: 'in' | 'product' | 'loss' | 'destruction';
  unit: FlowUnit;
  /** The SVG path of the band. */
  d: string;
}

export interface FlowLayout {
  /** Units in drawing order: by source, then by fuel exergy, largest first. */
  units: FlowUnit[];
  /** The sources present, in FLOW_SOURCE_ORDER. */
  sources: FlowSourceTotal[];
  srcNode: Map<string, FlowNode>;
  unitNode: Map<string, FlowNode>;
  destNode: Map<string, FlowNode>;
  product: FlowNode;
  loss: FlowNode;
  bands: FlowBand[];
  /** Height of the picture. */
  height: number;
}

/** A band of heights h0 (left) and h1 (right) from (x0, y0) to (x1, y1), as an SVG path. */
export function bandPath(x0: number, y0: number, x1: number, y1: number, h0: number, h1: number): string {
  const mx = (x0 + x1) / 2;
  return `M${x0} ${y0} C${mx} ${y0} ${mx} ${y1} ${x1} ${y1} L${x1} ${y1 + h1} C${mx} ${y1 + h1} ${mx} ${y0 + h0} ${x0} ${y0 + h0} Z`;
}

/** The units in drawing order and the sources present; no units means nothing to draw. */
export function flowOrder(flow: FlowAnswer): { units: FlowUnit[]; sources: FlowSourceTotal[] } {
  const units = [...flow.units].sort((a, b) => FLOW_SOURCE_ORDER.indexOf(a.source) - FLOW_SOURCE_ORDER.indexOf(b.source) || b.fuel_MWh - a.fuel_MWh);
  const sources = FLOW_SOURCE_ORDER.map((k) => flow.sources.find((s) => s.key === k)).filter((s): s is FlowSourceTotal => !!s);
  return { units, sources };
}

const unitSize = (u: FlowUnit) => Math.max(u.fuel_MWh, u.product_MWh + u.loss_MWh + u.destruction_MWh);
const slot = (h: number) => Math.max(h, FLOW_MIN_SLOT) + FLOW_GAP;

/** Stacks the nodes of each column from the top with gaps; the scale px turns MWh into height. */
function stackNodes(flow: FlowAnswer, units: FlowUnit[], sources: FlowSourceTotal[], px: (v: number) => number) {
  let y = FLOW_TOP;
  const srcNode = new Map<string, FlowNode>();
  for (const s of sources) {
    const h = px(s.MWh);
    srcNode.set(s.key, { y, h });
    y += slot(h);
  }
  let yMax = y;
  y = FLOW_TOP;
  const unitNode = new Map<string, FlowNode>();
  for (const u of units) {
    const h = px(unitSize(u));
    unitNode.set(u.unitId, { y, h });
    y += slot(h);
  }
  yMax = Math.max(yMax, y);
  y = FLOW_TOP;
  const product: FlowNode = { y, h: px(flow.totals.product_MWh) };
  if (product.h > 0) y += slot(product.h);
  const loss: FlowNode = { y, h: px(flow.totals.loss_MWh) };
  if (loss.h > 0) y += slot(loss.h);
  const destNode = new Map<string, FlowNode>();
  for (const u of units) {
    const h = px(u.destruction_MWh);
    destNode.set(u.unitId, { y, h });
    if (h > 0) y += slot(h);
  }
  return { srcNode, unitNode, destNode, product, loss, bottom: Math.max(y, yMax) };
}

/** The bands, in drawing order: per unit its inflow, then product, loss and destruction. */
function flowBands(units: FlowUnit[], nodes: ReturnType<typeof stackNodes>, px: (v: number) => number): FlowBand[] {
  const { srcNode, unitNode, destNode, product, loss } = nodes;
  const bands: FlowBand[] = [];
  const srcOffset = new Map<string, number>();
  let prodOffset = 0;
  let lossOffset = 0;
  const fromUnit = FLOW_COL.unit + FLOW_NODE_W;
  for (const u of units) {
    const un = unitNode.get(u.unitId)!;
    const sn = srcNode.get(u.source)!;
    const so = srcOffset.get(u.source) ?? 0;
    const fh = px(u.fuel_MWh);
    bands.push({ key: `in-${u.unitId}`, kind: 'in', unit: u, d: bandPath(FLOW_COL.source + FLOW_NODE_W, sn.y + so, FLOW_COL.unit, un.y, fh, fh) });
    srcOffset.set(u.source, so + fh);
    let uo = 0;
    const ph = px(u.product_MWh);
    if (ph > 0) {
      bands.push({ key: `p-${u.unitId}`, kind: 'product', unit: u, d: bandPath(fromUnit, un.y + uo, FLOW_COL.out, product.y + prodOffset, ph, ph) });
      prodOffset += ph;
      uo += ph;
    }
    const lh = px(u.loss_MWh);
    if (lh > 0) {
      bands.push({ key: `l-${u.unitId}`, kind: 'loss', unit: u, d: bandPath(fromUnit, un.y + uo, FLOW_COL.out, loss.y + lossOffset, lh, lh) });
      lossOffset += lh;
      uo += lh;
    }
    const dh = px(u.destruction_MWh);
    if (dh > 0) {
      const dn = destNode.get(u.unitId)!;
      bands.push({ key: `d-${u.unitId}`, kind: 'destruction', unit: u, d: bandPath(fromUnit, un.y + uo, FLOW_COL.out, dn.y, dh, dh) });
    }
  }
  return bands;
}

/** The whole picture's geometry; null when no unit has steady hours with fuel exergy. */
export function flowLayout(flow: FlowAnswer): FlowLayout | null {
  const { units, sources } = flowOrder(flow);
  if (!units.length) return null;
  const outCount = 2 + units.length;
  const H = Math.max(340, (FLOW_MIN_SLOT + FLOW_GAP) * outCount + FLOW_TOP + 20);
  const usable = H - FLOW_TOP - 20 - FLOW_GAP * Math.max(sources.length - 1, units.length - 1, outCount - 1);
  const total = units.reduce((a, u) => a + unitSize(u), 0);
  const k = usable / total;
  const px = (v: number) => Math.max(v * k, v > 0 ? 1 : 0);
  const nodes = stackNodes(flow, units, sources, px);
  const bands = flowBands(units, nodes, px);
  const { srcNode, unitNode, destNode, product, loss, bottom } = nodes;
  return { units, sources, srcNode, unitNode, destNode, product, loss, bands, height: Math.max(H, bottom + 10) };
}
