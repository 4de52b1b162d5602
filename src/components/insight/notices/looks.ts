import type { MarkShape } from '../../StateMark';

/** Notice statuses in Lossline's words and shapes; colour is only a third cue. */
export const NOTICE_LOOK: Record<string, { label: string; shape: MarkShape; className: string }> = {
  open: { label: 'open', shape: 'diamond', className: 'text-copper' },
  acknowledged: { label: 'seen', shape: 'ring', className: 'text-amber' },
  closed: { label: 'closed', shape: 'square', className: 'text-slate' },
};

/** The notice as the API answers it (src/server/services/notices.ts NoticeView). */
export interface Notice {
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
  status: 'open' | 'acknowledged' | 'closed';
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
  url: string;
}

export interface SeriesPoint {
  hourStart: string;
  residual_W: number;
  x: number;
  cPlus: number;
  cMinus: number;
}

export const signedKW = (W: number) => `${W >= 0 ? '+' : '−'}${(Math.abs(W) / 1000).toFixed(1)}`;
export const money = (v: number | null) => (v === null ? '–' : v.toLocaleString('en-GB', { maximumFractionDigits: 0 }));
