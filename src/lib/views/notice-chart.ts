/**
 * The shaping behind a drift notice's chart (src/components/insight/notices/NoticeChart.tsx): the points
 * in the site's power unit, the words for what one point covers, and the dated marks inside the span.
 * Pure: the columns come from the server (src/lib/analytics/chart-thin.ts).
 */
import { drawnPoints, type ChartColumns } from '../analytics/chart-thin';
import type { NoticeChartEvent } from '../notice-view';
import type { SiteWriter } from '../units/writer';

/** One drawn point: its start [ms], the residual in the site's power unit and the cumulative sum [sigma]. */
export interface NoticeChartDatum {
  t: number;
  residual: number;
  cusum: number;
}

/** What one daily point covers: 'day', or '2 days' and so on after thinning. */
export function pointSpanWords(perHours: number): string {
  const days = Math.round(perHours / 24);
  return days > 1 ? `${days} days` : 'day';
}

/** The points to draw, with the residual [kW on the wire] in the site's power unit (0 when it has none). */
export function noticeChartData(chart: ChartColumns, w: Pick<SiteWriter, 'shown'>): NoticeChartDatum[] {
  return drawnPoints(chart).map((p) => ({ t: p.t_ms, residual: w.shown(p.residual_kW * 1000, 'power') ?? 0, cusum: p.cusum }));
}

/** The dated marks from t0 to t1 [ms], both included, in their order. */
export function eventsWithin(events: readonly NoticeChartEvent[], t0: number, t1: number): NoticeChartEvent[] {
  return events.filter((e) => {
    const t = new Date(e.t).getTime();
    return t >= t0 && t <= t1;
  });
}
