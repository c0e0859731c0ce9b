import { useQueries } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import type { RepositoryDTO } from '@shared/api/repositories';
import { ROLE_LABELS } from '@shared/roles';
import { QueryState } from '@/components/data-state';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { formatDateTime, formatPercent } from '@/lib/format';
import { useSession } from '@/features/auth/api/get-session';
import { useRepositories } from '@/features/repositories/api/get-repositories';
import { repositoryMetricsQueryOptions } from '@/features/repositories/api/get-repository-metrics';
import { OverBudgetMarker } from '@/features/repositories/components/budget-marker';
import { TrendChartView } from '@/features/repositories/components/trend-chart';
import { MyOpenTasks } from '@/features/tasks/components/my-open-tasks';

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

// How many repositories' trends the overview reads to find one worth drawing: bounded, so a large
// organisation does not fetch every trend just to open its overview.
const TREND_CANDIDATES = 12;
const LATEST_LOADS = 8;

/**
 * The trend worth showing: the first repository (by name, so it stays the same between visits)
 * with more than one ready release; failing that, the first with one.
 */
function useFeaturedTrend(repositories: RepositoryDTO[]) {
  const candidates = repositories.filter((r) => r.latestSnapshot !== null).slice(0, TREND_CANDIDATES);
  const trends = useQueries({ queries: candidates.map((r) => repositoryMetricsQueryOptions(r.id)) });
  const pending = trends.some((t) => t.isPending);
  const index = trends.findIndex((t) => (t.data?.points.length ?? 0) > 1);
  const chosen = index >= 0 ? index : trends.findIndex((t) => (t.data?.points.length ?? 0) > 0);
  // Wait for every candidate before choosing, so the chart does not jump from one repository to another.
  if (pending || chosen < 0) return { pending, repository: null, metrics: null };
  return { pending, repository: candidates[chosen], metrics: trends[chosen].data! };
}

function OverBudgetList({ repositories }: { repositories: RepositoryDTO[] }) {
  const over = repositories.filter((r) => r.overBudget);
  if (over.length === 0) {
    return <p className="text-sm text-muted">No repository is over its clone budget.</p>;
  }
  return (
    <ul className="space-y-2 text-sm">
      {over.map((r) => (
        <li key={r.id} className="flex flex-wrap items-center justify-between gap-2">
          <Link to={`/repositories/${r.id}`} className="font-mono text-accent-strong hover:underline">
            {r.name}
          </Link>
          <span className="flex items-center gap-2 font-mono text-xs tabular-nums">
            {formatPercent(r.latestSnapshot?.cloneRatio)} of {formatPercent(r.cloneBudget)}
            <OverBudgetMarker />
          </span>
        </li>
      ))}
    </ul>
  );
}

function LatestLoads({ repositories }: { repositories: RepositoryDTO[] }) {
  const loads = repositories
    .filter((r) => r.latestSnapshot !== null)
    .sort((a, b) => b.latestSnapshot!.createdAt.localeCompare(a.latestSnapshot!.createdAt))
    .slice(0, LATEST_LOADS);
  if (loads.length === 0) return <p className="text-sm text-muted">No release loaded yet.</p>;
  return (
    <table className="w-full text-sm" aria-label="Latest snapshots">
      <thead>
        <tr className="text-left text-xs tracking-wide text-muted uppercase">
          <th className="pb-2 font-semibold">Repository</th>
          <th className="pb-2 font-semibold">Release</th>
          <th className="pb-2 text-right font-semibold">Clone ratio</th>
          <th className="pb-2 text-right font-semibold">Loaded</th>
        </tr>
      </thead>
      <tbody className="font-mono text-xs">
        {loads.map((r) => (
          <tr key={r.id} className="border-t border-line">
            <td className="py-1.5 pr-3">
              <Link to={`/repositories/${r.id}`} className="text-accent-strong hover:underline">
                {r.name}
              </Link>
            </td>
            <td className="py-1.5 pr-3">
              <Link to={`/snapshots/${r.latestSnapshot!.id}`} className="text-accent-strong hover:underline">
                {r.latestSnapshot!.label}
              </Link>
            </td>
            <td className="py-1.5 pr-3 text-right tabular-nums">{formatPercent(r.latestSnapshot!.cloneRatio)}</td>
            <td className="py-1.5 text-right text-muted">{formatDateTime(r.latestSnapshot!.createdAt)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** A section whose data comes with a later server API; it says so instead of showing anything made up. */
function AwaitingData({ children }: { children: string }) {
  return <p className="rounded-sm border border-dashed border-line px-3 py-4 text-sm text-muted">{children}</p>;
}

/** /: what needs attention across the organisation, from the latest snapshot of each repository. */
export function OverviewRoute() {
  const session = useSession();
  const repositories = useRepositories();
  const user = session.data?.user;
  const list = repositories.data?.repositories ?? [];
  const featured = useFeaturedTrend(list);
  if (!user) return null;
  const figures = repositories.data ? figuresOf(list) : null;
  return (
    <div className="max-w-6xl">
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
          title={featured.repository ? `Clone ratio by release · ${featured.repository.name}` : 'Clone ratio by release'}
          actions={
            featured.repository ? (
              <Link to={`/repositories/${featured.repository.id}`} className="text-xs text-accent-strong hover:underline">
                Open repository
              </Link>
            ) : null
          }
        >
          {featured.metrics ? (
            <TrendChartView metrics={featured.metrics} height={180} />
          ) : (
            <div className="flex h-40 items-center justify-center rounded-sm border border-dashed border-line text-sm text-muted">
              {repositories.isPending || featured.pending ? 'Loading…' : 'No snapshots yet. A trend appears here once a repository has a loaded release.'}
            </div>
          )}
        </Panel>
        <div className="space-y-4">
          <Panel title="Over budget">
            {repositories.data ? <OverBudgetList repositories={list} /> : <p className="text-sm text-muted">Loading…</p>}
          </Panel>
          <MyOpenTasks />
        </div>
        <Panel title="Latest snapshots">
          {repositories.data ? <LatestLoads repositories={list} /> : <p className="text-sm text-muted">Loading…</p>}
        </Panel>
        <Panel title="Newly drifted classes">
          <AwaitingData>
            Classes that drifted in the latest releases, across repositories, will be listed here. Until then, open a snapshot and filter its classes by status.
          </AwaitingData>
        </Panel>
      </div>
    </div>
  );
}
