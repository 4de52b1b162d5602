/**
 * The trend charts' tooltips: one hour (or local day) of the time chart, and one steady hour or one
 * point of the baseline's curve on the scatter against load.
 */
import { HOUR_MS } from '~/lib/time';
import { HourStateMark } from './common';
import type { CurvePoint, ScatterPoint } from '~/lib/views/trend';
import type { ChartRow, TrendChartKind as Kind } from '~/lib/views/trend-chart';
import { load as showLoad, pct, siteTime, type HourState } from './format';
import type { SiteWriter } from '~/lib/units/writer';

export function TrendTooltip({ active, payload, kind, timeZone, bucket, loadUnit, w }: { active?: boolean; payload?: { payload: ChartRow }[]; kind: Kind; timeZone: string; bucket: 'hour' | 'day'; loadUnit: string | null; w: SiteWriter }) {
  if (!active || !payload?.length) return null;
  const power = (v_W: number | null | undefined, U_W?: number | null) => w.withU(v_W, U_W, 'power');
  const p = payload[0]!.payload.point;
  const when = `${bucket === 'hour' ? `${siteTime(p.t, timeZone)}–${siteTime(p.t + HOUR_MS, timeZone, 'HH:mm')}` : siteTime(p.t, timeZone, 'EEE d MMM yyyy')} (${timeZone})`;
  const states = (Object.keys(p.states) as HourState[]).filter((s) => p.states[s] > 0);
  const e = p.expected;
  // The figure shown, measured and expected: efficiency or destruction.
  const fig =
    kind === 'efficiency'
      ? { name: 'Efficiency', value: pct(p.efficiency, p.efficiency_U), expected: e && e.efficiency !== null ? [pct(e.efficiency), pct(e.efficiencyLo), pct(e.efficiencyHi)] : null }
      : { name: 'Destruction', value: power(p.destruction_W, p.destruction_U_W), expected: e && e.destruction_W !== null ? [power(e.destruction_W), power(e.destructionLo_W), power(e.destructionHi_W)] : null };
  return (
    <div className="rounded border border-paper-edge bg-white px-3 py-2 text-xs shadow" data-testid="trend-tooltip">
      <p className="font-semibold">{when}</p>
      <div className="mt-1 flex flex-wrap gap-2">
        {states.length === 0 ? <span className="text-ink-faint">no unit hour</span> : states.map((s) => <HourStateMark key={s} state={s} count={bucket === 'day' ? p.states[s] : undefined} />)}
      </div>
      <p className="mt-1">
        {fig.name}
        {bucket === 'day' ? ' (mean of steady hours)' : ''}: <b>{fig.value}</b>
      </p>
      {fig.expected && (
        <p>
          Expected: {fig.expected[0]} (band {fig.expected[1]} to {fig.expected[2]}, k = 2)
        </p>
      )}
      {p.load !== null && <p>Load: {showLoad(p.load, loadUnit, w)}</p>}
      {p.T0_K !== null && <p>T0: {w.withU(p.T0_K, null, 'temperature', 1)}</p>}
      {p.reasons && p.reasons.length > 0 && <p className="mt-1 max-w-xs text-ink-soft">{p.reasons.join('; ')}</p>}
    </div>
  );
}

export function ScatterTooltip({ active, payload, kind, timeZone, loadUnit, w }: { active?: boolean; payload?: { payload: Record<string, unknown> }[]; kind: Kind; timeZone: string; loadUnit: string | null; w: SiteWriter }) {
  if (!active || !payload?.length) return null;
  const power = (v_W: number | null | undefined) => w.withU(v_W, null, 'power');
  const d = payload[0]!.payload as { s?: ScatterPoint; c?: CurvePoint };
  if (d.s) {
    return (
      <div className="rounded border border-paper-edge bg-white px-3 py-2 text-xs shadow">
        <p className="font-semibold">
          {siteTime(d.s.t, timeZone)} ({timeZone})
        </p>
        <p>Load: {showLoad(d.s.load, loadUnit, w)}</p>
        {kind === 'efficiency' ? <p>Efficiency: {pct(d.s.efficiency, d.s.efficiency_U)}</p> : <p>Destruction: {power(d.s.destruction_W)}</p>}
      </div>
    );
  }
  if (d.c) {
    return (
      <div className="rounded border border-paper-edge bg-white px-3 py-2 text-xs shadow">
        <p className="font-semibold">Baseline at load {showLoad(d.c.load, loadUnit, w)}</p>
        {kind === 'efficiency' ? (
          <p>
            Expected {pct(d.c.efficiency)} (band {pct(d.c.lo)} to {pct(d.c.hi)}, k = 2)
          </p>
        ) : (
          <p>
            Expected {power(d.c.destruction_W)} (band {power(d.c.dLo_W)} to {power(d.c.dHi_W)}, k = 2)
          </p>
        )}
      </div>
    );
  }
  return null;
}
