import { useEffect, useState } from 'react';
import { CartesianGrid, ComposedChart, Legend, Line, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from 'recharts';
import { StateMark } from '~/components/StateMark';
import { Notice } from '~/components/plant/common';
import { call, messageOf, type Message } from '~/components/api';
import { BASELINE_LOOK, CHECK_LOOK, at, dayOf, kW, pct, sig } from './looks';
import { TERM_LABELS, type BaselineSummary, type FitView, type ModelSummary } from './types';

/** The Guideline 14 criteria row of one model. */
function CheckCell({ ok }: { ok: boolean }) {
  const look = ok ? CHECK_LOOK.meets : CHECK_LOOK.outside;
  return <StateMark shape={look.shape} className={look.className} label={look.label} />;
}

function StatsTable({ b }: { b: BaselineSummary }) {
  const rows: [string, ModelSummary | null, string][] = [
    ['Exergy destruction', b.destruction, 'kW'],
    ['Exergy efficiency', b.efficiency, '-'],
  ];
  return (
    <table className="grid-table" data-testid="fit-stats">
      <thead>
        <tr>
          <th>Model</th>
          <th className="num">Hours</th>
          <th className="num">Mean</th>
          <th className="num">s</th>
          <th className="num">R² [-]</th>
          <th className="num">CV(RMSE) [%]</th>
          <th className="num">NMBE [%]</th>
          <th>Guideline 14, hourly</th>
        </tr>
      </thead>
      <tbody>
        {rows.map(([name, m, unit]) =>
          m ? (
            <tr key={name} data-testid={`stats-${unit === 'kW' ? 'destruction' : 'efficiency'}`}>
              <td>{name}</td>
              <td className="num">{m.stats.n}</td>
              <td className="num">{unit === 'kW' ? `${kW(m.stats.ybar)} kW` : sig(m.stats.ybar, 3)}</td>
              <td className="num">{unit === 'kW' ? `${kW(m.stats.s, 2)} kW` : sig(m.stats.s, 3)}</td>
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
      </tbody>
    </table>
  );
}

function Coefficients({ b }: { b: BaselineSummary }) {
  const terms = ['intercept', ...b.terms] as const;
  return (
    <table className="grid-table mt-3 text-xs">
      <thead>
        <tr>
          <th>Term (load in {b.loadUnit ?? 'its unit'}, T_amb = T0 in K)</th>
          <th className="num">Destruction [W per term unit]</th>
          <th className="num">Efficiency [- per term unit]</th>
        </tr>
      </thead>
      <tbody>
        {terms.map((t) => (
          <tr key={t}>
            <td>{t === 'intercept' ? 'intercept' : TERM_LABELS[t]}</td>
            <td className="num">{sig(b.destruction.coefficients[t], 6)}</td>
            <td className="num">{b.efficiency ? sig(b.efficiency.coefficients[t], 6) : '–'}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** Measured hours against load with the fitted curve at the period's mean T0. */
function FitChart({ b, fit }: { b: BaselineSummary; fit: FitView }) {
  const [what, setWhat] = useState<'destruction' | 'efficiency'>('destruction');
  const eff = what === 'efficiency' && b.efficiency !== null;
  const points = fit.points.map((p) => ({ load: p.load, y: eff ? p.efficiency : p.destruction_W / 1000 })).filter((p) => p.y !== null);
  const curve = fit.curve.map((c) => ({ load: c.load, y: eff ? c.efficiency : c.destruction_W / 1000 }));
  return (
    <div>
      <div className="mb-2 flex items-center gap-3 text-sm">
        <label className="flex items-center gap-1">
          <input type="radio" name="fit-what" checked={!eff} onChange={() => setWhat('destruction')} /> Exergy destruction [kW]
        </label>
        <label className="flex items-center gap-1">
          <input type="radio" name="fit-what" checked={eff} disabled={!b.efficiency} onChange={() => setWhat('efficiency')} /> Exergy efficiency [-]
        </label>
      </div>
      <div className="h-72" data-testid="fit-chart" role="img" aria-label={`${eff ? 'Efficiency' : 'Destruction'} of the reference hours against load, with the fitted curve`}>
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
            <CartesianGrid stroke="#ddd3bf" strokeDasharray="3 3" />
            <XAxis
              type="number"
              dataKey="load"
              domain={['auto', 'auto']}
              tickFormatter={(v: number) => sig(v, 3)}
              label={{ value: `Load [${b.loadUnit ?? '-'}]`, position: 'insideBottom', offset: -12, fill: '#4a463e', fontSize: 12 }}
              stroke="#4a463e"
              fontSize={12}
            />
            <YAxis type="number" dataKey="y" domain={['auto', 'auto']} tickFormatter={(v: number) => sig(v, 3)} stroke="#4a463e" fontSize={12} width={64} />
            <Tooltip formatter={(v) => sig(Number(v), 4)} labelFormatter={(v) => `load ${sig(Number(v), 4)}`} />
            <Legend verticalAlign="top" height={24} />
            <Scatter name={fit.totalPoints && fit.totalPoints > fit.points.length ? `${fit.points.length} of ${fit.totalPoints} steady reference hours, evenly chosen` : 'Steady reference hours'} data={points} fill={eff ? '#1f7a72' : '#b5562a'} shape="circle" isAnimationActive={false} />
            <Line
              name={`Fitted at mean T0 ${sig(fit.meanT0_K, 4)} K`}
              data={curve}
              dataKey="y"
              type="monotone"
              stroke="#22201c"
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

export default function BaselineDetail({ baselineId, canEdit }: { baselineId: string; canEdit: boolean }) {
  const [data, setData] = useState<{ baseline: BaselineSummary; fit: FitView } | null>(null);
  const [message, setMessage] = useState<Message>(null);
  const [busy, setBusy] = useState(false);

  useEffect(() => {
    let live = true;
    setData(null);
    call<{ baseline: BaselineSummary; fit: FitView }>(`/api/baselines/${baselineId}`)
      .then((d) => live && setData(d))
      .catch((e) => live && setMessage(messageOf(e)));
    return () => {
      live = false;
    };
  }, [baselineId]);

  async function decide(what: 'accept' | 'discard') {
    setBusy(true);
    setMessage(null);
    try {
      const { baseline } = await call<{ baseline: BaselineSummary }>(`/api/baselines/${baselineId}/${what}`, 'POST', {});
      setData((d) => (d ? { ...d, baseline } : d));
      setMessage({
        ok: true,
        text: what === 'accept' ? `Version ${baseline.version} is now the active baseline of ${baseline.unitName}.` : `Version ${baseline.version} is discarded.`,
      });
    } catch (e) {
      setMessage(messageOf(e));
    } finally {
      setBusy(false);
    }
  }

  if (!data) {
    return message ? <Notice message={message} /> : <p className="text-sm text-ink-faint" role="status">Loading the baseline…</p>;
  }
  const b = data.baseline;
  const look = BASELINE_LOOK[b.status]!;
  return (
    <section className="card space-y-4" data-testid="baseline-detail">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <div>
          <h2>
            {b.unitName} · version {b.version}
          </h2>
          <p className="text-sm text-ink-soft">
            {b.siteName} · reference period {dayOf(b.periodFrom, b.timeZone)} to {dayOf(new Date(new Date(b.periodTo).getTime() - 1).toISOString(), b.timeZone)} ({b.timeZone}) · terms{' '}
            {b.terms.map((t) => TERM_LABELS[t]).join(', ')} · fitted by {b.createdBy ?? 'someone'} on {at(b.createdAt, b.timeZone)}
          </p>
        </div>
        <span data-testid="baseline-status">
          <StateMark shape={look.shape} className={look.className} label={look.label} />
        </span>
      </div>
      <StatsTable b={b} />
      <FitTrustNote b={b} />
      <p className="text-xs text-ink-faint">
        ASHRAE Guideline 14-2014 hourly criteria: CV(RMSE) at most 30 % and NMBE within ±10 % (limits from memory;{' '}
        <a href="/help/method#baselines">how baselines are fitted and judged</a>). NMBE is zero by construction on the hours a model was fitted to.
      </p>
      <FitChart b={b} fit={data.fit} />
      <Coefficients b={b} />
      {b.decidedAt && (
        <p className="text-sm text-ink-soft">
          {b.status === 'discarded' ? 'Discarded' : 'Accepted'} by {b.decidedBy ?? 'someone'} on {at(b.decidedAt, b.timeZone)}
          {b.retiredAt ? `; retired on ${at(b.retiredAt, b.timeZone)}` : ''}.
        </p>
      )}
      <Notice message={message} />
      {canEdit && b.status === 'draft' && (
        <div className="flex flex-wrap items-center gap-2">
          <button type="button" className="btn btn-primary" disabled={busy || !b.trust.acceptable} onClick={() => decide('accept')}>
            Accept as active baseline
          </button>
          <button type="button" className="btn" disabled={busy} onClick={() => decide('discard')}>
            Discard
          </button>
          {!b.meetsGuideline14 && <span className="text-sm text-copper-deep">This fit is outside the Guideline 14 criteria; accept it only knowingly.</span>}
        </div>
      )}
    </section>
  );
}
