import { Link } from 'react-router-dom';
import { QueryState } from '@/components/data-state';
import { formatDateTime, formatPercent } from '@/lib/format';
import { useRepositories } from '@/features/repositories/api/get-repositories';
import { OverBudgetMarker } from './budget-marker';

/** The organisation's repositories: latest release, its clone ratio against the budget. */
export function RepositoryTable() {
  const repositories = useRepositories();
  if (!repositories.data) return <QueryState query={repositories} what="repositories" />;
  if (repositories.data.repositories.length === 0) {
    return <p className="text-sm text-muted">No repositories yet. A lead adds one, then CI or the command line loads its releases.</p>;
  }
  return (
    <table className="w-full text-sm">
      <thead>
        <tr className="text-left text-xs tracking-wide text-muted uppercase">
          <th className="pb-2 font-semibold">Repository</th>
          <th className="pb-2 font-semibold">Latest release</th>
          <th className="pb-2 text-right font-semibold">Clone ratio</th>
          <th className="pb-2 text-right font-semibold">Budget</th>
          <th className="pb-2" />
        </tr>
      </thead>
      <tbody>
        {repositories.data.repositories.map((repository) => (
          <tr key={repository.id} className="border-t border-line align-middle">
            <td className="py-2 pr-4">
              <Link to={`/repositories/${repository.id}`} className="font-mono font-medium text-accent hover:underline">
                {repository.name}
              </Link>
              {repository.description ? <div className="truncate text-xs text-muted">{repository.description}</div> : null}
            </td>
            <td className="py-2 pr-4">
              {repository.latestSnapshot ? (
                <>
                  <span className="font-mono">{repository.latestSnapshot.label}</span>
                  <span className="ml-2 font-mono text-xs text-muted">{formatDateTime(repository.latestSnapshot.createdAt)}</span>
                </>
              ) : (
                <span className="text-xs text-muted">no snapshot yet</span>
              )}
            </td>
            <td className="py-2 pr-4 text-right font-mono tabular-nums">{formatPercent(repository.latestSnapshot?.cloneRatio)}</td>
            <td className="py-2 pr-4 text-right font-mono text-muted tabular-nums">{formatPercent(repository.cloneBudget)}</td>
            <td className="py-2 text-right">{repository.overBudget ? <OverBudgetMarker /> : null}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
