import clsx from 'clsx';
import type { ClassStatus } from '@shared/api/snapshots';

/** Colour only where it asks for attention: drifted (a fix may have missed a copy) and new. */
export const STATUS_TONES: Record<ClassStatus | 'gone', string> = {
  new: 'bg-accent-soft text-accent-strong',
  drifted: 'bg-amber-soft text-amber-strong',
  grown: 'bg-danger-soft text-danger',
  shrunk: 'bg-paper text-accent-strong border border-line',
  edited: 'bg-paper text-ink border border-line',
  unchanged: 'bg-paper text-muted border border-line',
  gone: 'bg-paper text-muted border border-line',
};

/** One line each: what the status means, for titles and legends. */
export const STATUS_MEANINGS: Record<ClassStatus | 'gone', string> = {
  new: 'no class of the previous snapshot continues into it',
  drifted: 'some members changed since the previous snapshot, others did not',
  grown: 'more members than before',
  shrunk: 'fewer members than before',
  edited: 'all members changed alike',
  unchanged: 'the same members, the same code',
  gone: 'a previous class that no class continues',
};

/** A class status as a small label. */
export function StatusBadge({ status }: { status: ClassStatus | 'gone' }) {
  return (
    <span
      title={STATUS_MEANINGS[status]}
      className={clsx('inline-block rounded-sm px-1.5 py-0.5 font-mono text-[11px] leading-none', STATUS_TONES[status])}
    >
      {status}
    </span>
  );
}
