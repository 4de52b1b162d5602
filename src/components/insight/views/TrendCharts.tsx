/**
 * The trend charts: measured (steady hours only) against the expected band, hours that are not
 * steady shaded by state (colour and pattern, named in the legend), drift notices marked on the time
 * axis, and the scatter against load with the baseline's curve.
 */
import { TZDate } from '@date-fns/tz';
import { addDays, addHours, addMonths } from 'date-fns';
import { siteStamp } from '~/lib/site-time';
import { HOUR_MS } from '~/lib/time';
import {
  Area,
  CartesianGrid,
  ComposedChart,
  Line,
  ReferenceArea,
  ReferenceLine,
  ResponsiveContainer,
  Scatter,
  Tooltip,
  XAxis,
  YAxis,
} from 'recharts';
import { COLORS, HourStateMark, STATE_LOOK } from './common';
import type { ContextSpan, CurvePoint, ExpectedHour, NoticeMark, ScatterPoint, TrendPoint } from '~/lib/views/trend';
export type { ContextSpan, CurvePoint, ExpectedHour, NoticeMark, ScatterPoint, TrendPoint };
import { loadAxis, sitePowerUnit } from './format';
import { significant } from '~/lib/format';
import { writerOf, type SiteWriter } from '~/lib/units/writer';
import { loadScatterRows, timeChartRows, type ChartRow, type TrendChartKind as Kind } from '~/lib/views/trend-chart';
import { ScatterTooltip, TrendTooltip } from './TrendTooltips';


/** Fill patterns of the shaded states: idle lines, unsettled hatching, suspect dots. */
export function StatePatterns({ prefix }: { prefix: string }) {
  return (
    <defs>
      <pattern id={`${prefix}-idle`} width="6" height="6" patternUnits="userSpaceOnUse">
        <rect width="6" height="6" fill={STATE_LOOK.idle.fill} />
        <path d="M0 3 H6" stroke={STATE_LOOK.idle.stroke} strokeWidth="0.8" strokeOpacity="0.7" />
      </pattern>
      <pattern id={`${prefix}-unsettled`} width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
        <rect width="6" height="6" fill={STATE_LOOK.unsettled.fill} />
        <path d="M0 0 V6" stroke={STATE_LOOK.unsettled.stroke} strokeWidth="1" strokeOpacity="0.8" />
      </pattern>
      <pattern id={`${prefix}-suspect`} width="6" height="6" patternUnits="userSpaceOnUse">
        <rect width="6" height="6" fill={STATE_LOOK.suspect.fill} />
        <circle cx="3" cy="3" r="1" fill={STATE_LOOK.suspect.stroke} fillOpacity="0.8" />
      </pattern>
    </defs>
  );
}

/** The text of the charts' axes: their ticks and labels. */
const AXIS_TEXT = { fontSize: 11, fill: COLORS.soft };

/** A numeric axis on nice ticks (niceTicks; recharts picks its own when there are none). */
const valueAxis = (a: ReturnType<typeof niceTicks>) => ({ domain: a?.domain ?? ['auto', 'auto'], ticks: a?.ticks, tick: AXIS_TEXT });

/** The value axis's label of a chart of efficiency or destruction (in the site's power unit). */
const yLabel = (kind: Kind, powerUnit: string) => ({
  value: kind === 'efficiency' ? 'Efficiency [%]' : `Destruction [${powerUnit}]`,
  angle: -90,
  position: 'insideLeft' as const,
  style: { ...AXIS_TEXT, textAnchor: 'middle' as const },
});

const shade = (prefix: string, state: ContextSpan['state']) =>
  function ShadeShape(props: { x?: number; y?: number; width?: number; height?: number }) {
    const { x = 0, y = 0, width = 0, height = 0 } = props;
    return (
      <g data-shade={state}>
        <StatePatterns prefix={`${prefix}-${state}-area`} />
        <rect x={x} y={y} width={Math.max(width, 1)} height={height} fill={`url(#${prefix}-${state}-area-${state})`} fillOpacity={0.75} />
      </g>
    );
  };

function NoticeLabel(props: { viewBox?: { x?: number; y?: number; height?: number } }) {
  const x = props.viewBox?.x ?? 0;
  const y = (props.viewBox?.y ?? 0) + (props.viewBox?.height ?? 0);
  return (
    <g data-notice-mark="">
      <path d={`M${x} ${y - 11} L${x + 6} ${y - 1} L${x - 6} ${y - 1} Z`} fill={COLORS.copper} stroke={COLORS.copperDeep} />
      <text x={x + 8} y={y - 3} fontSize={10} fill={COLORS.copperDeep}>
        notice
      </text>
    </g>
  );
}

/** A round axis: about five ticks at 1, 2, 2.5 or 5 times a power of ten, covering every value. */
export function niceTicks(values: (number | null | undefined)[]): { domain: [number, number]; ticks: number[] } | null {
  const v = values.filter((x): x is number => x !== null && x !== undefined && Number.isFinite(x));
  if (!v.length) return null;
  let lo = Math.min(...v);
  let hi = Math.max(...v);
  if (hi - lo < 1e-9) {
    const pad = Math.abs(lo) * 0.05 || 1;
    lo -= pad;
    hi += pad;
  }
  const raw = (hi - lo) / 4;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw)!;
  const from = Math.floor(lo / step) * step;
  const to = Math.ceil(hi / step) * step;
  const ticks: number[] = [];
  for (let t = from; t <= to + step / 2; t += step) ticks.push(Number(t.toPrecision(12)));
  return { domain: [ticks[0]!, ticks[ticks.length - 1]!], ticks };
}

/** Tick instants on the site's clock for a period. */
export function timeTicks(fromMs: number, toMs: number, timeZone: string): { ticks: number[]; pattern: string } {
  const hours = (toMs - fromMs) / HOUR_MS;
  const start = new TZDate(fromMs, timeZone);
  const out: number[] = [];
  let pattern = 'HH:mm';
  let next: (d: TZDate, i: number) => TZDate;
  if (hours <= 50) next = (d, i) => addHours(d, 3 * i);
  else if (hours <= 24 * 16) {
    pattern = 'EEE d';
    next = (d, i) => addDays(d, i);
  } else if (hours <= 24 * 70) {
    pattern = 'd MMM';
    next = (d, i) => addDays(d, 7 * i);
  } else {
    pattern = 'MMM';
    next = (d, i) => addMonths(d, i);
  }
  for (let i = 0; i < 400; i++) {
    const t = next(start, i).getTime();
    if (t > toMs) break;
    out.push(t);
  }
  return { ticks: out, pattern };
}


export interface TimeChartProps {
  kind: Kind;
  points: TrendPoint[];
  context: ContextSpan[];
  notices: NoticeMark[];
  fromMs: number;
  toMs: number;
  timeZone: string;
  bucket: 'hour' | 'day';
  loadUnit: string | null;
  /** The site's writer (its display units and locale); the default units when none is given. */
  writer?: SiteWriter;
}

export function TimeChart({ kind, points, context, notices, fromMs, toMs, timeZone, bucket, loadUnit, writer }: TimeChartProps) {
  const w = writer ?? writerOf(null);
  // The site's chosen power unit, whatever the size of the figures (kW stays kW at 20 MW).
  const pu = sitePowerUnit(w);
  const rows: ChartRow[] = timeChartRows(points, kind, pu.factor);
  const { ticks, pattern } = timeTicks(fromMs, toMs, timeZone);
  const yAxis = niceTicks(rows.flatMap((r) => [r.measured, r.expected, ...(r.band ?? [])]));
  const prefix = `${kind}-pat`;
  const line = kind === 'efficiency' ? COLORS.teal : COLORS.copper;
  const bandFill = kind === 'efficiency' ? COLORS.tealPale : COLORS.copperPale;
  return (
    <div className="h-72 w-full" data-testid={`chart-${kind}`} role="img" aria-label={kind === 'efficiency' ? 'Exergy efficiency over time against the expected band' : 'Exergy destruction over time against the expected band'}>
      <ResponsiveContainer width="100%" height="100%">
        <ComposedChart data={rows} margin={{ top: 8, right: 16, bottom: 4, left: 8 }}>
          <CartesianGrid stroke={COLORS.edge} strokeDasharray="2 4" />
          <XAxis
            dataKey="t"
            type="number"
            scale="time"
            domain={[fromMs, toMs]}
            ticks={ticks}
            tickFormatter={(t: number) => siteStamp(t, timeZone, pattern)}
            tick={AXIS_TEXT}
            allowDataOverflow
          />
          <YAxis
            {...valueAxis(yAxis)}
            width={56}
            allowDataOverflow
            label={yLabel(kind, pu.unit)}
          />
          {context.map((c) => (
            <ReferenceArea key={`${c.state}-${c.fromMs}`} x1={Math.max(c.fromMs, fromMs)} x2={Math.min(c.toMs, toMs)} ifOverflow="hidden" shape={shade(prefix, c.state)} />
          ))}
          <Area type="linear" dataKey="band" stroke="none" fill={bandFill} fillOpacity={0.85} isAnimationActive={false} connectNulls={false} name="expected band (k = 2)" />
          <Line type="linear" dataKey="expected" stroke={COLORS.ink} strokeDasharray="5 4" strokeWidth={1.2} dot={false} isAnimationActive={false} connectNulls={false} name="expected" />
          <Line
            type="linear"
            dataKey="measured"
            stroke={line}
            strokeWidth={2}
            dot={rows.length <= 60 ? { r: 2.5, fill: line } : false}
            isAnimationActive={false}
            connectNulls={false}
            name="measured"
          />
          {notices
            .filter((n) => n.onsetMs >= fromMs && n.onsetMs <= toMs)
            .map((n) => (
              <ReferenceLine key={n.id} x={n.onsetMs} stroke={COLORS.copper} strokeDasharray="3 3" label={<NoticeLabel />} ifOverflow="extendDomain" />
            ))}
          <Tooltip content={<TrendTooltip kind={kind} timeZone={timeZone} bucket={bucket} loadUnit={loadUnit} w={w} />} isAnimationActive={false} />
        </ComposedChart>
      </ResponsiveContainer>
    </div>
  );
}

/** The legend, in words and shapes: states never by colour alone. */
export function TrendLegend({ kind, shown }: { kind: Kind; shown: Set<string> }) {
  const line = kind === 'efficiency' ? COLORS.teal : COLORS.copper;
  const band = kind === 'efficiency' ? COLORS.tealPale : COLORS.copperPale;
  const sw = (content: React.ReactNode) => (
    <svg width="26" height="12" viewBox="0 0 26 12" aria-hidden="true">
      {content}
    </svg>
  );
  const prefix = `legend-${kind}`;
  return (
    <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-soft" aria-label="Legend">
      <li className="inline-flex items-center gap-1.5">{sw(<path d="M1 6 H25" stroke={line} strokeWidth="2.5" />)}measured (steady hours)</li>
      <li className="inline-flex items-center gap-1.5">{sw(<path d="M1 6 H25" stroke={COLORS.ink} strokeWidth="1.2" strokeDasharray="5 4" />)}expected</li>
      <li className="inline-flex items-center gap-1.5">{sw(<rect x="1" y="1" width="24" height="10" fill={band} />)}expected band (k = 2)</li>
      {(['idle', 'unsettled', 'suspect'] as const).map((s) => (
        <li key={s} className="inline-flex items-center gap-1.5" data-legend={s}>
          {sw(
            <>
              <StatePatterns prefix={`${prefix}-${s}`} />
              <rect x="1" y="1" width="24" height="10" fill={`url(#${prefix}-${s}-${s})`} stroke={STATE_LOOK[s].stroke} strokeWidth="0.6" />
            </>,
          )}
          <HourStateMark state={s} /> hours (shaded){shown.has(s) ? '' : ', none in this period'}
        </li>
      ))}
      <li className="inline-flex items-center gap-1.5">
        {sw(<path d="M13 1 L19 11 L7 11 Z" fill={COLORS.copper} stroke={COLORS.copperDeep} />)}drift notice (onset)
      </li>
    </ul>
  );
}

export interface LoadScatterProps {
  kind: Kind;
  scatter: ScatterPoint[];
  curve: CurvePoint[];
  loadUnit: string | null;
  timeZone: string;
  /** The site's writer (its display units and locale); the default units when none is given. */
  writer?: SiteWriter;
}

/** Efficiency (or, for dissipative units, destruction) of steady hours against load, with the baseline's curve. */
export function LoadScatter({ kind, scatter, curve, loadUnit, timeZone, writer }: LoadScatterProps) {
  const w = writer ?? writerOf(null);
  const ax = loadAxis(loadUnit, w);
  const pu = sitePowerUnit(w);
  const { pts, cur } = loadScatterRows(scatter, curve, kind, ax.scale, pu.factor);
  const dot = kind === 'efficiency' ? COLORS.teal : COLORS.copper;
  const xAxis = niceTicks([...pts.map((p) => p.x), ...cur.map((c) => c.x)]);
  const yAxis = niceTicks([...pts.map((p) => p.y), ...cur.flatMap((c) => [c.y, ...(c.band ?? [])])]);
  return (
    <div className="h-72 w-full" data-testid="chart-scatter" role="img" aria-label="Steady hours against load with the baseline's curve">
      <ResponsiveContainer width="100%" height="100%">
        <ComposedChart margin={{ top: 8, right: 16, bottom: 18, left: 8 }}>
          <CartesianGrid stroke={COLORS.edge} strokeDasharray="2 4" />
          <XAxis
            dataKey="x"
            type="number"
            {...valueAxis(xAxis)}
            tickFormatter={(v: number) => significant(v, 3)}
            label={{ value: ax.label, position: 'insideBottom', offset: -10, style: AXIS_TEXT }}
            allowDuplicatedCategory={false}
          />
          <YAxis
            dataKey="y"
            type="number"
            {...valueAxis(yAxis)}
            width={56}
            label={yLabel(kind, pu.unit)}
          />
          {cur.length > 0 && <Area data={cur} dataKey="band" type="monotone" stroke="none" fill={kind === 'efficiency' ? COLORS.tealPale : COLORS.copperPale} isAnimationActive={false} />}
          {cur.length > 0 && <Line data={cur} dataKey="y" type="monotone" stroke={COLORS.ink} strokeDasharray="5 4" dot={false} isAnimationActive={false} />}
          <Scatter data={pts} dataKey="y" fill={dot} fillOpacity={0.7} shape="circle" isAnimationActive={false} />
          <Tooltip content={<ScatterTooltip kind={kind} timeZone={timeZone} loadUnit={loadUnit} w={w} />} isAnimationActive={false} />
        </ComposedChart>
      </ResponsiveContainer>
    </div>
  );
}
