import { Link } from 'react-router-dom';
import type { RepositoryDTO } from '@shared/api/repositories';
import { actionsOf } from '@shared/permissions';
import { ROLE_LABELS } from '@shared/roles';
import { QueryState } from '@/components/data-state';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { formatPercent } from '@/lib/format';
import { useSession } from '@/features/auth/api/get-session';
import { useRepositories } from '@/features/repositories/api/get-repositories';
import { TrendChart } from '@/features/repositories/components/trend-chart';

interface Figure {
  label: string;
  value: string;
  hint: string;
  alarm?: boolean;
}

/**
 * The tiles, from the repository list alone. The API has no organisation-wide (token-weighted)
 * clone ratio, so the tiles show the spread of the latest ratios instead and say so.
 */
function figuresOf(repositories: RepositoryDTO[]): Figure[] {
  const measured = repositories.filter((r) => r.latestSnapshot?.cloneRatio != null);
  const byRatio = [...measured].sort((a, b) => b.latestSnapshot!.cloneRatio! - a.latestSnapshot!.cloneRatio!);
  const highest = byRatio[0];
  const lowest = byRatio[byRatio.length - 1];
  const budgeted = repositories.filter((r) => r.cloneBudget !== null).length;
  const over = repositories.filter((r) => r.overBudget).length;
  return [
    { label: 'Repositories', value: String(repositories.length), hint: `${measured.length} with a ready snapshot` },
    { label: 'Over budget', value: String(over), hint: `of ${budgeted} with a clone budget`, alarm: over > 0 },
    {
      label: 'Highest clone ratio',
      value: formatPercent(highest?.latestSnapshot?.cloneRatio),
      hint: highest ? `${highest.name}, latest release` : 'no snapshot yet',
    },
    {
      label: 'Lowest clone ratio',
      value: formatPercent(lowest?.latestSnapshot?.cloneRatio),
      hint: lowest ? `${lowest.name}, latest release` : 'no snapshot yet',
    },
  ];
}

/** /: the organisation at a glance, from the latest snapshot of each repository. */
export function OverviewRoute() {
  const session = useSession();
  const repositories = useRepositories();
  const user = session.data?.user;
  if (!user) return null;
  const list = repositories.data?.repositories ?? [];
  const figures = repositories.data ? figuresOf(list) : null;
  // The list comes sorted by name, so the featured trend stays the same from one visit to the next.
  const featured = list.find((r) => r.latestSnapshot !== null);
  return (
    <div className="max-w-5xl">
      <PageHeader title="Overview" subtitle={`${session.data?.organisation?.name ?? ''} · signed in as ${ROLE_LABELS[user.role]}`} />
      <div className="mb-5 grid grid-cols-2 gap-3 lg:grid-cols-4">
        {(figures ?? figuresOf([])).map((figure) => (
          <div key={figure.label} role="group" aria-label={figure.label} className="rounded-sm border border-line bg-panel px-4 py-3">
            <div className="text-xs tracking-wide text-muted uppercase">{figure.label}</div>
            <div className={`mt-1 font-mono text-2xl tabular-nums ${!figures ? 'text-ink/40' : figure.alarm ? 'text-danger' : ''}`}>
              {figures ? figure.value : '—'}
            </div>
            <div className="truncate text-xs text-muted">{figure.hint}</div>
          </div>
        ))}
      </div>
      {repositories.isError ? (
        <div className="mb-4">
          <QueryState query={repositories} what="repositories" />
        </div>
      ) : null}
      <div className="grid items-start gap-4 lg:grid-cols-[2fr_1fr]">
        <Panel
          title={featured ? `Clone ratio by release · ${featured.name}` : 'Clone ratio by release'}
          actions={
            featured ? (
              <Link to={`/repositories/${featured.id}`} className="text-xs text-accent hover:underline">
                Open repository
              </Link>
            ) : null
          }
        >
          {featured ? (
            <TrendChart repositoryId={featured.id} height={180} />
          ) : (
            <div className="flex h-40 items-center justify-center rounded-sm border border-dashed border-line text-sm text-muted">
              {repositories.isPending ? 'Loading…' : 'No snapshots yet. A trend appears here once a repository has a loaded release.'}
            </div>
          )}
        </Panel>
        <Panel title="Your access">
          <ul className="space-y-1 font-mono text-xs">
            {actionsOf(user.role).map((action) => (
              <li key={action} className="flex items-center gap-2">
                <span className="inline-block h-1.5 w-1.5 rounded-full bg-accent" />
                {action}
              </li>
            ))}
          </ul>
        </Panel>
      </div>
    </div>
  );
}
