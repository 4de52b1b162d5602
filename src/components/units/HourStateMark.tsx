import { StateMark, type MarkShape } from '../StateMark';

/**
 * Hour states, each with a word and a shape; colour is the third cue only (docs/design.md, "Look"):
 * steady circle teal, unsettled triangle amber, idle bar slate, suspect diamond copper.
 */
export const HOUR_STATE_LOOK: Record<string, { label: string; shape: MarkShape; className: string }> = {
  steady: { label: 'steady', shape: 'circle', className: 'text-teal' },
  unsettled: { label: 'unsettled', shape: 'triangle', className: 'text-amber-deep' },
  idle: { label: 'idle', shape: 'bar', className: 'text-slate' },
  suspect: { label: 'suspect', shape: 'diamond', className: 'text-copper' },
};

export function HourStateMark({ state }: { state: string }) {
  const look = HOUR_STATE_LOOK[state] ?? { label: state, shape: 'ring' as MarkShape, className: 'text-ink-faint' };
  return <StateMark shape={look.shape} className={look.className} label={look.label} />;
}
