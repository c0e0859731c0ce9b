import { Link } from 'react-router-dom';
import clsx from 'clsx';
import type { SnapshotDTO } from '@shared/api/snapshots';
import { QueryState } from '@/components/data-state';
import { formatDateTime, formatPercent } from '@/lib/format';
import { useRepositorySnapshots } from '@/features/repositories/api/get-repository-snapshots';

const STATUS_TONES: Record<SnapshotDTO['status'], string> = {
  ready: 'text-accent',
  running: 'text-amber-strong',
  queued: 'text-muted',
  failed: 'text-danger',
  cancelled: 'text-muted',
};

/** A repository's snapshots, newest first; ready ones link to their clone classes. */
export function SnapshotTable({ repositoryId }: { repositoryId: number }) {
  const snapshots = useRepositorySnapshots(repositoryId);
  if (!snapshots.data) return <QueryState query={snapshots} what="snapshots" />;
  if (snapshots.data.snapshots.length === 0) {
    return <p className="text-sm text-muted">No snapshots yet. Upload a release, or load one with the command line or from CI.</p>;
  }
  return (
    <table className="w-full text-sm" aria-label="Snapshots">
      <thead>
        <tr className="text-left text-xs tracking-wide text-muted uppercase">
          <th className="pb-2 font-semibold">Release</th>
          <th className="pb-2 font-semibold">Status</th>
          <th className="pb-2 text-right font-semibold">Files</th>
          <th className="pb-2 text-right font-semibold">Fragments</th>
          <th className="pb-2 text-right font-semibold">Classes</th>
          <th className="pb-2 text-right font-semibold">Clone ratio</th>
          <th className="pb-2 text-right font-semibold">Created</th>
        </tr>
      </thead>
      <tbody className="font-mono tabular-nums">
        {snapshots.data.snapshots.map((snapshot) => (
          <tr key={snapshot.id} className="border-t border-line">
            <td className="py-1.5 pr-4">
              {snapshot.status === 'ready' ? (
                <Link to={`/snapshots/${snapshot.id}`} className="font-medium text-accent hover:underline">
                  {snapshot.label}
                </Link>
              ) : (
                snapshot.label
              )}
            </td>
            <td className={clsx('py-1.5 pr-4 text-xs', STATUS_TONES[snapshot.status])} title={snapshot.error ?? undefined}>
              {snapshot.status}
            </td>
            <td className="py-1.5 pr-4 text-right">
              {snapshot.fileCount}
              {snapshot.failedCount > 0 ? <span className="ml-1 text-xs text-danger">({snapshot.failedCount} failed)</span> : null}
            </td>
            <td className="py-1.5 pr-4 text-right">{snapshot.fragmentCount}</td>
            <td className="py-1.5 pr-4 text-right">{snapshot.metrics?.classCount ?? '—'}</td>
            <td className="py-1.5 pr-4 text-right">{formatPercent(snapshot.metrics?.cloneRatio ?? snapshot.cloneRatio)}</td>
            <td className="py-1.5 text-right text-xs text-muted">{formatDateTime(snapshot.createdAt)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
