import { useState } from 'react';
import { StateMark } from '~/components/StateMark';
import { useConfirm, type ConfirmOptions } from '~/components/ConfirmDialog';
import { Notice as Message } from '~/components/plant/common';
import { call, messageOf, type Message as Msg } from '~/components/api';
import { at, atZ, dayOf } from '../baselines/looks';
import { NoticeChart } from './NoticeChart';
import type { ChartColumns } from '~/lib/analytics/chart-thin';
import {
  LIFE_LOOK,
  NOTICE_LOOK,
  OUTCOME_WORDS,
  PRIOR_WORDS,
  TREND_LOOK,
  noticeFigures,
  type Notice,
  type NoticeChartEvent,
} from './looks';
import type { CloseOutcome } from '~/lib/notice-view';
import RuleNoticeSummary from './RuleNoticeSummary';

function Figure({ label, value, unit, sub, testId }: { label: string; value: string; unit?: string; sub?: string; testId?: string }) {
  return (
    <div className="rounded border border-paper-edge bg-white/70 px-3 py-2">
      <dt className="text-xs text-ink-soft">{label}</dt>
      <dd className="text-lg font-semibold tabular-nums">
        <span data-testid={testId}>
          {value} {unit && <span className="text-sm font-normal text-ink-soft">{unit}</span>}
        </span>
        {sub && (
          <span className="ml-1 text-sm font-normal text-ink-soft" data-testid={testId ? `${testId}-u` : undefined}>
            {sub}
          </span>
        )}
      </dd>
    </div>
  );
}

const yesNo = (v: boolean | null) => (v === null ? 'not known' : v ? 'yes' : 'no');

/** The verdict on a repair, or what it waits for. */
function Verdict({ n }: { n: Notice }) {
  if (n.closeOutcome !== 'repaired' || !n.repairedAt) return null;
  const v = n.verdict;
  const f = noticeFigures(n);
  return (
    <section className="card space-y-2" aria-label="Repair verdict" data-testid="notice-verdict">
      <h2>After the repair</h2>
      <p className="text-sm">
        Repaired on {dayOf(n.repairedAt, n.timeZone)} ({n.timeZone}). The drift check restarted the cumulative sums at that date and compares the
        steady hours after it (the reporting period) with the expected destruction plus the shift measured before the repair (the adjusted baseline).
      </p>
      {!v ? (
        <p className="text-sm text-ink-soft" data-testid="verdict-waiting">
          Waiting for 72 steady hours after the repair before giving the verdict.
        </p>
      ) : (
        <>
          <p className="text-base font-semibold" data-testid="verdict-word">
            {v.back ? 'Back within the expected band' : 'Not back: the shift is still there'}
          </p>
          <table className="grid-table text-sm">
            <tbody>
              <tr>
                <td>Shift before the repair (last {v.beforeHours} steady hours)</td>
                <td className="num">{f.signed(v.before_W, v.beforeU_W)}</td>
              </tr>
              <tr>
                <td>Residual after the repair (first {v.afterHours} steady hours, to {atZ(v.hour, n.timeZone)})</td>
                <td className="num" data-testid="verdict-after">
                  {f.signed(v.after_W, v.afterU_W)}
                </td>
              </tr>
              <tr>
                <td>Avoided extra destruction</td>
                <td className="num">{f.signed(v.avoided_W, v.avoidedU_W)}</td>
              </tr>
              <tr>
                <td>Avoided cost per month (30.44 days)</td>
                <td className="num" data-testid="verdict-avoided">
                  {v.avoidedCost_per_month === null
                    ? 'not known (no cost rate)'
                    : f.moneyU(v.avoidedCost_per_month, v.avoidedCostU_per_month)}
                </td>
              </tr>
            </tbody>
          </table>
          <p className="text-xs text-ink-faint">Uncertainties are expanded (k = 2): the spread of the residuals and the measurement uncertainty of the hours, combined.</p>
          {n.followUpNoticeId && (
            <p className="text-sm">
              The shift continues in <a href={`/notices/${n.followUpNoticeId}`}>a new notice</a>.
            </p>
          )}
        </>
      )}
    </section>
  );
}

/** Closing asks what was done. */
function CloseForm({ n, busy, onClose }: { n: Notice; busy: boolean; onClose: (body: Record<string, string>) => void }) {
  const [comment, setComment] = useState('');
  const [outcome, setOutcome] = useState<CloseOutcome | ''>('');
  const [date, setDate] = useState('');
  const [error, setError] = useState<string | null>(null);
  function submit() {
    setError(null);
    if (!comment.trim()) return setError('Say why the notice is closed (what was found or done).');
    if (outcome === 'repaired' && !date) return setError('Give the date of the repair work.');
    const body: Record<string, string> = { comment: comment.trim() };
    if (outcome) body.outcome = outcome;
    if (outcome === 'repaired') body.repairedAt = date;
    if (outcome === 'new-normal' && date) body.newNormalFrom = date;
    onClose(body);
  }
  return (
    <fieldset className="space-y-2">
      <legend className="label">What was done</legend>
      <div className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
        {(Object.keys(OUTCOME_WORDS) as CloseOutcome[]).map((o) => (
          <label key={o} className="flex items-center gap-1">
            <input type="radio" name="close-outcome" value={o} checked={outcome === o} onChange={() => setOutcome(o)} /> {OUTCOME_WORDS[o]}
          </label>
        ))}
      </div>
      {outcome === 'repaired' && (
        <div>
          <label className="label" htmlFor="repair-date">
            Date of the repair work ({n.timeZone})
          </label>
          <input id="repair-date" type="date" className="field" value={date} onChange={(e) => setDate(e.target.value)} />
          <p className="text-xs text-ink-faint">The drift check restarts the sums at this date and gives the verdict after 72 steady hours.</p>
        </div>
      )}
      {outcome === 'new-normal' && (
        <div>
          <label className="label" htmlFor="normal-date">
            New normal from ({n.timeZone})
          </label>
          <input id="normal-date" type="date" className="field" value={date} onChange={(e) => setDate(e.target.value)} />
          <p className="text-xs">
            <a href={`/baselines/new?unit=${n.unitId}${date ? `&from=${date}` : ''}`} data-testid="new-baseline-link">
              Fit a new baseline version from {date || 'this date'}
            </a>{' '}
            (choose its reference period from that date once enough steady hours have passed).
          </p>
        </div>
      )}
      <label className="label" htmlFor="close-comment">
        Why it can be closed (required)
      </label>
      <textarea id="close-comment" className="field" rows={2} value={comment} onChange={(e) => setComment(e.target.value)} maxLength={2000} />
      {error && (
        <p role="alert" className="notice-error">
          {error}
        </p>
      )}
      <button type="button" className="btn" disabled={busy} onClick={submit}>
        Close notice
      </button>
    </fieldset>
  );
}

/** The question before closing: a closed notice takes no later signal. */
function closeQuestion(n: Notice): ConfirmOptions {
  return {
    title: `Close the notice of ${n.unitName}?`,
    body: 'A closed notice is not reopened; a later shift of this unit opens a new notice.',
    confirm: 'Close the notice',
  };
}

/** A drift notice: the live headline, chart, history, the caution, and seen / close for those who act on notices. */
export default function NoticePanel({
  initial,
  chart,
  caution,
  canAct,
}: {
  initial: Notice;
  /** What the chart draws (src/lib/analytics/chart-thin.ts), thinned and rounded on the server. */
  chart: ChartColumns & { events: NoticeChartEvent[] };
  caution: string;
  canAct: boolean;
}) {
  const [n, setN] = useState(initial);
  const [ackComment, setAckComment] = useState('');
  const [message, setMessage] = useState<Msg>(null);
  const [busy, setBusy] = useState(false);
  const { dialog, ask } = useConfirm();
  const look = NOTICE_LOOK[n.status]!;
  const life = LIFE_LOOK[n.life];
  const more = n.direction === 'up';
  const hoursNow = n.currentHours ?? n.hours;
  const f = noticeFigures(n);
  const [headV, headU] = f.parts(n.headline_W, n.headlineU_W);
  const [costV, costU] = f.moneyParts(n.headlineCost_per_day, n.headlineCostU_per_day);

  async function act(what: 'acknowledge' | 'close', body: Record<string, string>) {
    if (what === 'close' && !(await ask(closeQuestion(n)))) return;
    setMessage(null);
    setBusy(true);
    try {
      const out = await call<{ notice: Notice }>(`/api/notices/${n.id}/${what}`, 'POST', body);
      setN({ ...out.notice, display: out.notice.display ?? n.display });
      setMessage({ ok: true, text: what === 'close' ? 'The notice is closed.' : 'Marked as seen.' });
    } catch (e) {
      setMessage(messageOf(e));
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="space-y-6">
      {dialog}
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
          <span className="flex gap-4">
            <span data-testid="notice-life">
              <StateMark shape={life.shape} className={life.className} label={life.label} />
            </span>
            <span data-testid="notice-status">
              <StateMark shape={look.shape} className={look.className} label={look.label} />
            </span>
          </span>
        </div>
        {n.fadedSince && (
          <p className="rounded border border-slate px-3 py-2 text-sm" data-testid="notice-faded">
            Faded since {atZ(n.fadedSince, n.timeZone)}: over a day of steady hours the shift has gone. This notice takes no later signal; a
            new shift opens a new notice.
          </p>
        )}
        {n.supersededBy && (
          <p className="rounded border border-slate px-3 py-2 text-sm" data-testid="notice-superseded">
            A later, clearly larger shift of this unit has <a href={`/notices/${n.supersededBy}`}>its own notice</a>.
          </p>
        )}
        {n.priorNoticeId && n.priorReason && (
          <p className="text-sm" data-testid="notice-prior">
            Opened for {PRIOR_WORDS[n.priorReason]}: <a href={`/notices/${n.priorNoticeId}`}>the earlier notice</a>.
          </p>
        )}
        <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-5">
          <Figure label={`Extra destruction now (last ${hoursNow} steady hours)`} value={headV} unit={f.unit} sub={headU} testId="fig-extra" />
          <Figure
            label="Cost per day now"
            value={n.headlineCost_per_day === null ? 'not known' : costV}
            unit={n.headlineCost_per_day === null ? undefined : `${n.currency}/day`}
            sub={costU || undefined}
            testId="fig-cost"
          />
          <div className="rounded border border-paper-edge bg-white/70 px-3 py-2">
            <dt className="text-xs text-ink-soft">The shift is</dt>
            <dd className="text-lg font-semibold" data-testid="fig-trend">
              {n.trend ? <StateMark shape={TREND_LOOK[n.trend].shape} className={TREND_LOOK[n.trend].className} label={TREND_LOOK[n.trend].label} /> : 'not yet known'}
            </dd>
          </div>
          <Figure label={`Since (onset estimate, ${n.timeZone})`} value={at(n.onsetHour, n.timeZone)} testId="fig-since" />
          <Figure label="Beyond measurement uncertainty (now)" value={yesNo(n.headlineExceeds)} testId="fig-uncertainty" />
        </dl>
        <table className="grid-table text-sm">
          <tbody>
            <tr>
              <td>Now: mean of the last {hoursNow} steady hours{n.figuresHour ? ` (to ${atZ(n.figuresHour, n.timeZone)})` : ''}</td>
              <td className="num">{f.signed(n.headline_W, n.headlineU_W)}</td>
            </tr>
            {n.sinceOnset_W !== null && (
              <tr>
                <td>Since onset: mean of {n.sinceOnsetHours} steady hours</td>
                <td className="num" data-testid="fig-since-onset">
                  {f.signed(n.sinceOnset_W, n.sinceOnsetU_W)}
                </td>
              </tr>
            )}
            <tr>
              <td>At signal: mean of the {n.hours} steady hours from onset to signal (the first figure)</td>
              <td className="num" data-testid="fig-first">
                {f.signed(n.extra_W)}
                {n.extraCost_per_day !== null ? `, ${n.currency} ${f.money(n.extraCost_per_day)}/day` : ''}
              </td>
            </tr>
            <tr>
              <td>Expected destruction over the first hours</td>
              <td className="num">{f.power(n.expected_W)}</td>
            </tr>
            <tr>
              <td>Shift at signal in units of σ, the spread of the residuals of the baseline’s fit</td>
              <td className="num">{f.w.number(n.shift_sigma, 2)} σ</td>
            </tr>
            <tr>
              <td>Sustained shift confirmed</td>
              <td className="num">
                {atZ(n.signalHour, n.timeZone)}
                {n.lastSignalHour !== n.signalHour && ` (still signalling ${atZ(n.lastSignalHour, n.timeZone)})`}
              </td>
            </tr>
            <tr>
              <td>Measurement uncertainty of the current figure, U(one hour)/√n (k = 2)</td>
              <td className="num">
                {n.currentMeasU_W !== null ? f.plusMinus(n.currentMeasU_W) : n.shiftU_W !== null && n.current_W === null ? f.plusMinus(n.shiftU_W) : 'not known'}
                {n.hourU_W !== null && <span className="text-ink-faint"> (one hour {f.plusMinus(n.hourU_W)})</span>}
              </td>
            </tr>
            <tr>
              <td>Cost basis</td>
              <td className="num">{n.costBasis ?? "none: the hours carry no cost and the site has no price for the unit's fuel"}</td>
            </tr>
            <tr>
              <td>Cumulative sum settings</td>
              <td className="num">
                allowance k = {n.k} σ, decision limit h = {n.h} σ
              </td>
            </tr>
          </tbody>
        </table>
        <p className="text-xs text-ink-faint">
          The figures are recomputed at every drift check. The ± is the expanded uncertainty (k = 2) of a mean: the spread of the residuals σ over the
          effective number of independent hours (fewer than the hours when the residuals are correlated from hour to hour), combined with the
          measurement uncertainty. “Beyond measurement uncertainty” compares the current figure with the measurement part alone; when the shift is
          smaller than one hour’s uncertainty, check the instruments first. The shift is growing (or receding) when the current figure is above (or
          below) the mean since onset by more than their combined uncertainty.
        </p>
        <NoticeChart notice={n} chart={chart} events={chart.events} />
      </section>
      )}

      <Verdict n={n} />

      <section className="card space-y-3" aria-label="What has been done">
        <h2>Record</h2>
        <ul className="space-y-1 text-sm" data-testid="notice-history">
          <li>Opened {atZ(n.openedAt, n.timeZone)}; e-mailed to the maintenance planners and energy leads.</li>
          {n.escalationStep > 0 && <li>E-mailed again {n.escalationStep === 1 ? 'once' : `${n.escalationStep} times`} as its cost per day grew.</li>}
          {n.acknowledgedAt && (
            <li>
              Seen by {n.acknowledgedBy ?? 'someone'} at {atZ(n.acknowledgedAt, n.timeZone)}
              {n.acknowledgeComment ? `: ${n.acknowledgeComment}` : ''}
            </li>
          )}
          {n.closedAt && (
            <li>
              Closed by {n.closedBy ?? 'someone'} at {atZ(n.closedAt, n.timeZone)}
              {n.closeOutcome ? ` (${OUTCOME_WORDS[n.closeOutcome]}${n.repairedAt ? `, work done ${dayOf(n.repairedAt, n.timeZone)}` : ''}${n.newNormalFrom ? ` from ${dayOf(n.newNormalFrom, n.timeZone)}` : ''})` : ''}: {n.closeComment}
            </li>
          )}
        </ul>
        {n.closeOutcome === 'new-normal' && (
          <p className="text-sm">
            <a href={`/baselines/new?unit=${n.unitId}${n.newNormalFrom ? `&from=${dayOf(n.newNormalFrom, n.timeZone)}` : ''}`}>Fit a new baseline version</a> for
            the new normal.
          </p>
        )}
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
                <button type="button" className="btn btn-primary" disabled={busy} onClick={() => act('acknowledge', ackComment.trim() ? { comment: ackComment.trim() } : {})}>
                  Mark as seen
                </button>
              </div>
            )}
            <CloseForm n={n} busy={busy} onClose={(body) => act('close', body)} />
          </div>
        )}
      </section>
    </div>
  );
}
