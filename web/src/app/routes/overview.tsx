import { Link } from 'react-router-dom';
import type { OrganisationTrendDTO } from '@shared/api/organisation';
import type { RepositoryDTO } from '@shared/api/repositories';
import { ROLE_LABELS } from '@shared/roles';
import { QueryState } from '@/components/data-state';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { formatPercent } from '@/lib/format';
import { useSession } from '@/features/auth/api/get-session';
import { useOrganisationClasses } from '@/features/clone-classes/api/get-organisation-classes';
import { DriftedClasses } from '@/features/clone-classes/components/drifted-classes';
import { useOrganisationTrend } from '@/features/organisation/api/get-organisation-trend';
import { LatestLoads } from '@/features/organisation/components/latest-loads';
import { OrganisationTrendChart } from '@/features/organisation/components/organisation-trend-chart';
import { useRepositories } from '@/features/repositories/api/get-repositories';
import { OverBudgetMarker } from '@/features/repositories/components/budget-marker';
import { MyOpenTasks } from '@/features/tasks/components/my-open-tasks';

interface Figure {
  label: string;
  value: string | null;
  hint: string;
  alarm?: boolean;
  to?: string;
}

function figuresOf(repositories: RepositoryDTO[] | undefined, trend: OrganisationTrendDTO | undefined, drifted: number | undefined, across: number | undefined): Figure[] {
  const latest = trend?.points[trend.points.length - 1];
  const over = repositories?.filter((r) => r.overBudget).length;
  const budgeted = repositories?.filter((r) => r.cloneBudget !== null).length ?? 0;
  return [
    {
      label: 'Clone ratio, all repositories',
      value: trend ? formatPercent(latest?.cloneRatio) : null,
      hint: latest ? `${latest.clonedTokens.toLocaleString('en')} of ${latest.fragmentTokens.toLocaleString('en')} tokens` : 'no release loaded yet',
    },
    { label: 'Over budget', value: over === undefined ? null : String(over), hint: `of ${budgeted} with a clone budget`, alarm: (over ?? 0) > 0 },
    { label: 'Drifted classes', value: drifted === undefined ? null : String(drifted), hint: 'in the latest releases', alarm: (drifted ?? 0) > 0, to: '/clone-classes?status=drifted' },
    { label: 'Classes across repositories', value: across === undefined ? null : String(across), hint: 'copies in more than one repository', to: '/clone-classes?scope=across' },
  ];
}

function Tiles({ figures }: { figures: Figure[] }) {
  return (
    <div className="mb-5 grid grid-cols-2 gap-3 lg:grid-cols-4">
      {figures.map((figure) => {
        const body = (
          <>
            <div className="text-xs tracking-wide text-muted uppercase">{figure.label}</div>
            <div className={`mt-1 font-mono text-2xl tabular-nums ${figure.value === null ? 'text-ink/40' : figure.alarm ? 'text-danger' : ''}`}>{figure.value ?? '—'}</div>
            <div className="truncate text-xs text-muted">{figure.hint}</div>
          </>
        );
        return (
          <div key={figure.label} role="group" aria-label={figure.label} className="rounded-sm border border-line bg-panel px-4 py-3">
            {figure.to ? (
              <Link to={figure.to} className="block hover:[&>div:nth-child(2)]:underline">
                {body}
              </Link>
            ) : (
              body
            )}
          </div>
        );
      })}
    </div>
  );
}

function OverBudgetList({ repositories }: { repositories: RepositoryDTO[] }) {
  const over = repositories.filter((r) => r.overBudget);
  if (over.length === 0) {
    return <p className="text-sm text-muted">No repository is over its clone budget.</p>;
  }
  return (
    <ul className="space-y-2 text-sm" aria-label="Repositories over budget">
      {over.map((r) => (
        <li key={r.id} className="flex flex-wrap items-center justify-between gap-2">
          <Link to={`/repositories/${r.id}`} className="font-mono text-accent-strong hover:underline">
            {r.name}
          </Link>
          <span className="flex items-center gap-2 font-mono text-xs tabular-nums">
            {formatPercent(r.latestSnapshot?.unwaivedCloneRatio ?? r.latestSnapshot?.cloneRatio)} of {formatPercent(r.cloneBudget)}
            <OverBudgetMarker />
          </span>
        </li>
      ))}
    </ul>
  );
}

/** /: what needs attention across the organisation, from the latest release of each repository. */
export function OverviewRoute() {
  const session = useSession();
  const repositories = useRepositories();
  const trend = useOrganisationTrend();
  const drifted = useOrganisationClasses({ status: 'drifted', pageSize: 1 });
  const across = useOrganisationClasses({ scope: 'across', pageSize: 1 });
  const user = session.data?.user;
  if (!user) return null;
  return (
    <div className="max-w-[90rem]">
      <PageHeader title="Overview" subtitle={`${session.data?.organisation?.name ?? ''} · signed in as ${ROLE_LABELS[user.role]}`} />
      <Tiles figures={figuresOf(repositories.data?.repositories, trend.data, drifted.data?.total, across.data?.total)} />
      <div className="grid items-start gap-4 lg:grid-cols-[3fr_2fr]">
        <div className="min-w-0 space-y-4">
          <Panel title="Clone ratio across all repositories">
            {trend.data ? <OrganisationTrendChart trend={trend.data} /> : <QueryState query={trend} what="the trend" />}
          </Panel>
          <Panel title="Latest loads">
            <LatestLoads />
          </Panel>
        </div>
        <div className="min-w-0 space-y-4">
          <Panel title="Over budget">
            {repositories.data ? <OverBudgetList repositories={repositories.data.repositories} /> : <QueryState query={repositories} what="repositories" />}
          </Panel>
          <Panel title="Newly drifted classes">
            <DriftedClasses />
          </Panel>
          <MyOpenTasks />
        </div>
      </div>
    </div>
  );
}
