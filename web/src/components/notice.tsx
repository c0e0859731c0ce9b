import type { ReactNode } from 'react';
import clsx from 'clsx';

const TONES = {
  error: 'border-danger/40 bg-danger-soft text-danger',
  info: 'border-accent/30 bg-accent-soft text-accent-strong',
  warning: 'border-amber/40 bg-amber-soft text-amber-strong',
} as const;

/** A one-line message box (errors from the API, confirmations). */
export function Notice({ tone = 'info', children }: { tone?: keyof typeof TONES; children: ReactNode }) {
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={clsx('rounded-sm border px-3 py-2 text-sm', TONES[tone])}>
      {children}
    </div>
  );
}

/** The message of an unknown thrown value. */
export function errorMessage(error: unknown): string {
  return error instanceof Error ? error.message : 'Something went wrong.';
}
