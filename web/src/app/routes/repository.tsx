import { Link, useNavigate, useParams } from 'react-router-dom';
import { can } from '@shared/permissions';
import { QueryState } from '@/components/data-state';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { formatPercent } from '@/lib/format';
import { useSession } from '@/features/auth/api/get-session';
import { GitReleasesPanel } from '@/features/git-releases/components/git-releases-panel';
import { useRepository } from '@/features/repositories/api/get-repository';
import { OverBudgetMarker } from '@/features/repositories/components/budget-marker';
import { DeleteRepository } from '@/features/repositories/components/delete-repository';
import { RepositorySettingsForm } from '@/features/repositories/components/repository-settings-form';
import { SnapshotTable } from '@/features/repositories/components/snapshot-table';
import { TrendChart } from '@/features/repositories/components/trend-chart';

/** /repositories/:id: the trend, the snapshots, git releases (engineers and up), and (for leads) settings and delete. */
export function RepositoryRoute() {
  const id = Number(useParams().id);
  const repository = useRepository(id);
  const role = useSession().data?.user?.role;
  const navigate = useNavigate();
  if (!repository.data) {
    return (
      <div className="max-w-lg">
        <QueryState query={repository} what="the repository" />
      </div>
    );
  }
  const r = repository.data;
  const mayUpdate = role !== undefined && can(role, 'repositories.update');
  const mayDelete = role !== undefined && can(role, 'repositories.delete');
  const mayImport = role !== undefined && can(role, 'snapshots.upload');
  const sidebar = mayUpdate || mayDelete || mayImport;
  return (
    <div className="max-w-6xl">
      <div className="mb-1 text-xs text-muted">
        <Link to="/repositories" className="hover:underline">
          Repositories
        </Link>{' '}
        /
      </div>
      <PageHeader
        title={r.name}
        subtitle={
          <span className="font-mono text-xs">
            threshold {r.threshold} · min {r.minTokens} tokens · shingle {r.shingleSize} · budget {formatPercent(r.cloneBudget)}
            {r.latestSnapshot ? ` · latest ${r.latestSnapshot.label} at ${formatPercent(r.latestSnapshot.cloneRatio)}` : ''}
            {r.overBudget ? (
              <span className="ml-2">
                <OverBudgetMarker />
              </span>
            ) : null}
          </span>
        }
      />
      {r.description ? <p className="-mt-2 mb-4 text-sm">{r.description}</p> : null}
      <div className={sidebar ? 'grid items-start gap-4 xl:grid-cols-[1fr_320px]' : ''}>
        <div className="min-w-0 space-y-4">
          <Panel title="Clone ratio by release">
            <TrendChart repositoryId={id} />
          </Panel>
          <Panel title="Snapshots">
            <SnapshotTable repositoryId={id} />
          </Panel>
        </div>
        {sidebar ? (
          <div className="space-y-4">
            {mayImport ? (
              <Panel title="Git releases">
                <GitReleasesPanel repositoryId={id} mayLink={mayUpdate} />
              </Panel>
            ) : null}
            {mayUpdate ? (
              <Panel title="Settings">
                <RepositorySettingsForm repository={r} />
              </Panel>
            ) : null}
            {mayDelete ? (
              <Panel title="Delete">
                <DeleteRepository repository={r} onDeleted={() => navigate('/repositories', { replace: true })} />
              </Panel>
            ) : null}
          </div>
        ) : null}
      </div>
    </div>
  );
}
