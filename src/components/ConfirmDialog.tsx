import { useCallback, useEffect, useId, useRef, useState, type ReactNode } from 'react';

/** What a confirmation asks: its title, what follows, and the words of the button that does it. */
export interface ConfirmOptions {
  title: string;
  body?: ReactNode;
  /** The words of the button that goes ahead ("Close the notice", "Revoke"). */
  confirm: string;
  cancel?: string;
  /** The action cannot be undone: the button is drawn in the danger colour. */
  danger?: boolean;
}

interface Pending extends ConfirmOptions {
  resolve: (yes: boolean) => void;
}

/**
 * A confirmation before an action that cannot be taken back, in the browser's own modal <dialog>: it
 * traps the focus, is announced as a dialog with its title, starts on the safe button, and Escape or
 * the cancel button answer no. Use: `const { dialog, ask } = useConfirm();` render `{dialog}`, then
 * `if (!(await ask({ title, confirm }))) return;`.
 */
export function useConfirm(): { dialog: ReactNode; ask: (o: ConfirmOptions) => Promise<boolean> } {
  const [pending, setPending] = useState<Pending | null>(null);
  const ask = useCallback((o: ConfirmOptions) => new Promise<boolean>((resolve) => setPending({ ...o, resolve })), []);
  const answer = useCallback(
    (yes: boolean) => {
      pending?.resolve(yes);
      setPending(null);
    },
    [pending],
  );
  return { dialog: pending ? <ConfirmDialog options={pending} onAnswer={answer} /> : null, ask };
}

function ConfirmDialog({ options, onAnswer }: { options: ConfirmOptions; onAnswer: (yes: boolean) => void }) {
  const ref = useRef<HTMLDialogElement>(null);
  const id = useId();
  useEffect(() => {
    const d = ref.current;
    if (d && !d.open) d.showModal();
  }, []);
  return (
    <dialog
      ref={ref}
      aria-labelledby={`${id}-title`}
      aria-describedby={options.body ? `${id}-body` : undefined}
      className="w-full max-w-md rounded-md border border-paper-edge bg-paper p-0 text-ink shadow-lg backdrop:bg-ink/40"
      data-testid="confirm-dialog"
      onCancel={(e) => {
        e.preventDefault();
        onAnswer(false);
      }}
    >
      <form
        method="dialog"
        className="space-y-3 p-4"
        onSubmit={(e) => {
          e.preventDefault();
          const submitter = (e.nativeEvent as SubmitEvent).submitter as HTMLButtonElement | null;
          onAnswer(submitter?.value === 'yes');
        }}
      >
        <h2 id={`${id}-title`} className="text-lg font-semibold">
          {options.title}
        </h2>
        {options.body && (
          <div id={`${id}-body`} className="text-sm text-ink-soft">
            {options.body}
          </div>
        )}
        <div className="flex justify-end gap-2 pt-1">
          <button type="submit" value="no" className="btn" autoFocus>
            {options.cancel ?? 'Cancel'}
          </button>
          <button type="submit" value="yes" className={options.danger ? 'btn btn-danger' : 'btn btn-primary'}>
            {options.confirm}
          </button>
        </div>
      </form>
    </dialog>
  );
}
