/**
 * The site's exergy over a period as bands, left to right: where the exergy came from (fuel burned,
 * power, steam and process streams), through each unit, out as product (teal), loss (light copper,
 * hatched) and each unit's destruction (copper). Band widths are proportional to MWh. Lossline's own
 * drawing in plain SVG.
 */
import { COLORS } from './common';
import { mwh, mwhDecimals } from './format';
import { withU } from '~/lib/format';
import type { FlowAnswer } from '~/lib/views/ledger';

export type { FlowAnswer };


const W = 1120;
const NODE_W = 14;
const GAP = 10;
/** Each node takes at least this much height, so that its two-line label never meets the next one. */
const MIN_SLOT = 34;
const TOP = 34;
const COL = { source: 210, unit: 520, out: 800 };
const clip = (s: string, n = 42) => (s.length > n ? `${s.slice(0, n - 1)}…` : s);
const SOURCE_ORDER = ['fuel', 'power', 'streams'] as const;
const SOURCE_FILL: Record<string, string> = { fuel: '#8a8172', power: '#66707c', streams: '#9aa3ad' };

interface Node {
  y: number;
  h: number;
}

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

function band(x0: number, y0: number, x1: number, y1: number, h0: number, h1: number): string {
  const mx = (x0 + x1) / 2;
  return `M${x0} ${y0} C${mx} ${y0} ${mx} ${y1} ${x1} ${y1} L${x1} ${y1 + h1} C${mx} ${y1 + h1} ${mx} ${y0 + h0} ${x0} ${y0 + h0} Z`;
}

export function FlowPicture({ flow }: { flow: FlowAnswer }) {
  const units = [...flow.units].sort((a, b) => SOURCE_ORDER.indexOf(a.source) - SOURCE_ORDER.indexOf(b.source) || b.fuel_MWh - a.fuel_MWh);
  const sources = SOURCE_ORDER.map((k) => flow.sources.find((s) => s.key === k)).filter((s): s is FlowAnswer['sources'][number] => !!s);
  if (!units.length) return <p className="py-4 text-sm text-ink-faint">No steady hours with fuel exergy in this period.</p>;

  const d = mwhDecimals(Math.max(...units.map((u) => u.fuel_MWh)));
  const outCount = 2 + units.length;
  const H = Math.max(340, (MIN_SLOT + GAP) * outCount + TOP + 20);
  const usable = H - TOP - 20 - GAP * Math.max(sources.length - 1, units.length - 1, outCount - 1);
  const unitSize = (u: (typeof units)[number]) => Math.max(u.fuel_MWh, u.product_MWh + u.loss_MWh + u.destruction_MWh);
  const total = units.reduce((a, u) => a + unitSize(u), 0);
  const k = usable / total;
  const px = (v: number) => Math.max(v * k, v > 0 ? 1 : 0);

  // Columns, stacked from the top with gaps.
  const slot = (h: number) => Math.max(h, MIN_SLOT) + GAP;
  let y = TOP;
  const srcNode = new Map<string, Node>();
  for (const s of sources) {
    const h = px(s.MWh);
    srcNode.set(s.key, { y, h });
    y += slot(h);
  }
  let yMax = y;
  y = TOP;
  const unitNode = new Map<string, Node>();
  for (const u of units) {
    const h = px(unitSize(u));
    unitNode.set(u.unitId, { y, h });
    y += slot(h);
  }
  yMax = Math.max(yMax, y);
  y = TOP;
  const product: Node = { y, h: px(flow.totals.product_MWh) };
  if (product.h > 0) y += slot(product.h);
  const loss: Node = { y, h: px(flow.totals.loss_MWh) };
  if (loss.h > 0) y += slot(loss.h);
  const destNode = new Map<string, Node>();
  for (const u of units) {
    const h = px(u.destruction_MWh);
    destNode.set(u.unitId, { y, h });
    if (h > 0) y += slot(h);
  }
  y = Math.max(y, yMax);
  const height = Math.max(H, y + 10);

  const paths: { d: string; fill: string; title: string; pattern?: boolean; key: string }[] = [];
  const srcOffset = new Map<string, number>();
  let prodOffset = 0;
  let lossOffset = 0;
  for (const u of units) {
    const un = unitNode.get(u.unitId)!;
    const sn = srcNode.get(u.source)!;
    const so = srcOffset.get(u.source) ?? 0;
    const fh = px(u.fuel_MWh);
    paths.push({ key: `in-${u.unitId}`, d: band(COL.source + NODE_W, sn.y + so, COL.unit, un.y, fh, fh), fill: SOURCE_FILL[u.source]!, title: `${u.name}: ${mwh(u.fuel_MWh, d)} MWh in` });
    srcOffset.set(u.source, so + fh);
    let uo = 0;
    const ph = px(u.product_MWh);
    if (ph > 0) {
      paths.push({ key: `p-${u.unitId}`, d: band(COL.unit + NODE_W, un.y + uo, COL.out, product.y + prodOffset, ph, ph), fill: COLORS.teal, title: `${u.name} → product: ${mwh(u.product_MWh, d)} MWh` });
      prodOffset += ph;
      uo += ph;
    }
    const lh = px(u.loss_MWh);
    if (lh > 0) {
      paths.push({ key: `l-${u.unitId}`, d: band(COL.unit + NODE_W, un.y + uo, COL.out, loss.y + lossOffset, lh, lh), fill: 'url(#flow-loss)', pattern: true, title: `${u.name} → loss: ${mwh(u.loss_MWh, d)} MWh` });
      lossOffset += lh;
      uo += lh;
    }
    const dh = px(u.destruction_MWh);
    if (dh > 0) {
      const dn = destNode.get(u.unitId)!;
      paths.push({ key: `d-${u.unitId}`, d: band(COL.unit + NODE_W, un.y + uo, COL.out, dn.y, dh, dh), fill: COLORS.copper, title: `${u.name} → destruction: ${mwh(u.destruction_MWh, d)} MWh` });
    }
  }

  const label = (x: number, yy: number, text: string, sub: string, anchor: 'start' | 'end', color: string = COLORS.ink) => (
    <text x={x} y={yy} textAnchor={anchor} fontSize={12} fill={color} stroke="#f7f3ea" strokeWidth={3} strokeLinejoin="round" paintOrder="stroke">
      <tspan fontWeight={600}>{clip(text)}</tspan>
      <tspan x={x} dy={14} fontSize={11} fill={COLORS.soft}>
        {sub}
      </tspan>
    </text>
  );
  const mid = (n: Node) => n.y + Math.max(n.h, 1) / 2 - 3;

  return (
    <figure data-testid="flow-picture">
      <svg viewBox={`0 0 ${W} ${height}`} width="100%" role="img" aria-label={`Exergy flow of ${flow.site.name}, ${flow.period.label}`} className="font-sans">
        <defs>
          <pattern id="flow-loss" width="7" height="7" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
            <rect width="7" height="7" fill={COLORS.copperPale} />
            <path d="M0 0 V7" stroke={COLORS.copper} strokeWidth="1.2" strokeOpacity="0.6" />
          </pattern>
        </defs>
        <text x={COL.source + NODE_W / 2} y={14} fontSize={11} fill={COLORS.faint} textAnchor="middle">
          IN
        </text>
        <text x={COL.unit + NODE_W / 2} y={14} fontSize={11} fill={COLORS.faint} textAnchor="middle">
          UNITS
        </text>
        <text x={COL.out + NODE_W / 2} y={14} fontSize={11} fill={COLORS.faint} textAnchor="middle">
          OUT
        </text>
        {paths.map((p) => (
          <path key={p.key} d={p.d} fill={p.fill} fillOpacity={p.pattern ? 0.95 : 0.55} stroke="none">
            <title>{p.title}</title>
          </path>
        ))}
        {sources.map((s) => {
          const n = srcNode.get(s.key)!;
          return (
            <g key={s.key}>
              <rect x={COL.source} y={n.y} width={NODE_W} height={Math.max(n.h, 1)} fill={SOURCE_FILL[s.key]} />
              {label(COL.source - 8, mid(n), s.label, `${mwh(s.MWh, d)} MWh`, 'end')}
            </g>
          );
        })}
        {units.map((u) => {
          const n = unitNode.get(u.unitId)!;
          return (
            <g key={u.unitId} data-flow-unit={u.name}>
              <rect x={COL.unit} y={n.y} width={NODE_W} height={Math.max(n.h, 1)} fill={COLORS.ink} />
              {label(COL.unit + NODE_W + 6, mid(n), u.name, `${mwh(u.fuel_MWh, d)} MWh in`, 'start')}
            </g>
          );
        })}
        {product.h > 0 && (
          <g>
            <rect x={COL.out} y={product.y} width={NODE_W} height={product.h} fill={COLORS.teal} />
            {label(COL.out + NODE_W + 6, mid(product), 'Product', `${mwh(flow.totals.product_MWh, d)} MWh`, 'start', COLORS.tealDeep)}
          </g>
        )}
        {loss.h > 0 && (
          <g>
            <rect x={COL.out} y={loss.y} width={NODE_W} height={loss.h} fill="url(#flow-loss)" stroke={COLORS.copper} strokeWidth={0.6} />
            {label(COL.out + NODE_W + 6, mid(loss), 'Loss', `${mwh(flow.totals.loss_MWh, d)} MWh`, 'start', COLORS.copperDeep)}
          </g>
        )}
        {units
          .filter((u) => u.destruction_MWh > 0)
          .map((u) => {
            const n = destNode.get(u.unitId)!;
            return (
              <g key={`dn-${u.unitId}`}>
                <rect x={COL.out} y={n.y} width={NODE_W} height={Math.max(n.h, 1)} fill={COLORS.copper} />
                {label(COL.out + NODE_W + 6, mid(n), `Destroyed in ${u.name}`, withU(u.destruction_MWh, u.destruction_U_MWh, { unit: 'MWh', decimals: mwhDecimals(u.destruction_MWh) }), 'start', COLORS.copperDeep)}
              </g>
            );
          })}
      </svg>
      <figcaption className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-soft">
        <Swatch fill={COLORS.teal} words="product" />
        <Swatch fill="url(#flow-loss)" stroke={COLORS.copper} words="loss (hatched)" />
        <Swatch fill={COLORS.copper} words="destruction" />
        <span>
          Steady hours only ({flow.steadyHours} unit hours), MWh over the period. A unit's product may be the next unit's fuel (a boiler's steam
          drives a turbine), so each unit shows its own balance and the IN column is not a site boundary.
        </span>
      </figcaption>
    </figure>
  );
}
