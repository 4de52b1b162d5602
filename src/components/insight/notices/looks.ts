import type { MarkShape } from '../../StateMark';

/** Notice statuses in Lossline's words and shapes; colour is only a third cue. */
export const NOTICE_LOOK: Record<string, { label: string; shape: MarkShape; className: string }> = {
  open: { label: 'open', shape: 'diamond', className: 'text-copper' },
  acknowledged: { label: 'seen', shape: 'ring', className: 'text-amber' },
  closed: { label: 'closed', shape: 'square', className: 'text-slate' },
};

/** The notice as the API answers it. */
export type { NoticeView as Notice } from '../../../lib/notice-view';

export interface SeriesPoint {
  hourStart: string;
  residual_W: number;
  x: number;
  cPlus: number;
  cMinus: number;
}

export const signedKW = (W: number) => `${W >= 0 ? '+' : '−'}${(Math.abs(W) / 1000).toFixed(1)}`;
export const money = (v: number | null) => (v === null ? '–' : v.toLocaleString('en-GB', { maximumFractionDigits: 0 }));
