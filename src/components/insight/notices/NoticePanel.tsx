import { DriftSummary } from './NoticeDrift';
import { NoticeRecord, Verdict } from './NoticeRecord';
import { useNoticeActions } from './useNoticeActions';
import type { ChartColumns } from '~/lib/analytics/chart-thin';
import type { Notice, NoticeChartEvent } from './looks';
import RuleNoticeSummary from './RuleNoticeSummary';

/**
 * A drift notice: the live headline, chart, history, the caution, and seen / close for those who act on
 * notices. The parts: ./NoticeDrift.tsx (headline and figures), ./NoticeRecord.tsx (verdict, record,
 * forms), ./useNoticeActions.ts (seen and close).
 */
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
  const { n, message, busy, dialog, act } = useNoticeActions(initial);
  return (
    <div className="space-y-6">
      {dialog}
      {n.kind !== 'drift' ? <RuleNoticeSummary notice={n} /> : <DriftSummary n={n} chart={chart} />}
      <Verdict n={n} />
      <NoticeRecord n={n} caution={caution} canAct={canAct} message={message} busy={busy} act={(what, body) => void act(what, body)} />
    </div>
  );
}
