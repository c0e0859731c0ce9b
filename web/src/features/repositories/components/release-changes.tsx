import { Link } from 'react-router-dom';
import type { RepositoryMetricsDTO } from '@shared/api/repositories';
import { QueryState } from '@/components/data-state';
import { useRepositoryMetrics } from '@/features/repositories/api/get-repository-metrics';

const KINDS = [
  { key: 'newClassCount', label: 'New', status: 'new', tone: 'bg-accent' },
  { key: 'driftedClassCount', label: 'Drifted', status: 'drifted', tone: 'bg-amber' },
  { key: 'goneClassCount', label: 'Gone', status: null, tone: 'bg-muted' },
] as const;

/**
 * Per release, newest first: how many classes were new, drifted apart and gone against the release
 * before, each with a bar to compare releases at a glance; new and drifted link to those classes.
 */
export function ReleaseChangesView({ metrics }: { metrics: RepositoryMetricsDTO }) {
  if (metrics.points.length === 0) return <p className="text-sm text-muted">No ready snapshot yet.</p>;
  const points = [...metrics.points].reverse();
  const most = Math.max(1, ...points.flatMap((p) => KINDS.map((k) => p[k.key])));
  return (
    <table className="w-full text-sm" aria-label="Classes new, drifted and gone by release">
      <thead>
        <tr className="text-left text-xs tracking-wide text-muted uppercase">
          <th className="pb-2 font-semibold">Release</th>
          {KINDS.map((k) => (
            <th key={k.key} className="pb-2 font-semibold">
              {k.label}
            </th>
          ))}
          <th className="pb-2 text-right font-semibold">Classes</th>
        </tr>
      </thead>
      <tbody className="font-mono text-xs">
        {points.map((p, i) => (
          <tr key={p.snapshotId} className="border-t border-line">
            <td className="py-1.5 pr-3">
              <Link to={`/snapshots/${p.snapshotId}`} className="text-accent-strong underline decoration-line underline-offset-2 hover:decoration-accent">
                {p.label}
              </Link>
              {i === points.length - 1 ? <span className="ml-2 text-muted">first</span> : null}
            </td>
            {KINDS.map((k) => {
              const n = p[k.key];
              return (
                <td key={k.key} className="py-1.5 pr-3">
                  <span className="flex items-center gap-2">
                    <span className="w-6 text-right tabular-nums">
                      {n > 0 && k.status ? (
                        <Link to={`/snapshots/${p.snapshotId}?status=${k.status}`} className="text-accent-strong hover:underline" aria-label={`${n} ${k.label.toLowerCase()} in ${p.label}`}>
                          {n}
                        </Link>
                      ) : (
                        n
                      )}
                    </span>
                    <span aria-hidden="true" className={`inline-block h-2 rounded-[1px] ${k.tone}`} style={{ width: `${(n / most) * 4}rem` }} />
                  </span>
                </td>
              );
            })}
            <td className="py-1.5 text-right tabular-nums">{p.classCount}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** A repository's class changes by release, loaded. */
export function ReleaseChanges({ repositoryId }: { repositoryId: number }) {
  const metrics = useRepositoryMetrics(repositoryId);
  if (!metrics.data) return <QueryState query={metrics} what="the changes by release" />;
  return <ReleaseChangesView metrics={metrics.data} />;
}
