import { fixed } from '~/lib/format';
import type { MarkShape } from '~/components/StateMark';
import type { CloseOutcome, NoticeLife, NoticeTrend, PriorReason } from '~/lib/notice-view';

/** Notice statuses in Lossline's words and shapes; colour is only a third cue. */
export const NOTICE_LOOK: Record<string, { label: string; shape: MarkShape; className: string }> = {
  open: { label: 'open', shape: 'diamond', className: 'text-copper' },
  acknowledged: { label: 'seen', shape: 'ring', className: 'text-amber-deep' },
  closed: { label: 'closed', shape: 'square', className: 'text-slate' },
};

/** Whether the notice still takes signals, in words and shapes. */
export const LIFE_LOOK: Record<NoticeLife, { label: string; shape: MarkShape; className: string }> = {
  live: { label: 'shift present', shape: 'circle', className: 'text-copper' },
  faded: { label: 'faded', shape: 'ring', className: 'text-slate' },
  superseded: { label: 'superseded by a larger shift', shape: 'bar', className: 'text-slate' },
  closed: { label: 'closed', shape: 'square', className: 'text-slate' },
};

/** How the shift moves (rule: src/lib/analytics/notice-figures.ts), with a shape each. */
export const TREND_LOOK: Record<NoticeTrend, { label: string; shape: MarkShape; className: string }> = {
  growing: { label: 'growing', shape: 'triangle', className: 'text-copper' },
  steady: { label: 'steady', shape: 'bar', className: 'text-ink-soft' },
  receding: { label: 'receding', shape: 'ring', className: 'text-teal' },
};

export const OUTCOME_WORDS: Record<CloseOutcome, string> = {
  repaired: 'repaired',
  'instrument-fault': 'instrument fault',
  'new-normal': 'accepted as the new normal',
  'no-action': 'no action',
};

export const PRIOR_WORDS: Record<PriorReason, string> = {
  larger: 'a later, clearly larger shift than the earlier notice’s',
  'after-fade': 'a new shift after the earlier notice had faded',
  'after-close': 'a new shift after the earlier notice was closed',
  'after-repair': 'the shift is still there after the repair recorded on the earlier notice',
};

/** The notice as the API answers it. */
export type { NoticeView as Notice, NoticeChartEvent, NoticeChartPoint } from '~/lib/notice-view';

export interface SeriesPoint {
  hourStart: string;
  residual_W: number;
  x: number;
  cPlus: number;
  cMinus: number;
}

export const signedKW = (W: number) => `${W >= 0 ? '+' : '−'}${fixed(Math.abs(W) / 1000, 1)}`;
export const plusMinusKW = (U: number | null) => (U === null || !Number.isFinite(U) ? '' : `± ${fixed(U / 1000, 1)}`);
export const money = (v: number | null) => fixed(v, 0, { none: '–' });
