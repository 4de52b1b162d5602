/**
 * A drift notice as the API answers it: one definition for the server (src/server/services/notices.ts)
 * and the islands that draw it (src/components/insight/notices). Types only.
 */
export type NoticeStatus = 'open' | 'acknowledged' | 'closed';

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
