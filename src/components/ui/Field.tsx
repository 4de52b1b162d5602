import type { FormEvent, HTMLAttributes, ReactNode } from 'react';
import { get, type FieldValues, type Path, type UseFormReturn } from 'react-hook-form';

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

/**
 * A labelled text input of a react-hook-form form: registered under `name`, its error from the form's
 * (zod) rules under it; `children` go after the input.
 */
export function FormInput<T extends FieldValues>(p: {
  form: UseFormReturn<T>;
  name: Path<T>;
  id: string;
  label: ReactNode;
  type?: string;
  inputMode?: HTMLAttributes<HTMLInputElement>['inputMode'];
  disabled?: boolean;
  children?: ReactNode;
}) {
  const error = get(p.form.formState.errors, p.name) as { message?: string } | undefined;
  return (
    <Field id={p.id} label={p.label} error={error?.message}>
      <input id={p.id} type={p.type} className="field" inputMode={p.inputMode} {...p.form.register(p.name)} disabled={p.disabled} />
      {p.children}
    </Field>
  );
}

/** The submit button of a grid of fields, in a cell of its own aligned with the inputs' foot. */
export function SubmitCell({ busy, children }: { busy?: boolean; children: ReactNode }) {
  return (
    <div className="flex items-end">
      <button className="btn btn-primary" type="submit" disabled={busy}>
        {children}
      </button>
    </div>
  );
}

/** The options of a select, one per [value, label]. */
export function Options({ choices }: { choices: readonly (readonly [string, ReactNode])[] }) {
  return (
    <>
      {choices.map(([value, label]) => (
        <option key={value} value={value}>
          {label}
        </option>
      ))}
    </>
  );
}

/** A form's onSubmit that keeps the page and runs `act` (forms that only show or fit, sending nothing themselves). */
export const submitTo = (act: () => void) => (e: FormEvent) => {
  e.preventDefault();
  act();
};
