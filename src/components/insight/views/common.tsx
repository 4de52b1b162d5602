import { StateMark, type MarkShape } from '~/components/StateMark';
import type { HourState } from './format';
import { PALETTE } from '~/lib/palette';

/** Hour states in Lossline's look: a text label, a shape and a colour (never the colour alone). */
export const STATE_LOOK: Record<HourState, { shape: MarkShape; className: string; fill: string; stroke: string; label: string }> = {
  steady: { shape: 'circle', className: 'text-teal', fill: PALETTE.teal.pale, stroke: PALETTE.teal.DEFAULT, label: 'steady' },
  unsettled: { shape: 'triangle', className: 'text-amber-deep', fill: PALETTE.amber.pale, stroke: PALETTE.amber.DEFAULT, label: 'unsettled' },
  idle: { shape: 'bar', className: 'text-slate', fill: PALETTE.slate.pale, stroke: PALETTE.slate.DEFAULT, label: 'idle' },
  suspect: { shape: 'diamond', className: 'text-alert', fill: PALETTE.alert.pale, stroke: PALETTE.alert.DEFAULT, label: 'suspect' },
};

/** Chart colours, all from the one palette (src/lib/palette.ts). */
export const COLORS = {
  ink: PALETTE.ink.DEFAULT,
  soft: PALETTE.ink.soft,
  faint: PALETTE.ink.faint,
  edge: PALETTE.paper.edge,
  copper: PALETTE.copper.DEFAULT,
  copperDeep: PALETTE.copper.deep,
  copperPale: PALETTE.copper.pale,
  teal: PALETTE.teal.DEFAULT,
  tealDeep: PALETTE.teal.deep,
  tealPale: PALETTE.teal.pale,
  amber: PALETTE.amber.DEFAULT,
  slate: PALETTE.slate.DEFAULT,
};

export function HourStateMark({ state, count }: { state: HourState; count?: number }) {
  const l = STATE_LOOK[state];
  return <StateMark shape={l.shape} className={l.className} label={count === undefined ? l.label : `${l.label} ${count} h`} />;
}

export function Loading({ what }: { what: string }) {
  return (
    <p role="status" className="flex items-center gap-2 py-6 text-sm text-ink-faint" data-testid="loading">
      <svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true" className="animate-spin">
        <circle cx="7" cy="7" r="5.5" fill="none" stroke="currentColor" strokeWidth="2" strokeDasharray="20 12" />
      </svg>
      Loading {what}…
    </p>
  );
}

export function ErrorNote({ text }: { text: string }) {
  return (
    <p role="alert" className="notice-error">
      {text}
    </p>
  );
}

/** The caution of docs/domain.md section 8. */
export { Caution as ViewsCaution } from '../../Caution';
