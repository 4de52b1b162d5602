import { SAFETY_CAUTION } from '~/lib/caution';

/** The caution of docs/domain.md section 8 (src/lib/caution.ts), where a user acts on a result. */
export function Caution({ className = 'caution text-xs', testId }: { className?: string; testId?: string }) {
  return (
    <p className={className} role="note" data-testid={testId}>
      {SAFETY_CAUTION}
    </p>
  );
}
