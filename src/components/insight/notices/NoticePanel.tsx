import { useState } from 'react';
import { Bar, CartesianGrid, ComposedChart, Legend, Line, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { StateMark } from '../../StateMark';
import { Notice as Message, call, messageOf, type Message as Msg } from '../../plant/common';
import { at, sig } from '../baselines/looks';
import { NOTICE_LOOK, money, signedKW, type Notice, type SeriesPoint } from './looks';
import RuleNoticeSummary from './RuleNoticeSummary';

function Figure({ label, value, unit, testId }: { label: string; value: string; unit?: string; testId?: string }) {
  return (
    <div className="rounded border border-paper-edge bg-white/70 px-3 py-2">
      <dt className="text-xs text-ink-soft">{label}</dt>
      <dd className="text-lg font-semibold tabular-nums" data-testid={testId}>
        {value} {unit && <span className="text-sm font-normal text-ink-soft">{unit}</span>}
      </dd>
    </div>
  );
}

/** Residual per steady hour [kW] and the CUSUM sums [s] around the notice, with h and the onset marked. */
function DriftChart({ notice, series }: { notice: Notice; series: SeriesPoint[] }) {
  if (!series.length) return <p className="text-sm text-ink-faint">The hours behind this notice are no longer in the drift check (the baseline or settings changed).</p>;
  const data = series.map((p) => ({ t: new Date(p.hourStart).getTime(), residual: p.residual_W / 1000, cPlus: p.cPlus, cMinus: p.cMinus }));
  const tick = (t: number) => at(new Date(t).toISOString(), notice.timeZone).slice(5);
  return (
    <div className="h-72" data-testid="drift-chart" role="img" aria-label="Destruction residual per steady hour and the cumulative sums, with the decision interval h">
      <ResponsiveContainer width="100%" height="100%">
        <ComposedChart data={data} margin={{ top: 8, right: 8, bottom: 8, left: 8 }}>
          <CartesianGrid stroke="#ddd3bf" strokeDasharray="3 3" />
          <XAxis dataKey="t" type="number" scale="time" domain={['dataMin', 'dataMax']} tickFormatter={tick} stroke="#4a463e" fontSize={11} />
          <YAxis yAxisId="kW" tickFormatter={(v: number) => sig(v, 3)} stroke="#8e3f1c" fontSize={11} width={56} label={{ value: 'residual [kW]', angle: -90, position: 'insideLeft', fill: '#8e3f1c', fontSize: 11 }} />
          <YAxis yAxisId="s" orientation="right" domain={[0, (max: number) => Math.max(max, notice.h * 1.25)]} tickFormatter={(v: number) => sig(v, 3)} stroke="#22201c" fontSize={11} width={48} label={{ value: 'CUSUM [s]', angle: 90, position: 'insideRight', fill: '#22201c', fontSize: 11 }} />
          <Tooltip labelFormatter={(t) => `${at(new Date(Number(t)).toISOString(), notice.timeZone)} (${notice.timeZone})`} formatter={(v) => Number(v).toFixed(2)} />
          <Legend verticalAlign="top" height={24} />
          <Bar yAxisId="kW" dataKey="residual" name="Measured − expected destruction [kW]" fill="#b5562a" isAnimationActive={false} />
          <Line yAxisId="s" dataKey="cPlus" name="C+ (more destruction) [s]" stroke="#22201c" dot={false} strokeWidth={2} isAnimationActive={false} />
          <Line yAxisId="s" dataKey="cMinus" name="C− (less destruction) [s]" stroke="#66707c" strokeDasharray="4 3" dot={false} strokeWidth={2} isAnimationActive={false} />
          <ReferenceLine yAxisId="s" y={notice.h} stroke="#22201c" strokeDasharray="2 4" label={{ value: `h = ${notice.h}`, position: 'right', fontSize: 11 }} />
          <ReferenceLine yAxisId="s" x={new Date(notice.onsetHour).getTime()} stroke="#8e3f1c" label={{ value: 'onset', position: 'insideTopLeft', fontSize: 11 }} />
          <ReferenceLine yAxisId="s" x={new Date(notice.signalHour).getTime()} stroke="#22201c" label={{ value: 'signal', position: 'insideTopRight', fontSize: 11 }} />
        </ComposedChart>
      </ResponsiveContainer>
    </div>
  );
}

/** A drift notice: figures, chart, history, the caution, and seen / close for those who act on notices. */
export default function NoticePanel({ initial, series, caution, canAct }: { initial: Notice; series: SeriesPoint[]; caution: string; canAct: boolean }) {
  const [n, setN] = useState(initial);
  const [ackComment, setAckComment] = useState('');
  const [closeComment, setCloseComment] = useState('');
  const [message, setMessage] = useState<Msg>(null);
  const [busy, setBusy] = useState(false);
  const look = NOTICE_LOOK[n.status]!;
  const more = n.direction === 'up';

  async function act(what: 'acknowledge' | 'close') {
    setMessage(null);
    if (what === 'close' && !closeComment.trim()) {
      setMessage({ ok: false, text: 'Say why the notice is closed (what was found or done).' });
      return;
    }
    setBusy(true);
    try {
      const body = what === 'close' ? { comment: closeComment.trim() } : ackComment.trim() ? { comment: ackComment.trim() } : {};
      const out = await call<{ notice: Notice }>(`/api/notices/${n.id}/${what}`, 'POST', body);
      setN(out.notice);
      setMessage({ ok: true, text: what === 'close' ? 'The notice is closed.' : 'Marked as seen.' });
    } catch (e) {
      setMessage(messageOf(e));
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="space-y-6">
      {n.kind !== 'drift' ? (
        <RuleNoticeSummary notice={n} />
      ) : (
      <section className="card space-y-4">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <p className="text-sm text-ink-soft">
            {n.unitName} at {n.siteName} destroys {more ? 'more' : 'less'} exergy than expected
            {n.baselineLabel && (
              <>
                {' '}
                against <a href={`/baselines/${n.baselineId}`}>{n.baselineLabel}</a>
              </>
            )}
            .
          </p>
          <span data-testid="notice-status">
            <StateMark shape={look.shape} className={look.className} label={look.label} />
          </span>
        </div>
        <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          <Figure label="Extra destruction (mean since onset)" value={signedKW(n.extra_W)} unit="kW" testId="fig-extra" />
          <Figure label="Cost per day" value={n.extraCost_per_day === null ? 'not known' : money(n.extraCost_per_day)} unit={n.extraCost_per_day === null ? undefined : `${n.currency}/day`} testId="fig-cost" />
          <Figure label={`Since (onset estimate, ${n.timeZone})`} value={at(n.onsetHour, n.timeZone)} testId="fig-since" />
          <Figure
            label="Beyond measurement uncertainty"
            value={n.exceedsUncertainty === null ? 'not known' : n.exceedsUncertainty ? 'yes' : 'no'}
            testId="fig-uncertainty"
          />
        </dl>
        <table className="grid-table text-sm">
          <tbody>
            <tr>
              <td>Expected destruction over the same hours</td>
              <td className="num">{(n.expected_W / 1000).toFixed(1)} kW</td>
            </tr>
            <tr>
              <td>Shift in units of the baseline’s residual spread s</td>
              <td className="num">{n.shift_sigma.toFixed(2)} s</td>
            </tr>
            <tr>
              <td>Steady hours from onset to signal</td>
              <td className="num">{n.hours}</td>
            </tr>
            <tr>
              <td>Sustained shift confirmed</td>
              <td className="num">
                {at(n.signalHour, n.timeZone)}
                {n.lastSignalHour !== n.signalHour && ` (still signalling ${at(n.lastSignalHour, n.timeZone)})`}
              </td>
            </tr>
            <tr>
              <td>Uncertainty of the shift, U(one hour)/√n (k = 2)</td>
              <td className="num">
                {n.shiftU_W === null ? 'not known' : `± ${(n.shiftU_W / 1000).toFixed(1)} kW`}
                {n.hourU_W !== null && <span className="text-ink-faint"> (one hour ± {(n.hourU_W / 1000).toFixed(1)} kW)</span>}
              </td>
            </tr>
            <tr>
              <td>Cost basis</td>
              <td className="num">{n.costBasis ?? 'none: the hours carry no cost and the site has no fuel price'}</td>
            </tr>
            <tr>
              <td>CUSUM settings</td>
              <td className="num">
                k = {n.k} s, h = {n.h} s
              </td>
            </tr>
          </tbody>
        </table>
        <p className="text-xs text-ink-faint">
          The shift exceeds the measurement uncertainty when it is larger than the expanded uncertainty of one hour’s destruction divided by √n (the
          mean of n independent hours). A slowly drifting instrument is not independent from hour to hour: when the shift is smaller than one hour’s
          uncertainty, check the instruments first.
        </p>
        <DriftChart notice={n} series={series} />
      </section>
      )}

      <section className="card space-y-3" aria-label="What has been done">
        <h2>Record</h2>
        <ul className="space-y-1 text-sm" data-testid="notice-history">
          <li>Opened {at(n.openedAt, n.timeZone)}; e-mailed to the maintenance planners and energy leads.</li>
          {n.acknowledgedAt && (
            <li>
              Seen by {n.acknowledgedBy ?? 'someone'} at {at(n.acknowledgedAt, n.timeZone)}
              {n.acknowledgeComment ? `: ${n.acknowledgeComment}` : ''}
            </li>
          )}
          {n.closedAt && (
            <li>
              Closed by {n.closedBy ?? 'someone'} at {at(n.closedAt, n.timeZone)}: {n.closeComment}
            </li>
          )}
        </ul>
        <p className="caution" data-testid="notice-caution">
          {caution}
        </p>
        <Message message={message} />
        {canAct && n.status !== 'closed' && (
          <div className="grid gap-4 md:grid-cols-2">
            {n.status === 'open' && (
              <div className="space-y-2">
                <label className="label" htmlFor="ack-comment">
                  Comment (optional)
                </label>
                <input id="ack-comment" className="field" value={ackComment} onChange={(e) => setAckComment(e.target.value)} maxLength={2000} />
                <button type="button" className="btn btn-primary" disabled={busy} onClick={() => act('acknowledge')}>
                  Mark as seen
                </button>
              </div>
            )}
            <div className="space-y-2">
              <label className="label" htmlFor="close-comment">
                Why it can be closed (required)
              </label>
              <textarea id="close-comment" className="field" rows={2} value={closeComment} onChange={(e) => setCloseComment(e.target.value)} maxLength={2000} />
              <button type="button" className="btn" disabled={busy} onClick={() => act('close')}>
                Close notice
              </button>
            </div>
          </div>
        )}
      </section>
    </div>
  );
}
