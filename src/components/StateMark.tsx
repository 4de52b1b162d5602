import type React from 'react';
/**
 * A state is never told by colour alone: each has a text label and a shape (docs/design.md, "Look").
 * Used for upload states here and hour states elsewhere.
 */
export type MarkShape = 'circle' | 'square' | 'diamond' | 'triangle' | 'ring' | 'bar';

const SHAPES: Record<MarkShape, React.ReactElement> = {
  circle: <circle cx="6" cy="6" r="5" />,
  ring: <circle cx="6" cy="6" r="4" fill="none" strokeWidth="2" />,
  square: <rect x="1.5" y="1.5" width="9" height="9" />,
  diamond: <path d="M6 0.5 L11.5 6 L6 11.5 L0.5 6 Z" />,
  triangle: <path d="M6 1 L11.5 11 L0.5 11 Z" />,
  bar: <rect x="0.5" y="4" width="11" height="4" />,
};

export function StateMark({ shape, className, label }: { shape: MarkShape; className: string; label: string }) {
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap text-sm" data-state={label}>
      <svg width="12" height="12" viewBox="0 0 12 12" aria-hidden="true" className={`${className} fill-current stroke-current`}>
        {SHAPES[shape]}
      </svg>
      <span>{label}</span>
    </span>
  );
}
