import { Bar, CartesianGrid, ComposedChart, Line, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { at, atZ } from '../baselines/looks';
import { significant } from '~/lib/format';
import type { Notice, NoticeChartEvent } from './looks';
import type { ChartColumns } from '~/lib/analytics/chart-thin';
import { PALETTE } from '~/lib/palette';
import { writerOf, type SiteWriter } from '~/lib/units/writer';
import { eventsWithin, noticeChartData, pointSpanWords, type NoticeChartDatum } from '~/lib/views/notice-chart';

const INK = PALETTE.ink.DEFAULT;
const COPPER = PALETTE.copper.DEFAULT;
/** Dash patterns and markers tell the series apart, colour only helps. */
const CUSUM_DASH = '7 3';
const LIMIT_DASH = '2 3';
const ROW_px = 15;

/** A dated mark's number, each on its own row at the top of the plot, so no two labels ever meet. */
function EventLabel({ viewBox, n, row }: { viewBox?: { x: number; y: number }; n: number; row: number }) {
  if (!viewBox) return null;
  const y = viewBox.y + 9 + row * ROW_px;
  return (
    <g>
      <rect x={viewBox.x - 7} y={y - 7} width={14} height={14} fill={PALETTE.paper.DEFAULT} stroke={INK} strokeWidth={1} />
      <text x={viewBox.x} y={y + 4} textAnchor="middle" fontSize={10} fill={INK}>
        {n}
      </text>
    </g>
  );
}

/** The key under the chart: a sample of each series' pattern beside its words. */
function Key({ notice, span, per }: { notice: Notice; span: 'hour' | 'day'; per: string }) {
  const unit = writerOf(notice.display).unit('power');
  const dir = notice.direction === 'up' ? 'more' : 'less';
  return (
    <ul className="mt-2 flex flex-wrap gap-x-6 gap-y-1 text-xs text-ink-soft" data-testid="chart-key">
      <li className="flex items-center gap-2">
        <svg width="22" height="12" aria-hidden="true">
          <rect x="6" y="1" width="10" height="10" fill={COPPER} />
        </svg>
        bars: measured − expected destruction [{unit}]{span === 'day' ? `, mean of the ${per}’s steady hours` : ', per steady hour'}
      </li>
      <li className="flex items-center gap-2">
        <svg width="30" height="12" aria-hidden="true">
          <line x1="0" y1="6" x2="30" y2="6" stroke={INK} strokeWidth="2" strokeDasharray={CUSUM_DASH} />
          <rect x="12" y="3" width="6" height="6" fill={INK} />
        </svg>
        dashed line with squares: cumulative sum ({dir} destruction) [σ]{span === 'day' ? `, largest of the ${per}` : ''}
      </li>
      <li className="flex items-center gap-2">
        <svg width="30" height="12" aria-hidden="true">
          <line x1="0" y1="6" x2="30" y2="6" stroke={INK} strokeWidth="1.5" strokeDasharray={LIMIT_DASH} />
        </svg>
        dotted line: decision limit h = {notice.h} σ
      </li>
    </ul>
  );
}

/** The plot itself: residual bars, the cumulative sum, its decision limit and the dated marks. */
function DriftPlot({ notice, data, shown, span, per, w }: { notice: Notice; data: NoticeChartDatum[]; shown: NoticeChartEvent[]; span: 'hour' | 'day'; per: string; w: SiteWriter }) {
  const unit = w.unit('power');
  const tick = (t: number) => (span === 'day' ? at(new Date(t).toISOString(), notice.timeZone).slice(0, 10) : at(new Date(t).toISOString(), notice.timeZone).slice(5));
  const top = 12 + shown.length * ROW_px;
  return (
    <div
      className="h-80"
      data-testid="drift-chart"
      data-span={span}
      data-points={data.length}
      role="img"
      aria-label={`Residual of destruction ${span === 'day' ? 'per day' : 'per steady hour'} and the cumulative sum against the decision limit h = ${notice.h} σ`}
    >
      <ResponsiveContainer width="100%" height="100%">
        <ComposedChart data={data} margin={{ top, right: 8, bottom: 8, left: 8 }}>
          <CartesianGrid stroke={PALETTE.paper.edge} strokeDasharray="3 3" />
          <XAxis dataKey="t" type="number" scale="time" domain={['dataMin', 'dataMax']} tickFormatter={tick} stroke={PALETTE.ink.soft} fontSize={11} minTickGap={40} />
          <YAxis yAxisId="kW" tickFormatter={(v: number) => significant(v, 3, w.style)} stroke={PALETTE.copper.deep} fontSize={11} width={56} label={{ value: `residual [${unit}]`, angle: -90, position: 'insideLeft', fill: PALETTE.copper.deep, fontSize: 11 }} />
          <YAxis
            yAxisId="sigma"
            orientation="right"
            domain={[0, (max: number) => Math.max(max, notice.h * 1.25)]}
            tickFormatter={(v: number) => significant(v, 3, w.style)}
            stroke={INK}
            fontSize={11}
            width={48}
            label={{ value: 'cumulative sum [σ]', angle: 90, position: 'insideRight', fill: INK, fontSize: 11 }}
          />
          <Tooltip
            labelFormatter={(t) => `${span === 'day' ? `${per} from ` : ''}${atZ(new Date(Number(t)).toISOString(), notice.timeZone)}`}
            formatter={(v, name) => [w.number(Number(v), 2), name === 'residual' ? `residual [${unit}]` : 'cumulative sum [σ]']}
          />
          <Bar yAxisId="kW" dataKey="residual" name="residual" fill={COPPER} isAnimationActive={false} />
          <Line
            yAxisId="sigma"
            dataKey="cusum"
            name="cusum"
            stroke={INK}
            strokeDasharray={CUSUM_DASH}
            strokeWidth={2}
            dot={data.length <= 120 ? { r: 2.5, strokeWidth: 0, fill: INK } : false}
            isAnimationActive={false}
          />
          <ReferenceLine yAxisId="sigma" y={notice.h} stroke={INK} strokeDasharray={LIMIT_DASH} />
          {shown.map((e, i) => (
            <ReferenceLine key={`${e.label}-${e.t}`} yAxisId="sigma" x={new Date(e.t).getTime()} stroke={PALETTE.ink.faint} label={<EventLabel n={i + 1} row={i} />} />
          ))}
        </ComposedChart>
      </ResponsiveContainer>
    </div>
  );
}

/** The caption: the clock of the axis, what a daily point is, and how the cumulative sum works. */
function ChartCaption({ notice, span, per }: { notice: Notice; span: 'hour' | 'day'; per: string }) {
  return (
    <figcaption className="mt-1 text-xs text-ink-faint">
      Times on the axis are in the site’s clock ({notice.timeZone}).{' '}
      {span === 'day'
        ? `Over this span the chart shows one point per ${per} (site time): the mean residual and the largest cumulative sum of its steady hours. `
        : ''}
      The cumulative sum adds each hour’s residual in units of σ, the spread of the residuals of the baseline’s fit, less the allowance k = {notice.k} σ; the
      notice opens when it passes the decision limit h = {notice.h} σ.
    </figcaption>
  );
}

/**
 * The residual and the cumulative sum against its decision limit. The server sends hours, or days
 * (runs of days above 500 points) over long spans, as the columns the chart draws
 * (src/lib/analytics/chart-thin.ts); σ is the spread of the residuals of the baseline's fit.
 */
export function NoticeChart({ notice, chart, events }: { notice: Notice; chart: ChartColumns; events: NoticeChartEvent[] }) {
  const span = chart.span;
  const per = pointSpanWords(chart.perHours);
  if (!chart.at_min.length) return <p className="text-sm text-ink-faint">The hours behind this notice are no longer in the drift check (the baseline or settings changed).</p>;
  const w = writerOf(notice.display);
  const data = noticeChartData(chart, w);
  const shown = eventsWithin(events, data[0]!.t, data[data.length - 1]!.t);
  return (
    <figure>
      <DriftPlot notice={notice} data={data} shown={shown} span={span} per={per} w={w} />
      <Key notice={notice} span={span} per={per} />
      {shown.length > 0 && (
        <ol className="mt-1 flex flex-wrap gap-x-5 text-xs text-ink-soft" data-testid="chart-marks">
          {shown.map((e, i) => (
            <li key={`${e.label}-${e.t}`}>
              <span className="mr-1 inline-block border border-ink px-1 tabular-nums">{i + 1}</span>
              {e.label} {atZ(e.t, notice.timeZone)}
            </li>
          ))}
        </ol>
      )}
      <ChartCaption notice={notice} span={span} per={per} />
    </figure>
  );
}
