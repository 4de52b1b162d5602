/**
 * The parts of the exergy flow picture (FlowPicture.tsx): the bands, the nodes of each column with
 * their two-line labels, and the legend under the picture. Geometry from src/lib/views/flow-layout.ts.
 */
import { COLORS } from './common';
import { mwh, mwhDecimals } from './format';
import { withU } from '~/lib/format';
import { FLOW_COL as COL, FLOW_NODE_W as NODE_W, type FlowBand, type FlowLayout, type FlowNode } from '~/lib/views/flow-layout';
import type { FlowAnswer } from '~/lib/views/ledger';

export const SOURCE_FILL: Record<string, string> = { fuel: '#8a8172', power: '#66707c', streams: '#9aa3ad' };
const clip = (s: string, n = 42) => (s.length > n ? `${s.slice(0, n - 1)}…` : s);
const mid = (n: FlowNode) => n.y + Math.max(n.h, 1) / 2 - 3;

/** A legend entry: the fill of a band and its words. */
function Swatch({ fill, stroke, words }: { fill: string; stroke?: string; words: string }) {
  return (
    <span className="inline-flex items-center gap-1.5">
      <svg width="22" height="10" aria-hidden="true">
        <rect width="22" height="10" fill={fill} {...(stroke ? { stroke, strokeWidth: '0.6' } : {})} />
      </svg>
      {words}
    </span>
  );
}

/** A node's two-line label: its name (clipped) and its figure. */
function NodeLabel({ x, yy, text, sub, anchor, color = COLORS.ink }: { x: number; yy: number; text: string; sub: string; anchor: 'start' | 'end'; color?: string }) {
  return (
    <text x={x} y={yy} textAnchor={anchor} fontSize={12} fill={color} stroke="#f7f3ea" strokeWidth={3} strokeLinejoin="round" paintOrder="stroke">
      <tspan fontWeight={600}>{clip(text)}</tspan>
      <tspan x={x} dy={14} fontSize={11} fill={COLORS.soft}>
        {sub}
      </tspan>
    </text>
  );
}

/** The fill and the hover words of a band. */
function bandLook(b: FlowBand, d: number): { fill: string; title: string; pattern?: boolean } {
  const u = b.unit;
  switch (b.kind) {
    case 'in':
      return { fill: SOURCE_FILL[u.source]!, title: `${u.name}: ${mwh(u.fuel_MWh, d)} MWh in` };
    case 'product':
      return { fill: COLORS.teal, title: `${u.name} → product: ${mwh(u.product_MWh, d)} MWh` };
    case 'loss':
      return { fill: 'url(#flow-loss)', pattern: true, title: `${u.name} → loss: ${mwh(u.loss_MWh, d)} MWh` };
    case 'destruction':
      return { fill: COLORS.copper, title: `${u.name} → destruction: ${mwh(u.destruction_MWh, d)} MWh` };
  }
}

/** The bands, each with its MWh as hover words. */
export function FlowBands({ bands, d }: { bands: FlowBand[]; d: number }) {
  return (
    <>
      {bands.map((b) => {
        const p = bandLook(b, d);
        return (
          <path key={b.key} d={b.d} fill={p.fill} fillOpacity={p.pattern ? 0.95 : 0.55} stroke="none">
            <title>{p.title}</title>
          </path>
        );
      })}
    </>
  );
}

/** The IN and UNITS columns: a node per source and per unit. */
export function InAndUnitNodes({ layout, d }: { layout: FlowLayout; d: number }) {
  return (
    <>
      {layout.sources.map((s) => {
        const n = layout.srcNode.get(s.key)!;
        return (
          <g key={s.key}>
            <rect x={COL.source} y={n.y} width={NODE_W} height={Math.max(n.h, 1)} fill={SOURCE_FILL[s.key]} />
            <NodeLabel x={COL.source - 8} yy={mid(n)} text={s.label} sub={`${mwh(s.MWh, d)} MWh`} anchor="end" />
          </g>
        );
      })}
      {layout.units.map((u) => {
        const n = layout.unitNode.get(u.unitId)!;
        return (
          <g key={u.unitId} data-flow-unit={u.name}>
            <rect x={COL.unit} y={n.y} width={NODE_W} height={Math.max(n.h, 1)} fill={COLORS.ink} />
            <NodeLabel x={COL.unit + NODE_W + 6} yy={mid(n)} text={u.name} sub={`${mwh(u.fuel_MWh, d)} MWh in`} anchor="start" />
          </g>
        );
      })}
    </>
  );
}

/** The OUT column: product, loss and each unit's destruction. */
export function OutNodes({ layout, totals, d }: { layout: FlowLayout; totals: FlowAnswer['totals']; d: number }) {
  const { product, loss } = layout;
  return (
    <>
      {product.h > 0 && (
        <g>
          <rect x={COL.out} y={product.y} width={NODE_W} height={product.h} fill={COLORS.teal} />
          <NodeLabel x={COL.out + NODE_W + 6} yy={mid(product)} text="Product" sub={`${mwh(totals.product_MWh, d)} MWh`} anchor="start" color={COLORS.tealDeep} />
        </g>
      )}
      {loss.h > 0 && (
        <g>
          <rect x={COL.out} y={loss.y} width={NODE_W} height={loss.h} fill="url(#flow-loss)" stroke={COLORS.copper} strokeWidth={0.6} />
          <NodeLabel x={COL.out + NODE_W + 6} yy={mid(loss)} text="Loss" sub={`${mwh(totals.loss_MWh, d)} MWh`} anchor="start" color={COLORS.copperDeep} />
        </g>
      )}
      {layout.units
        .filter((u) => u.destruction_MWh > 0)
        .map((u) => {
          const n = layout.destNode.get(u.unitId)!;
          return (
            <g key={`dn-${u.unitId}`}>
              <rect x={COL.out} y={n.y} width={NODE_W} height={Math.max(n.h, 1)} fill={COLORS.copper} />
              <NodeLabel
                x={COL.out + NODE_W + 6}
                yy={mid(n)}
                text={`Destroyed in ${u.name}`}
                sub={withU(u.destruction_MWh, u.destruction_U_MWh, { unit: 'MWh', decimals: mwhDecimals(u.destruction_MWh) })}
                anchor="start"
                color={COLORS.copperDeep}
              />
            </g>
          );
        })}
    </>
  );
}

/** The legend and the note under the picture. */
export function FlowLegend({ steadyHours }: { steadyHours: number }) {
  return (
    <figcaption className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-soft">
      <Swatch fill={COLORS.teal} words="product" />
      <Swatch fill="url(#flow-loss)" stroke={COLORS.copper} words="loss (hatched)" />
      <Swatch fill={COLORS.copper} words="destruction" />
      <span>
        Steady hours only ({steadyHours} unit hours), MWh over the period. A unit's product may be the next unit's fuel (a boiler's steam
        drives a turbine), so each unit shows its own balance and the IN column is not a site boundary.
      </span>
    </figcaption>
  );
}
