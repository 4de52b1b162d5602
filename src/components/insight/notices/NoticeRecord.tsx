import { useState } from 'react';
import { Notice as Message } from '~/components/plant/common';
import type { Message as Msg } from '~/components/api';
import { atZ, dayOf } from '../baselines/looks';
import { OUTCOME_WORDS, noticeFigures, type Notice } from './looks';
import type { CloseOutcome } from '~/lib/notice-view';

/** The verdict on a repair, or what it waits for. */
export function Verdict({ n }: { n: Notice }) {
  if (n.closeOutcome !== 'repaired' || !n.repairedAt) return null;
  const v = n.verdict;
  const f = noticeFigures(n);
  return (
    <section className="card space-y-2" aria-label="Repair verdict" data-testid="notice-verdict">
      <h2>After the repair</h2>
      <p className="text-sm">
        Repaired on {dayOf(n.repairedAt, n.timeZone)} ({n.timeZone}). The drift check restarted the cumulative sums at that date and compares the steady hours
        after it (the reporting period) with the expected destruction plus the shift measured before the repair (the adjusted baseline).
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
                <td>
                  Residual after the repair (first {v.afterHours} steady hours, to {atZ(v.hour, n.timeZone)})
                </td>
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
                  {v.avoidedCost_per_month === null ? 'not known (no cost rate)' : f.moneyU(v.avoidedCost_per_month, v.avoidedCostU_per_month)}
                </td>
              </tr>
            </tbody>
          </table>
          <p className="text-xs text-ink-faint">
            Uncertainties are expanded (k = 2): the spread of the residuals and the measurement uncertainty of the hours, combined.
          </p>
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

/** Marking as seen, with an optional comment. */
function SeenForm({ busy, onSeen }: { busy: boolean; onSeen: (body: Record<string, string>) => void }) {
  const [ackComment, setAckComment] = useState('');
  return (
    <div className="space-y-2">
      <label className="label" htmlFor="ack-comment">
        Comment (optional)
      </label>
      <input id="ack-comment" className="field" value={ackComment} onChange={(e) => setAckComment(e.target.value)} maxLength={2000} />
      <button type="button" className="btn btn-primary" disabled={busy} onClick={() => onSeen(ackComment.trim() ? { comment: ackComment.trim() } : {})}>
        Mark as seen
      </button>
    </div>
  );
}

/** What happened to the notice: opened, e-mailed again, seen, closed (and how). */
function NoticeHistory({ n }: { n: Notice }) {
  return (
    <ul className="space-y-1 text-sm" data-testid="notice-history">
      <li>Opened {atZ(n.openedAt, n.timeZone)}; e-mailed to {n.direction === 'down' ? 'the energy leads (less destruction is theirs to judge)' : 'the maintenance planners and energy leads'}.</li>
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
          {n.closeOutcome
            ? ` (${OUTCOME_WORDS[n.closeOutcome]}${n.repairedAt ? `, work done ${dayOf(n.repairedAt, n.timeZone)}` : ''}${n.newNormalFrom ? ` from ${dayOf(n.newNormalFrom, n.timeZone)}` : ''})`
            : ''}
          : {n.closeComment}
        </li>
      )}
    </ul>
  );
}

interface RecordProps {
  n: Notice;
  caution: string;
  canAct: boolean;
  message: Msg;
  busy: boolean;
  act: (what: 'acknowledge' | 'close', body: Record<string, string>) => void;
}

/** The record of the notice, the caution, and seen / close for those who act on notices. */
export function NoticeRecord({ n, caution, canAct, message, busy, act }: RecordProps) {
  return (
    <section className="card space-y-3" aria-label="What has been done">
      <h2>Record</h2>
      <NoticeHistory n={n} />
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
          {n.status === 'open' && <SeenForm busy={busy} onSeen={(body) => act('acknowledge', body)} />}
          <CloseForm n={n} busy={busy} onClose={(body) => act('close', body)} />
        </div>
      )}
    </section>
  );
}
