/**
 * The site's exergy over a period as bands, left to right: where the exergy came from (fuel burned,
 * power, steam and process streams), through each unit, out as product (teal), loss (light copper,
 * hatched) and each unit's destruction (copper). Band widths are proportional to MWh. Lossline's own
 * drawing in plain SVG: the geometry in src/lib/views/flow-layout.ts, the parts in FlowNodes.tsx.
 */
import { COLORS } from './common';
import { mwhDecimals } from './format';
import { FLOW_COL as COL, FLOW_NODE_W as NODE_W, FLOW_W as W, flowLayout } from '~/lib/views/flow-layout';
import type { FlowAnswer } from '~/lib/views/ledger';
import { FlowBands, FlowLegend, InAndUnitNodes, OutNodes } from './FlowNodes';

export type { FlowAnswer };

/** The column heads over the picture. */
function ColumnHeads() {
  return (
    <>
      <text x={COL.source + NODE_W / 2} y={14} fontSize={11} fill={COLORS.faint} textAnchor="middle">
        IN
      </text>
      <text x={COL.unit + NODE_W / 2} y={14} fontSize={11} fill={COLORS.faint} textAnchor="middle">
        UNITS
      </text>
      <text x={COL.out + NODE_W / 2} y={14} fontSize={11} fill={COLORS.faint} textAnchor="middle">
        OUT
      </text>
    </>
  );
}

export function FlowPicture({ flow }: { flow: FlowAnswer }) {
  const layout = flowLayout(flow);
  if (!layout) return <p className="py-4 text-sm text-ink-faint">No steady hours with fuel exergy in this period.</p>;
  const d = mwhDecimals(Math.max(...layout.units.map((u) => u.fuel_MWh)));

  return (
    <figure data-testid="flow-picture">
      <svg viewBox={`0 0 ${W} ${layout.height}`} width="100%" role="img" aria-label={`Exergy flow of ${flow.site.name}, ${flow.period.label}`} className="font-sans">
        <defs>
          <pattern id="flow-loss" width="7" height="7" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
            <rect width="7" height="7" fill={COLORS.copperPale} />
            <path d="M0 0 V7" stroke={COLORS.copper} strokeWidth="1.2" strokeOpacity="0.6" />
          </pattern>
        </defs>
        <ColumnHeads />
        <FlowBands bands={layout.bands} d={d} />
        <InAndUnitNodes layout={layout} d={d} />
        <OutNodes layout={layout} totals={flow.totals} d={d} />
      </svg>
      <FlowLegend steadyHours={flow.steadyHours} />
    </figure>
  );
}
