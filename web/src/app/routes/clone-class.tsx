import { Link, useParams } from 'react-router-dom';
import { can } from '@shared/permissions';
import type { CloneClassDetailDTO } from '@shared/api/snapshots';
import { QueryState } from '@/components/data-state';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { formatSimilarity } from '@/lib/format';
import { useCloneClass } from '@/features/clone-classes/api/get-clone-class';
import { ClassMembers, ClassPairs } from '@/features/clone-classes/components/class-members';
import { StatusBadge } from '@/features/clone-classes/components/status-badge';
import { ClassWaiver } from '@/features/clone-classes/components/class-waiver';
import { useSession } from '@/features/auth/api/get-session';
import { useRepository } from '@/features/repositories/api/get-repository';
import { ClassTask, suggestTaskTitle } from '@/features/tasks/components/class-task';

function CloneClassPage({ detail }: { detail: CloneClassDetailDTO }) {
  const repository = useRepository(detail.repositoryId);
  const role = useSession().data?.user?.role;
  const similarity =
    detail.minSimilarity === detail.maxSimilarity
      ? formatSimilarity(detail.minSimilarity)
      : `${formatSimilarity(detail.minSimilarity)}–${formatSimilarity(detail.maxSimilarity)}`;
  return (
    <div className="max-w-[110rem] space-y-4">
      <div>
        <div className="mb-1 text-xs text-muted">
          <Link to={`/repositories/${detail.repositoryId}`} className="font-mono hover:underline">
            {repository.data?.name ?? `#${detail.repositoryId}`}
          </Link>{' '}
          /{' '}
          <Link to={`/snapshots/${detail.snapshotId}`} className="font-mono hover:underline">
            {detail.snapshotLabel}
          </Link>{' '}
          /
        </div>
        <PageHeader
          title={`Clone class #${detail.id}`}
          subtitle={
            <span className="flex flex-wrap items-center gap-x-3 gap-y-1 font-mono text-xs">
              <StatusBadge status={detail.status} />
              <span>type {detail.cloneType}</span>
              <span>{detail.size} members</span>
              <span>{detail.tokens} tokens</span>
              <span>similarity {similarity}</span>
              <span>{detail.language}</span>
            </span>
          }
        />
        <ClassWaiver detail={detail} mayWaive={role !== undefined && can(role, 'cloneClasses.waive')} />
        <ClassTask cloneClassId={detail.id} lineageId={detail.lineageId} suggestedTitle={suggestTaskTitle(detail)} mayCreate={role !== undefined && can(role, 'tasks.create')} />
      </div>
      <ClassMembers detail={detail} />
      {detail.pairs.length > 1 ? (
        <Panel title={`Pairs (${detail.pairs.length})`}>
          <ClassPairs detail={detail} />
        </Panel>
      ) : null}
    </div>
  );
}

/** /clone-classes/:id: a class's members side by side. */
export function CloneClassRoute() {
  const id = Number(useParams().id);
  const detail = useCloneClass(id);
  if (!detail.data) {
    return (
      <div className="max-w-lg">
        <QueryState query={detail} what="the clone class" />
      </div>
    );
  }
  return <CloneClassPage key={detail.data.id} detail={detail.data} />;
}
