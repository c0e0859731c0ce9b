import { useId, type ReactNode } from 'react';
import clsx from 'clsx';

/** A bordered section with an optional title bar and actions; the title names the section (a landmark). */
export function Panel({
  title,
  actions,
  children,
  className,
}: {
  title?: ReactNode;
  actions?: ReactNode;
  children: ReactNode;
  className?: string;
}) {
  const titleId = useId();
  return (
    <section aria-labelledby={title ? titleId : undefined} className={clsx('rounded-sm border border-line bg-panel', className)}>
      {title || actions ? (
        <header className="flex items-center justify-between gap-4 border-b border-line px-4 py-2">
          <h2 id={titleId} className="text-xs font-semibold tracking-wider text-muted uppercase">
            {title}
          </h2>
          {actions}
        </header>
      ) : null}
      <div className="p-4">{children}</div>
    </section>
  );
}
