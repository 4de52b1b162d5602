import { StateMark, type MarkShape } from '~/components/StateMark';
import type { HourState } from './format';

/** Hour states in Lossline's look: a text label, a shape and a colour (never the colour alone). */
export const STATE_LOOK: Record<HourState, { shape: MarkShape; className: string; fill: string; stroke: string; label: string }> = {
  steady: { shape: 'circle', className: 'text-teal', fill: '#d3ebe7', stroke: '#1f7a72', label: 'steady' },
  unsettled: { shape: 'triangle', className: 'text-amber', fill: '#f7e6bf', stroke: '#c98a12', label: 'unsettled' },
  idle: { shape: 'bar', className: 'text-slate', fill: '#e1e4e8', stroke: '#66707c', label: 'idle' },
  suspect: { shape: 'diamond', className: 'text-alert', fill: '#f5d6d4', stroke: '#a3262a', label: 'suspect' },
};

export const COLORS = {
  ink: '#22201c',
  soft: '#4a463e',
  faint: '#7a7366',
  edge: '#ddd3bf',
  copper: '#b5562a',
  copperDeep: '#8e3f1c',
  copperPale: '#f3dccd',
  teal: '#1f7a72',
  tealDeep: '#155a54',
  tealPale: '#d3ebe7',
  amber: '#c98a12',
  slate: '#66707c',
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
