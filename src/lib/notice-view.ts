/**
 * A drift notice as the API answers it: one definition for the server (src/server/services/notices.ts)
 * and the islands that draw it (src/components/insight/notices). Types only.
 */
import type { SiteDisplayUnits } from './units/writer';
export type NoticeStatus = 'open' | 'acknowledged' | 'closed';
/** 'drift': a CUSUM signal; 'idle': a unit declared normally idle ran; 'limit': a unit crossed a limit set for it. */
export type NoticeKind = 'drift' | 'idle' | 'limit';
export type NoticeTrend = 'growing' | 'steady' | 'receding';
/** Whether a notice still takes signals: live, faded (its shift has gone), superseded (a larger shift has its own notice), closed. */
export type NoticeLife = 'live' | 'faded' | 'superseded' | 'closed';
export type CloseOutcome = 'repaired' | 'instrument-fault' | 'new-normal' | 'no-action';
export type PriorReason = 'larger' | 'after-fade' | 'after-close' | 'after-repair';

/** The verdict on a repair (IPMVP: adjusted baseline against the reporting period). */
export interface VerdictView {
  hour: string;
  back: boolean;
  before_W: number;
  beforeU_W: number;
  beforeHours: number;
  after_W: number;
  afterU_W: number;
  afterHours: number;
  avoided_W: number;
  avoidedU_W: number;
  avoidedCost_per_month: number | null;
  avoidedCostU_per_month: number | null;
}

/** One point of a notice's chart (an hour, or a local day over long spans). */
export interface NoticeChartPoint {
  t: string;
  hours: number;
  residual_W: number;
  /** Largest sum in the notice's direction within the point [sigma]. */
  cusum: number;
  signal: boolean;
}

/** A dated mark on a notice's chart (onset, signal, faded, repair ...). */
export interface NoticeChartEvent {
  t: string;
  label: string;
}

export interface NoticeView {
  id: string;
  siteId: string;
  siteName: string;
  timeZone: string;
  unitId: string;
  unitName: string;
  unitKind: string;
  baselineId: string | null;
  baselineLabel: string | null;
  direction: 'up' | 'down';
  kind: NoticeKind;
  /** The kind in the product's words ("drift", "running while idle", "limit crossed"). */
  kindWord: string;
  /**
   * Idle and limit notices: the rule in words, the consecutive hours that open a notice, the limits
   * crossed ('cost', 'efficiency') and the mean exergy efficiency of the latest run. For these kinds
   * extra_W is the latest run's mean destruction, extraCost_per_day its cost per day and hours its
   * length; expected_W, shift_sigma, k and h are 0. Null for drift notices.
   */
  ruleText: string | null;
  ruleHours: number | null;
  ruleCrossed: string[] | null;
  meanEfficiency: number | null;
  status: NoticeStatus;
  statusWord: string;
  onsetHour: string;
  signalHour: string;
  lastSignalHour: string;
  hours: number;
  extra_W: number;
  expected_W: number;
  shift_sigma: number;
  extraCost_per_day: number | null;
  currency: string;
  costBasis: string | null;
  hourU_W: number | null;
  shiftU_W: number | null;
  exceedsUncertainty: boolean | null;
  k: number;
  h: number;
  openedAt: string;
  acknowledgedBy: string | null;
  acknowledgedAt: string | null;
  acknowledgeComment: string | null;
  closedBy: string | null;
  closedAt: string | null;
  closeComment: string | null;
  /** PUBLIC_BASE_URL + /notices/{id}. */
  url: string;
  // ---- the headline: the current size (last 24 steady hours) when known, else the first figure ----
  headline_W: number;
  /** Combined expanded (k = 2) uncertainty of the headline [W]; null when not known. */
  headlineU_W: number | null;
  headlineCost_per_day: number | null;
  headlineCostU_per_day: number | null;
  /** The headline beyond its measurement uncertainty. */
  headlineExceeds: boolean | null;
  current_W: number | null;
  currentU_W: number | null;
  currentMeasU_W: number | null;
  currentHours: number | null;
  sinceOnset_W: number | null;
  sinceOnsetU_W: number | null;
  sinceOnsetHours: number | null;
  trend: NoticeTrend | null;
  figuresHour: string | null;
  life: NoticeLife;
  fadedSince: string | null;
  supersededBy: string | null;
  priorNoticeId: string | null;
  priorReason: PriorReason | null;
  closeOutcome: CloseOutcome | null;
  repairedAt: string | null;
  newNormalFrom: string | null;
  verdict: VerdictView | null;
  followUpNoticeId: string | null;
  escalationStep: number;
  /**
   * The site's display units and atmosphere, for pages and mails that write the figures for people
   * (src/lib/units/writer.ts). Present on the answers of the product's own routes and in mails; the
   * API under /api/v1 keeps SI and leaves it out.
   */
  display?: SiteDisplayUnits;
}
