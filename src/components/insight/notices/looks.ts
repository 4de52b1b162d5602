import { pairU, sizeDecimals } from '~/lib/format';
import { signedWithU, writerOf } from '~/lib/units/writer';
import type { MarkShape } from '~/components/StateMark';
import type { CloseOutcome, NoticeLife, NoticeTrend, NoticeView, PriorReason } from '~/lib/notice-view';

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

/**
 * The figures of a notice in its site's display units and number style (src/lib/units/writer.ts):
 * power with its unit, a value and its ± at the same decimals, money grouped in the site's locale.
 */
export function noticeFigures(n: Pick<NoticeView, 'display' | 'currency'>) {
  const w = writerOf(n.display);
  const unit = w.unit('power');
  return {
    w,
    /** The unit power is shown in ('kW', 'MW'). */
    unit,
    /** A signed power with its U and unit: "+412 kW ± 18 kW". */
    signed: (W: number, U: number | null = null) => signedWithU(w, W, U, 'power'),
    /** A signed power and its "± U" apart, at the decimals U asks for, without the unit. */
    parts: (W: number, U: number | null): [string, string] => {
      const v = w.shown(Math.abs(W), 'power') ?? 0;
      const u = U === null || !Number.isFinite(U) ? null : Math.abs(w.shown(U, 'power') ?? 0);
      const [a, b] = pairU(v, u, { ...w.style, decimals: sizeDecimals(v) });
      return [`${/^0([.,]0*)?$/.test(a) ? '' : W >= 0 ? '+' : '−'}${a}`, b ? `± ${b}` : ''];
    },
    /** A power without its sign's plus: "412 kW". */
    power: (W: number) => `${w.value(W, 'power')} ${unit}`,
    /** An uncertainty of power: "± 18 kW". */
    plusMinus: (U: number | null) => (U === null || !Number.isFinite(U) ? '' : `± ${w.delta(U, 'power')} ${unit}`),
    /** Money, whole units grouped in the site's locale ('–' for none). */
    money: (v: number | null) => (v === null ? '–' : w.number(v, 0)),
    /** Money and its "± U" apart, at the decimals U asks for (whole units without U), without the currency. */
    moneyParts: (v: number | null, U: number | null): [string, string] => {
      if (v === null) return ['', ''];
      const [a, b] = pairU(v, U, { ...w.style, decimals: 0 });
      return [a, b ? `± ${b}` : ''];
    },
    /** Money and its U at the decimals U asks for, with the currency. */
    moneyU: (v: number, U: number | null) => `${n.currency} ${w.withU(v, U, 'none', 0)}`,
  };
}
