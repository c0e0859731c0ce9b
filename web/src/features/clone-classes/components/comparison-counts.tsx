import clsx from 'clsx';
import type { ClassStatus, SnapshotComparisonDTO } from '@shared/api/snapshots';
import { STATUS_MEANINGS } from './status-badge';

/** Display order: what needs a look first. */
const ORDER = ['new', 'drifted', 'grown', 'edited', 'shrunk', 'unchanged', 'gone'] as const;

/**
 * The classes of a snapshot counted by status against the previous snapshot; a click on a count
 * filters the table to that status (gone classes are not in this snapshot, so they are not a filter).
 */
export function ComparisonCounts({
  comparison,
  active,
  onPick,
}: {
  comparison: SnapshotComparisonDTO;
  active?: ClassStatus;
  onPick: (status: ClassStatus | undefined) => void;
}) {
  return (
    <div>
      <p className="mb-2 text-xs text-muted">
        {comparison.previous ? (
          <>
            Compared with <span className="font-mono text-ink">{comparison.previous.label}</span>, the previous ready snapshot.
          </>
        ) : (
          'The first snapshot of this repository: every class is new.'
        )}
      </p>
      <ul className="grid grid-cols-4 gap-2 sm:grid-cols-7" aria-label="Classes by status">
        {ORDER.map((status) => {
          const count = comparison.counts[status];
          const selected = status !== 'gone' && active === status;
          const body = (
            <>
              <span className="block font-mono text-lg leading-tight tabular-nums">{count}</span>
              <span className="block text-[11px] tracking-wide uppercase">{status}</span>
            </>
          );
          const tile = clsx(
            'block w-full rounded-sm border px-2 py-1.5 text-left',
            selected ? 'border-accent bg-accent-soft text-accent-strong' : 'border-line bg-white',
            count === 0 && !selected && 'text-muted',
            status === 'drifted' && count > 0 && !selected && 'border-amber/50 text-amber-strong',
          );
          return (
            <li key={status}>
              {status === 'gone' ? (
                <div className={tile} title={STATUS_MEANINGS.gone}>
                  {body}
                </div>
              ) : (
                <button
                  type="button"
                  className={clsx(tile, 'hover:border-accent')}
                  title={STATUS_MEANINGS[status]}
                  aria-pressed={selected}
                  onClick={() => onPick(selected ? undefined : status)}
                >
                  {body}
                </button>
              )}
            </li>
          );
        })}
      </ul>
    </div>
  );
}
