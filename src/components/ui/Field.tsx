import type { ReactNode } from 'react';

/** A field's error under it, or nothing. */
export function FieldError({ text }: { text?: string }) {
  return text ? <p className="mt-1 text-xs text-alert">{text}</p> : null;
}

/** A labelled form field: the label tied to the control's id, the control, and its error if any. */
export function Field({ id, label, error, className, children }: { id: string; label: ReactNode; error?: string; className?: string; children: ReactNode }) {
  return (
    <div className={className}>
      <label className="label" htmlFor={id}>
        {label}
      </label>
      {children}
      <FieldError text={error} />
    </div>
  );
}
