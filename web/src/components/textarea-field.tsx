import type { TextareaHTMLAttributes } from 'react';
import { useId } from 'react';
import clsx from 'clsx';

/** A labelled textarea with its validation message (code and pattern lists use `mono`). */
export function TextAreaField({
  label,
  error,
  hint,
  mono,
  className,
  ...props
}: TextareaHTMLAttributes<HTMLTextAreaElement> & { label: string; error?: string; hint?: string; mono?: boolean }) {
  const id = useId();
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-xs font-semibold tracking-wide text-muted uppercase">
        {label}
      </label>
      <textarea
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        spellCheck={mono ? false : undefined}
        className={clsx(
          'block w-full rounded-sm border bg-white px-2.5 py-1.5 text-sm text-ink placeholder:text-muted/70',
          'focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/20',
          mono && 'font-mono text-[12.5px] leading-5',
          error ? 'border-danger' : 'border-line',
          className,
        )}
        {...props}
      />
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
