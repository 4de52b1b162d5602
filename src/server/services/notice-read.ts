/**
 * Reading drift and rule notices: the view of one notice (src/lib/notice-view.ts), the list, and a
 * notice with its chart. ./notices.ts acts on them and queues their mails.
 */
import { and, asc, desc, eq, gte, lt, ne, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { siteMidnight } from '~/lib/site-time';
import { HOUR_MS } from '~/lib/time';
import { chartSeries, type ResidualHour } from '~/lib/analytics/notice-figures';
import { dayByDay } from '~/lib/analytics/chart-thin';
import { db } from '../db/client';
import type { NoticeChartEvent, NoticeLife, NoticeView } from '~/lib/notice-view';
import { baselineLabel } from '~/lib/baseline-view';
import { baselines, driftNotices, driftPoints, plantUnits, sites, user, type NoticeStatus } from '../db/schema';
import { env } from '../env';
import { isId } from '../access';
import { AppError } from '../errors';
import { type Tx } from './drift-tx';
import { SAFETY_CAUTION } from '~/lib/caution';
import { ruleViewFields } from './unit-rule-words';


/** The product's words for the statuses (docs/design.md): open, seen, closed. */
export const NOTICE_STATUS_WORDS: Record<NoticeStatus, string> = { open: 'open', acknowledged: 'seen', closed: 'closed' };

const acker = alias(user, 'acker');
const closer = alias(user, 'closer');

function noticeQuery() {
  return noticeQueryOn(db());
}

type NoticeRow = Awaited<ReturnType<ReturnType<typeof noticeQuery>['execute']>>[number];

export type { NoticeView } from '~/lib/notice-view';

export function toView(r: NoticeRow): NoticeView {
  const n = r.n;
  return {
    id: n.id,
    siteId: n.siteId,
    siteName: r.siteName,
    timeZone: r.timeZone,
    unitId: n.unitId,
    unitName: r.unitName,
    unitKind: r.unitKind,
    baselineId: n.baselineId,
    baselineLabel:
      r.baselineVersion !== null && r.baselinePeriodFrom && r.baselinePeriodTo
        ? baselineLabel(r.baselineVersion, r.baselinePeriodFrom, r.baselinePeriodTo, r.timeZone)
        : null,
    direction: n.direction,
    ...ruleViewFields(n),
    status: n.status,
    statusWord: NOTICE_STATUS_WORDS[n.status],
    onsetHour: n.onsetHour.toISOString(),
    signalHour: n.signalHour.toISOString(),
    lastSignalHour: n.lastSignalHour.toISOString(),
    hours: n.hours,
    extra_W: n.extra_W,
    expected_W: n.expected_W,
    shift_sigma: n.shift_sigma,
    extraCost_per_day: n.extraCost_per_day,
    currency: n.currency,
    costBasis: n.costBasis,
    hourU_W: n.hourU_W,
    shiftU_W: n.shiftU_W,
    exceedsUncertainty: n.exceedsUncertainty,
    k: n.k,
    h: n.h,
    openedAt: n.openedAt.toISOString(),
    acknowledgedBy: r.acknowledgedByName,
    acknowledgedAt: n.acknowledgedAt?.toISOString() ?? null,
    acknowledgeComment: n.acknowledgeComment,
    closedBy: r.closedByName,
    closedAt: n.closedAt?.toISOString() ?? null,
    closeComment: n.closeComment,
    url: noticeUrl(n.id),
    headline_W: n.current_W ?? n.extra_W,
    headlineU_W: n.current_W !== null ? n.currentU_W : n.shiftU_W,
    headlineCost_per_day: n.current_W !== null ? n.currentCost_per_day : n.extraCost_per_day,
    headlineCostU_per_day: n.current_W !== null ? n.currentCostU_per_day : null,
    headlineExceeds: n.current_W !== null ? n.currentExceeds : n.exceedsUncertainty,
    current_W: n.current_W,
    currentU_W: n.currentU_W,
    currentMeasU_W: n.currentMeasU_W,
    currentHours: n.currentHours,
    sinceOnset_W: n.sinceOnset_W,
    sinceOnsetU_W: n.sinceOnsetU_W,
    sinceOnsetHours: n.sinceOnsetHours,
    trend: n.trend,
    figuresHour: n.figuresHour?.toISOString() ?? null,
    life: lifeOf(n),
    fadedSince: n.fadedSince?.toISOString() ?? null,
    supersededBy: n.supersededBy,
    priorNoticeId: n.priorNoticeId,
    priorReason: n.priorReason,
    closeOutcome: n.closeOutcome,
    repairedAt: n.repairedAt?.toISOString() ?? null,
    newNormalFrom: n.newNormalFrom?.toISOString() ?? null,
    verdict: n.verdict && n.verdictHour && n.verdictBack !== null ? { hour: n.verdictHour.toISOString(), back: n.verdictBack, ...n.verdict } : null,
    followUpNoticeId: n.followUpNoticeId,
    escalationStep: n.escalationStep,
  };
}

function lifeOf(n: { status: NoticeStatus; fadedSince: Date | null; supersededBy: string | null }): NoticeLife {
  return n.status === 'closed' ? 'closed' : n.supersededBy ? 'superseded' : n.fadedSince ? 'faded' : 'live';
}

export function noticeUrl(id: string): string {
  return `${env().PUBLIC_BASE_URL.replace(/\/+$/, '')}/notices/${id}`;
}

export const NOTICE_SORTS = ['cost', 'newest'] as const;
export type NoticeSort = (typeof NOTICE_SORTS)[number];

/**
 * Notices, those not closed first. Within that, by default the largest current cost per day first
 * (notices without a cost after those with one), then the newest; sort 'newest' keeps the opening
 * order (open, then seen, newest first).
 */
export async function listNotices(
  filter: { status?: NoticeStatus | 'not-closed'; unitId?: string; siteId?: string; limit?: number; sort?: NoticeSort } = {},
): Promise<NoticeView[]> {
  const where = and(
    filter.status === 'not-closed' ? ne(driftNotices.status, 'closed') : filter.status ? eq(driftNotices.status, filter.status) : undefined,
    filter.unitId && isId(filter.unitId) ? eq(driftNotices.unitId, filter.unitId) : undefined,
    filter.siteId && isId(filter.siteId) ? eq(driftNotices.siteId, filter.siteId) : undefined,
  );
  const closedLast = sql`case ${driftNotices.status} when 'closed' then 1 else 0 end`;
  const order =
    filter.sort === 'newest'
      ? [sql`case ${driftNotices.status} when 'open' then 0 when 'acknowledged' then 1 else 2 end`, desc(driftNotices.openedAt)]
      : [closedLast, sql`coalesce(${driftNotices.currentCost_per_day}, ${driftNotices.extraCost_per_day}) desc nulls last`, desc(driftNotices.openedAt)];
  const rows = await noticeQuery()
    .where(where)
    .orderBy(...order)
    .limit(filter.limit ?? 500);
  return rows.map(toView);
}

export async function getNotice(noticeId: string): Promise<NoticeView> {
  if (!isId(noticeId)) throw new AppError('NOT_FOUND', 'No such drift notice.');
  const [r] = await noticeQuery().where(eq(driftNotices.id, noticeId));
  if (!r) throw new AppError('NOT_FOUND', 'No such drift notice.');
  return toView(r);
}

/** Hours of context drawn before the onset and after the latest signal on a notice's chart. */
const CHART_MARGIN_ms = 72 * HOUR_MS;

/**
 * A notice with its caution and its chart: the unit's residuals and the CUSUM sum in the notice's
 * direction around it, per hour, or per local day over long spans (aggregated here, not in the page),
 * with the dated marks (onset, signal, faded, repair, verdict).
 */
export async function noticeDetail(noticeId: string) {
  const notice = await getNotice(noticeId);
  const endIso = notice.verdict?.hour ?? notice.figuresHour ?? notice.lastSignalHour;
  const from = new Date(new Date(notice.onsetHour).getTime() - CHART_MARGIN_ms);
  const to = new Date(Math.max(new Date(endIso).getTime(), new Date(notice.lastSignalHour).getTime()) + CHART_MARGIN_ms);
  const rows = await db()
    .select({
      hourStart: driftPoints.hourStart,
      residual_W: driftPoints.residual_W,
      x: driftPoints.x,
      cPlus: driftPoints.cPlus,
      cMinus: driftPoints.cMinus,
      signal: driftPoints.signal,
    })
    .from(driftPoints)
    .where(and(eq(driftPoints.unitId, notice.unitId), gte(driftPoints.hourStart, from), lt(driftPoints.hourStart, to)))
    .orderBy(asc(driftPoints.hourStart))
    .limit(24 * 800);
  const hours: ResidualHour[] = rows.map((r) => ({ hourStart_ms: r.hourStart.getTime(), residual_W: r.residual_W, hourU_W: null, cPlus: r.cPlus, cMinus: r.cMinus, signal: r.signal }));
  const chart = chartSeries(hours, notice.direction, dayByDay((ms) => siteMidnight(ms, notice.timeZone)));
  const events: NoticeChartEvent[] = [
    { t: notice.onsetHour, label: 'onset' },
    { t: notice.signalHour, label: 'signal' },
  ];
  if (notice.lastSignalHour !== notice.signalHour) events.push({ t: notice.lastSignalHour, label: 'latest signal' });
  if (notice.fadedSince) events.push({ t: notice.fadedSince, label: 'faded' });
  if (notice.repairedAt) events.push({ t: notice.repairedAt, label: 'repaired' });
  if (notice.verdict) events.push({ t: notice.verdict.hour, label: 'verdict' });
  events.sort((x, y) => x.t.localeCompare(y.t));
  return {
    notice,
    caution: SAFETY_CAUTION,
    chart: { span: chart.span, points: chart.points, events },
    /** The hourly rows as before (kept for API callers): residual [W], x and the sums [sigma]. */
    series: rows.slice(0, 1000).map((r) => ({ hourStart: r.hourStart.toISOString(), residual_W: r.residual_W, x: r.x, cPlus: r.cPlus, cMinus: r.cMinus })),
  };
}

/** Notices with their unit, site, baseline and people, on the pool or a transaction. */
export function noticeQueryOn(tx: Pick<Tx, 'select'>) {
  return tx
    .select({
      n: driftNotices,
      unitName: plantUnits.name,
      unitKind: plantUnits.kind,
      siteName: sites.name,
      timeZone: sites.timeZone,
      baselineVersion: baselines.version,
      baselinePeriodFrom: baselines.periodFrom,
      baselinePeriodTo: baselines.periodTo,
      acknowledgedByName: acker.name,
      closedByName: closer.name,
    })
    .from(driftNotices)
    .innerJoin(plantUnits, eq(plantUnits.id, driftNotices.unitId))
    .innerJoin(sites, eq(sites.id, driftNotices.siteId))
    .leftJoin(baselines, eq(baselines.id, driftNotices.baselineId))
    .leftJoin(acker, eq(acker.id, driftNotices.acknowledgedBy))
    .leftJoin(closer, eq(closer.id, driftNotices.closedBy));
}

