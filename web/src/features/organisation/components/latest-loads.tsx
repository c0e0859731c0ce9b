import { Link } from 'react-router-dom';
import clsx from 'clsx';
import type { SnapshotStatus } from '@shared/api/snapshots';
import { QueryState } from '@/components/data-state';
import { formatDateTime, formatPercent } from '@/lib/format';
import { useLatestLoads } from '@/features/organisation/api/get-latest-loads';

const STATUS_TONES: Record<SnapshotStatus, string> = {
  ready: 'bg-accent-soft text-accent-strong',
  running: 'bg-amber-soft text-amber-strong',
  queued: 'bg-paper text-muted border border-line',
  failed: 'bg-danger-soft text-danger',
  cancelled: 'bg-paper text-muted border border-line',
};

/** The latest loads of every repository, newest first, with where each stands. */
export function LatestLoads({ limit = 8 }: { limit?: number }) {
  const loads = useLatestLoads(limit);
  if (!loads.data) return <QueryState query={loads} what="the latest loads" />;
  if (loads.data.loads.length === 0) return <p className="text-sm text-muted">No release loaded yet.</p>;
  return (
    <table className="w-full text-sm" aria-label="Latest loads">
      <thead>
        <tr className="text-left text-xs tracking-wide text-muted uppercase">
          <th className="pb-2 font-semibold">Repository</th>
          <th className="pb-2 font-semibold">Release</th>
          <th className="pb-2 font-semibold">Load</th>
          <th className="pb-2 text-right font-semibold">Clone ratio</th>
          <th className="pb-2 text-right font-semibold">Started</th>
        </tr>
      </thead>
      <tbody className="font-mono text-xs">
        {loads.data.loads.map((l) => (
          <tr key={l.snapshotId} className="border-t border-line align-top">
            <td className="py-1.5 pr-3">
              <Link to={`/repositories/${l.repository.id}`} className="text-accent-strong hover:underline">
                {l.repository.name}
              </Link>
            </td>
            <td className="py-1.5 pr-3">
              <Link to={`/snapshots/${l.snapshotId}`} className="text-accent-strong hover:underline">
                {l.label}
              </Link>
            </td>
            <td className="py-1.5 pr-3">
              <span className={clsx('inline-block rounded-sm px-1.5 py-0.5 text-[11px] leading-none', STATUS_TONES[l.status])} title={l.error ?? undefined}>
                {l.status}
              </span>
              {l.error ? <span className="mt-0.5 block truncate text-danger">{l.error}</span> : null}
            </td>
            <td className="py-1.5 pr-3 text-right tabular-nums">{formatPercent(l.cloneRatio)}</td>
            <td className="py-1.5 text-right text-muted">{formatDateTime(l.createdAt)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
