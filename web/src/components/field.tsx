import type { InputHTMLAttributes, ReactNode, SelectHTMLAttributes } from 'react';
import { useId } from 'react';
import clsx from 'clsx';

const CONTROL =
  'block w-full rounded-sm border bg-white px-2.5 py-1.5 text-sm text-ink placeholder:text-muted/70 ' +
  'focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/20';

function Field({ label, error, hint, id, children }: { label: string; error?: string; hint?: string; id: string; children: ReactNode }) {
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-xs font-semibold tracking-wide text-muted uppercase">
        {label}
      </label>
      {children}
      {error ? (
        <p id={`${id}-error`} className="text-xs text-danger">
          {error}
        </p>
      ) : hint ? (
        <p className="text-xs text-muted">{hint}</p>
      ) : null}
    </div>
  );
}

/** A labelled text input with its validation message. */
export function TextField({
  label,
  error,
  hint,
  className,
  ...props
}: InputHTMLAttributes<HTMLInputElement> & { label: string; error?: string; hint?: string }) {
  const id = useId();
  return (
    <Field label={label} error={error} hint={hint} id={id}>
      <input
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        className={clsx(CONTROL, error ? 'border-danger' : 'border-line', className)}
        {...props}
      />
    </Field>
  );
}

/** A labelled select with its validation message. */
export function SelectField({
  label,
  error,
  className,
  children,
  ...props
}: SelectHTMLAttributes<HTMLSelectElement> & { label: string; error?: string }) {
  const id = useId();
  return (
    <Field label={label} error={error} id={id}>
      <select id={id} className={clsx(CONTROL, error ? 'border-danger' : 'border-line', className)} {...props}>
        {children}
      </select>
    </Field>
  );
}
