import type { ButtonHTMLAttributes } from 'react';
import clsx from 'clsx';

const VARIANTS = {
  primary: 'bg-accent text-white hover:bg-accent-strong border-accent',
  secondary: 'bg-panel text-ink hover:bg-paper border-line',
  danger: 'bg-panel text-danger hover:bg-danger-soft border-line',
  ghost: 'bg-transparent text-rail-ink hover:bg-rail-active border-transparent',
} as const;

/** Props of Button: a native button plus a variant. */
export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: keyof typeof VARIANTS;
}

/** The one button of the app. */
export function Button({ variant = 'primary', className, type = 'button', ...props }: ButtonProps) {
  return (
    <button
      type={type}
      className={clsx(
        'inline-flex items-center gap-1.5 rounded-sm border px-3 py-1.5 text-sm font-medium transition-colors',
        'focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-accent disabled:cursor-not-allowed disabled:opacity-50',
        VARIANTS[variant],
        className,
      )}
      {...props}
    />
  );
}
