import { useState } from 'react';
import { significant } from '~/lib/format';
import { PALETTE } from '~/lib/palette';
import { CartesianGrid, ComposedChart, Legend, Line, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from 'recharts';
import { StateMark } from '~/components/StateMark';
import { Notice } from '~/components/plant/common';
import { useBaselineDecision } from './useBaselineDecision';
import { periodDaysText } from '~/lib/views/baseline-fit-text';
import { BASELINE_LOOK, CHECK_LOOK, atZ, pct, sig } from './looks';
import { TERM_LABELS, type BaselineSummary, type FitView, type ModelSummary } from './types';
import { BaselineCoefficients, baselineScales, type SiteDisplayProp } from './BaselineCoefficients';
import { GridTable, num } from '~/components/ui/GridTable';

/** The Guideline 14 criteria row of one model. */
function CheckCell({ ok }: { ok: boolean }) {
  const look = ok ? CHECK_LOOK.meets : CHECK_LOOK.outside;
  return <StateMark shape={look.shape} className={look.className} label={look.label} />;
}

function StatsTable({ b, display }: { b: BaselineSummary; display?: SiteDisplayProp }) {
  const rows: [string, ModelSummary | null, string][] = [
    ['Exergy destruction', b.destruction, 'kW'],
    ['Exergy efficiency', b.efficiency, '-'],
  ];
  // Destruction's mean and s in the site's chosen power unit and locale (its settings).
  const { w } = baselineScales(b, display);
  const pu = w.unit('power');
  return (
    <GridTable testId="fit-stats" columns={['Model', num('Hours'), num('Mean'), num('s'), num('R² [-]'), num('CV(RMSE) [%]'), num('NMBE [%]'), 'Guideline 14, hourly']}>
      {rows.map(([name, m, unit]) =>
        m ? (
          <tr key={name} data-testid={`stats-${unit === 'kW' ? 'destruction' : 'efficiency'}`}>
            <td>{name}</td>
            <td className="num">{m.stats.n}</td>
            <td className="num">{unit === 'kW' ? `${w.value(m.stats.ybar, 'power')} ${pu}` : sig(m.stats.ybar, 3)}</td>
            <td className="num">{unit === 'kW' ? `${w.delta(m.stats.s, 'power')} ${pu}` : sig(m.stats.s, 3)}</td>
            <td className="num">{sig(m.stats.r2, 3)}</td>
            <td className="num">
              {pct(m.stats.cvRmse)} <span className="text-ink-faint">/ ≤ {pct(m.guideline14.cvRmseMax)}</span>
            </td>
            <td className="num">
              {pct(m.stats.nmbe)} <span className="text-ink-faint">/ ± {pct(m.guideline14.nmbeMax)}</span>
            </td>
            <td>
              <CheckCell ok={m.guideline14.meets} />
            </td>
          </tr>
        ) : (
          <tr key={name}>
            <td>{name}</td>
            <td colSpan={7} className="text-ink-faint">
              No efficiency for this unit (no product exergy in its steady hours).
            </td>
          </tr>
        ),
      )}
    </GridTable>
  );
}

/** Measured hours against load with the fitted curve at the period's mean T0. */
function FitChart({ b, fit, display }: { b: BaselineSummary; fit: FitView; display?: SiteDisplayProp }) {
  const [what, setWhat] = useState<'destruction' | 'efficiency'>('destruction');
  const eff = what === 'efficiency' && b.efficiency !== null;
  const { w, load: L, T, power } = baselineScales(b, display);
  const y = (e: number | null, d: number) => (eff ? (e === null ? null : e * 100) : d * power.factor);
  const points = fit.points.map((p) => ({ load: p.load * L.factor, y: y(p.efficiency, p.destruction_W) })).filter((p) => p.y !== null);
  const curve = fit.curve.map((c) => ({ load: c.load * L.factor, y: y(c.efficiency, c.destruction_W) }));
  const sig3 = (v: number) => significant(v, 3, w.style);
  return (
    <div>
      <div className="mb-2 flex items-center gap-3 text-sm">
        <label className="flex items-center gap-1">
          <input type="radio" name="fit-what" checked={!eff} onChange={() => setWhat('destruction')} /> Exergy destruction [{power.unit}]
        </label>
        <label className="flex items-center gap-1">
          <input type="radio" name="fit-what" checked={eff} disabled={!b.efficiency} onChange={() => setWhat('efficiency')} /> Exergy efficiency [%]
        </label>
      </div>
      <div className="h-72" data-testid="fit-chart" role="img" aria-label={`${eff ? 'Efficiency' : 'Destruction'} of the reference hours against load, with the fitted curve`}>
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
            <CartesianGrid stroke={PALETTE.paper.edge} strokeDasharray="3 3" />
            <XAxis
              type="number"
              dataKey="load"
              domain={['auto', 'auto']}
              tickFormatter={sig3}
              label={{ value: `Load [${L.unit}]`, position: 'insideBottom', offset: -12, fill: PALETTE.ink.soft, fontSize: 12 }}
              stroke={PALETTE.ink.soft}
              fontSize={12}
            />
            <YAxis type="number" dataKey="y" domain={['auto', 'auto']} tickFormatter={sig3} stroke={PALETTE.ink.soft} fontSize={12} width={64} />
            <Tooltip formatter={(v) => significant(Number(v), 4, w.style)} labelFormatter={(v) => `load ${significant(Number(v), 4, w.style)} ${L.unit}`} />
            <Legend verticalAlign="top" height={24} />
            <Scatter name={fit.totalPoints && fit.totalPoints > fit.points.length ? `${fit.points.length} of ${fit.totalPoints} steady reference hours, evenly chosen` : 'Steady reference hours'} data={points} fill={eff ? PALETTE.teal.DEFAULT : PALETTE.copper.DEFAULT} shape="circle" isAnimationActive={false} />
            <Line
              name={`Fitted at the mean T0, ${w.value(fit.meanT0_K, 'temperature', 1)} ${T.unit}`}
              data={curve}
              dataKey="y"
              type="monotone"
              stroke={PALETTE.ink.DEFAULT}
              strokeWidth={2}
              dot={false}
              isAnimationActive={false}
            />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
    </div>
  );
}


/** One baseline version: statistics against Guideline 14, the scatter, and accept or discard for drafts. */
/** Whether the fit saw enough hours and load to be trusted or accepted (src/lib/analytics/fit-trust.ts). */
function FitTrustNote({ b }: { b: BaselineSummary }) {
  if (b.trust.trusted) return null;
  return (
    <div className={`rounded border px-3 py-2 text-sm ${b.trust.acceptable ? 'border-amber/60' : 'border-copper-deep/60'}`} data-testid="fit-trust" role="note">
      <p className="font-medium">{b.trust.acceptable ? 'Read this fit with care' : 'This fit cannot be accepted'}</p>
      <ul className="list-disc pl-5">
        {b.trust.warnings.map((w) => (
          <li key={w}>{w}</li>
        ))}
      </ul>
    </div>
  );
}

/** The heading of a version: unit, version, site, reference period, terms, who fitted it and when; its status. */
function BaselineHeading({ b }: { b: BaselineSummary }) {
  const look = BASELINE_LOOK[b.status]!;
  return (
    <div className="flex flex-wrap items-baseline justify-between gap-2">
      <div>
        <h2>
          {b.unitName} · version {b.version}
        </h2>
        <p className="text-sm text-ink-soft">
          {b.siteName} · reference period {periodDaysText(b.periodFrom, b.periodTo, b.timeZone)} ({b.timeZone}) · terms{' '}
          {b.terms.map((t) => TERM_LABELS[t]).join(', ')} · fitted by {b.createdBy ?? 'someone'} on {atZ(b.createdAt, b.timeZone)}
        </p>
      </div>
      <span data-testid="baseline-status">
        <StateMark shape={look.shape} className={look.className} label={look.label} />
      </span>
    </div>
  );
}

/** Accept or discard a draft, with a word when the fit is outside the Guideline 14 criteria. */
function DecisionButtons({ b, busy, decide }: { b: BaselineSummary; busy: boolean; decide: (what: 'accept' | 'discard') => void }) {
  return (
    <div className="flex flex-wrap items-center gap-2">
      <button type="button" className="btn btn-primary" disabled={busy || !b.trust.acceptable} onClick={() => decide('accept')}>
        Accept as active baseline
      </button>
      <button type="button" className="btn" disabled={busy} onClick={() => decide('discard')}>
        Discard
      </button>
      {!b.meetsGuideline14 && <span className="text-sm text-copper-deep">This fit is outside the Guideline 14 criteria; accept it only knowingly.</span>}
    </div>
  );
}

/** A baseline version, its fit and statistics; accept or discard a draft (./useBaselineDecision.ts). */
export default function BaselineDetail({ baselineId, canEdit, display }: { baselineId: string; canEdit: boolean; display?: SiteDisplayProp }) {
  const { data, message, busy, dialog, decide } = useBaselineDecision(baselineId);

  if (!data) {
    return message ? <Notice message={message} /> : <p className="text-sm text-ink-faint" role="status">Loading the baseline…</p>;
  }
  const b = data.baseline;
  return (
    <section className="card space-y-4" data-testid="baseline-detail">
      {dialog}
      <BaselineHeading b={b} />
      <StatsTable b={b} display={display} />
      <FitTrustNote b={b} />
      <p className="text-xs text-ink-faint">
        ASHRAE Guideline 14-2014 hourly criteria: CV(RMSE) at most 30 % and NMBE within ±10 % (limits from memory;{' '}
        <a href="/help/method#baselines">how baselines are fitted and judged</a>). NMBE is zero by construction on the hours a model was fitted to.
      </p>
      <FitChart b={b} fit={data.fit} display={display} />
      <BaselineCoefficients b={b} display={display} />
      {b.decidedAt && (
        <p className="text-sm text-ink-soft">
          {b.status === 'discarded' ? 'Discarded' : 'Accepted'} by {b.decidedBy ?? 'someone'} on {atZ(b.decidedAt, b.timeZone)}
          {b.retiredAt ? `; retired on ${atZ(b.retiredAt, b.timeZone)}` : ''}.
        </p>
      )}
      <Notice message={message} />
      {canEdit && b.status === 'draft' && <DecisionButtons b={b} busy={busy} decide={(what) => void decide(what)} />}
    </section>
  );
}
