import { Link } from 'react-router-dom';
import { QueryState } from '@/components/data-state';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { formatPercent } from '@/lib/format';
import { useRepositories } from '@/features/repositories/api/get-repositories';

/** /clone-classes: the way in to each repository's latest clone classes. */
export function CloneClassesRoute() {
  const repositories = useRepositories();
  return (
    <div className="max-w-5xl">
      <PageHeader title="Clone classes" subtitle="Groups of near-identical functions, by the latest release of each repository." />
      <Panel>
        {repositories.data ? (
          repositories.data.repositories.length === 0 ? (
            <p className="text-sm text-muted">No repositories yet.</p>
          ) : (
            <ul className="divide-y divide-line text-sm">
              {repositories.data.repositories.map((r) => (
                <li key={r.id} className="flex items-center justify-between gap-4 py-2">
                  <span className="font-mono font-medium">{r.name}</span>
                  {r.latestSnapshot ? (
                    <Link to={`/snapshots/${r.latestSnapshot.id}`} className="font-mono text-accent hover:underline">
                      {r.latestSnapshot.label} · {formatPercent(r.latestSnapshot.cloneRatio)} →
                    </Link>
                  ) : (
                    <span className="text-xs text-muted">no snapshot yet</span>
                  )}
                </li>
              ))}
            </ul>
          )
        ) : (
          <QueryState query={repositories} what="repositories" />
        )}
      </Panel>
    </div>
  );
}
