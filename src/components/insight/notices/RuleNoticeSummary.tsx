import { StateMark } from '~/components/StateMark';
import { at, atZ } from '../baselines/looks';
import { NOTICE_LOOK, noticeFigures, type Notice } from './looks';

/**
 * The figures of an idle or limit notice (a unit declared normally idle ran; a unit crossed a limit
 * set for it): what rule, the destruction and its cost per day over the latest run, and when.
 */
export default function RuleNoticeSummary({ notice: n }: { notice: Notice }) {
  const f = noticeFigures(n);
  const rows: [string, string][] = [
    ['Rule', n.kind === 'idle' ? (n.ruleText ?? 'normally idle') : (n.ruleText ?? 'a limit set for the unit')],
    ['Hours in a row before a notice', `more than ${n.ruleHours ?? 3}`],
    [`Running since (${n.timeZone})`, at(n.onsetHour, n.timeZone)],
    ['Rule broken for more than the set hours at', atZ(n.signalHour, n.timeZone)],
    ['Latest hour', atZ(n.lastSignalHour, n.timeZone)],
    ['Hours of the latest run', f.w.number(n.hours, 0)],
    ['Cost basis', n.costBasis ?? 'none: the hours carry no cost'],
  ];
  if (n.meanEfficiency !== null && n.kind === 'limit') rows.splice(6, 0, ['Exergy efficiency (mean of the latest run)', `${f.w.value(n.meanEfficiency, 'ratio', 1)} %`]);
  const look = NOTICE_LOOK[n.status]!;
  return (
    <section className="card space-y-4" data-testid="rule-notice">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <p className="text-sm text-ink-soft">
          {n.kind === 'idle'
            ? `${n.unitName} at ${n.siteName} is declared normally idle and has been running while it should be idle.`
            : `${n.unitName} at ${n.siteName} has crossed a limit set for it.`}{' '}
          This notice stays open until a person closes it.
        </p>
        <span data-testid="notice-status">
          <StateMark shape={look.shape} className={look.className} label={look.label} />
        </span>
      </div>
      <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        <div className="rounded border border-paper-edge bg-white/70 px-3 py-2">
          <dt className="text-xs text-ink-soft">Exergy destruction (mean of the latest run)</dt>
          <dd className="text-lg font-semibold tabular-nums" data-testid="fig-destruction">
            {f.w.value(n.extra_W, 'power')} <span className="text-sm font-normal text-ink-soft">{f.unit}</span>
          </dd>
        </div>
        <div className="rounded border border-paper-edge bg-white/70 px-3 py-2">
          <dt className="text-xs text-ink-soft">Cost of destruction per day</dt>
          <dd className="text-lg font-semibold tabular-nums" data-testid="fig-cost">
            {n.extraCost_per_day === null ? 'not known' : f.money(n.extraCost_per_day)}{' '}
            {n.extraCost_per_day !== null && <span className="text-sm font-normal text-ink-soft">{n.currency}/day</span>}
          </dd>
        </div>
        <div className="rounded border border-paper-edge bg-white/70 px-3 py-2">
          <dt className="text-xs text-ink-soft">Kind</dt>
          <dd className="text-lg font-semibold">{n.kindWord}</dd>
        </div>
      </dl>
      <table className="grid-table text-sm">
        <tbody>
          {rows.map(([k, v]) => (
            <tr key={k}>
              <td>{k}</td>
              <td className="num">{v}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="text-sm">
        <a href={`/units/${n.unitId}`}>Hourly results of {n.unitName}</a>
      </p>
    </section>
  );
}
