import type { MarkShape } from '../StateMark';

/** How each upload state is shown: words and a shape, the colour only a third cue. */
export const UPLOAD_STATE_LOOK: Record<string, { label: string; shape: MarkShape; className: string }> = {
  'awaiting-file': { label: 'arriving', shape: 'ring', className: 'text-slate' },
  queued: { label: 'waiting to be read', shape: 'ring', className: 'text-slate' },
  'needs-review': { label: 'needs your review', shape: 'triangle', className: 'text-amber-deep' },
  processing: { label: 'being read', shape: 'bar', className: 'text-teal' },
  done: { label: 'read', shape: 'circle', className: 'text-teal-deep' },
  'read-with-problems': { label: 'read with problems', shape: 'square', className: 'text-copper-deep' },
  failed: { label: 'not read', shape: 'diamond', className: 'text-alert' },
};

/** States whose file was read and stored: they have a report. */
export const READ_STATES = ['done', 'read-with-problems'];
