import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { isLoadActive, type SnapshotDTO } from '@shared/api/snapshots';
import { can } from '@shared/permissions';
import { QueryState } from '@/components/data-state';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { formatPercent } from '@/lib/format';
import { useSession } from '@/features/auth/api/get-session';
import { GitReleasesPanel } from '@/features/git-releases/components/git-releases-panel';
import { useRepository } from '@/features/repositories/api/get-repository';
import { useRepositorySnapshots } from '@/features/repositories/api/get-repository-snapshots';
import { OverBudgetMarker } from '@/features/repositories/components/budget-marker';
import { DeleteRepository } from '@/features/repositories/components/delete-repository';
import { RepositorySettingsForm } from '@/features/repositories/components/repository-settings-form';
import { SnapshotTable } from '@/features/repositories/components/snapshot-table';
import { CloneMap } from '@/features/repositories/components/clone-map';
import { ReleaseChanges } from '@/features/repositories/components/release-changes';
import { TrendChart } from '@/features/repositories/components/trend-chart';
import { LoadProgress } from '@/features/uploads/components/load-progress';
import { UploadForm } from '@/features/uploads/components/upload-form';

/**
 * /repositories/:id: the trend, the classes by release, the clone map, the snapshots, loads in
 * progress, and (for engineers and above) "Upload a release" and git releases; (for leads)
 * settings and delete.
 */
export function RepositoryRoute() {
  const id = Number(useParams().id);
  const repository = useRepository(id);
  const snapshots = useRepositorySnapshots(id);
  const user = useSession().data?.user;
  const role = user?.role;
  const navigate = useNavigate();
  // Loads started from this page stay in view after they end (to show the link or the reason).
  const [followed, setFollowed] = useState<number[]>([]);
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
  const mayUpload = role !== undefined && can(role, 'snapshots.upload');
  const mayCancel = (snapshot: SnapshotDTO) => role !== undefined && (can(role, 'repositories.update') || (snapshot.startedById !== null && snapshot.startedById === user?.id));
  const active = (snapshots.data?.snapshots ?? []).filter((s) => isLoadActive(s.status)).map((s) => s.id);
  const loads = [...new Set([...followed, ...active])].sort((a, b) => b - a);
  const side = mayUpload || mayUpdate || mayDelete;
  return (
    <div className="max-w-[100rem]">
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
      <div className="space-y-4">
        {loads.length > 0 ? (
          <Panel title="Loads">
            <div className="space-y-3">
              {loads.map((snapshotId) => (
                <LoadProgress key={snapshotId} snapshotId={snapshotId} mayCancel={mayCancel} />
              ))}
            </div>
          </Panel>
        ) : null}
        <div className="grid items-start gap-4 xl:grid-cols-2">
          <div className="min-w-0 space-y-4">
            <Panel title="Clone ratio by release">
              <TrendChart repositoryId={id} />
            </Panel>
            <Panel title="Classes by release">
              <ReleaseChanges repositoryId={id} />
            </Panel>
          </div>
          <Panel
            title="Clone map"
            className="min-w-0"
            actions={
              <Link to={`/clone-classes?repository=${id}`} className="text-xs text-accent-strong hover:underline">
                All its classes
              </Link>
            }
          >
            <CloneMap repositoryId={id} height={340} />
          </Panel>
        </div>
        <div className={side ? 'grid items-start gap-4 xl:grid-cols-[1fr_360px]' : ''}>
          <Panel title="Snapshots" className="min-w-0">
            <SnapshotTable repositoryId={id} />
          </Panel>
          {side ? (
            <div className="space-y-4">
              {mayUpload ? (
                <Panel title="Upload a release">
                  <UploadForm repositoryId={id} onQueued={(snapshotId) => setFollowed((ids) => (ids.includes(snapshotId) ? ids : [...ids, snapshotId]))} />
                </Panel>
              ) : null}
              {mayUpload ? (
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
    </div>
  );
}
