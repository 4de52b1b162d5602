/**
 * A drift notice as the API answers it: one definition for the server (src/server/services/notices.ts)
 * and the islands that draw it (src/components/insight/notices). Types only.
 */
export type NoticeStatus = 'open' | 'acknowledged' | 'closed';
/** 'drift': a CUSUM signal; 'idle': a unit declared normally idle ran; 'limit': a unit crossed a limit set for it. */
export type NoticeKind = 'drift' | 'idle' | 'limit';

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
}
