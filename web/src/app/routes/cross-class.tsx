import { Link, useParams } from 'react-router-dom';
import type { CrossClassDetailDTO } from '@shared/api/clone-classes';
import { QueryState } from '@/components/data-state';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { formatLocation, formatSimilarity } from '@/lib/format';
import { useCrossClass } from '@/features/clone-classes/api/get-cross-class';
import { ClassMembers, ClassPairs } from '@/features/clone-classes/components/class-members';
import { AcrossBadge } from '@/features/clone-classes/components/organisation-class-table';

function CrossClassPage({ detail }: { detail: CrossClassDetailDTO }) {
  const similarity =
    detail.minSimilarity === detail.maxSimilarity
      ? formatSimilarity(detail.minSimilarity)
      : `${formatSimilarity(detail.minSimilarity)}–${formatSimilarity(detail.maxSimilarity)}`;
  return (
    <div className="max-w-[110rem] space-y-4">
      <div>
        <div className="mb-1 text-xs text-muted">
          <Link to="/clone-classes?scope=across" className="hover:underline">
            Clone classes across repositories
          </Link>{' '}
          /
        </div>
        <PageHeader
          title={`Clone class ×${detail.id}`}
          subtitle={
            <span className="flex flex-wrap items-center gap-x-3 gap-y-1 font-mono text-xs">
              <AcrossBadge count={detail.repositories.length} />
              <span>type {detail.cloneType}</span>
              <span>{detail.size} members</span>
              <span>{detail.tokens} tokens</span>
              <span>similarity {similarity}</span>
              <span>{detail.language}</span>
            </span>
          }
        />
      </div>
      <Panel title="Where the copies are">
        <table className="w-full text-sm" aria-label="Members by repository">
          <thead>
            <tr className="text-left text-xs tracking-wide text-muted uppercase">
              <th className="pb-2 font-semibold">Repository</th>
              <th className="pb-2 font-semibold">Function</th>
              <th className="pb-2 font-semibold">Location</th>
              <th className="pb-2 text-right font-semibold">Tokens</th>
              <th className="pb-2 pl-4 font-semibold">In its repository</th>
            </tr>
          </thead>
          <tbody className="font-mono text-xs">
            {detail.members.map((m) => (
              <tr key={`${m.snapshotId}-${m.fragmentId}-${m.path}`} className="border-t border-line">
                <td className="py-1.5 pr-3">
                  <Link to={`/repositories/${m.repositoryId}`} className="text-accent-strong hover:underline">
                    {m.repositoryName}
                  </Link>{' '}
                  <Link to={`/snapshots/${m.snapshotId}`} className="text-muted hover:underline">
                    @{m.snapshotLabel}
                  </Link>
                </td>
                <td className="py-1.5 pr-3">{m.name}</td>
                <td className="py-1.5 pr-3">{formatLocation(m.path, m.startLine, m.endLine)}</td>
                <td className="py-1.5 pr-3 text-right tabular-nums">{m.tokens}</td>
                <td className="py-1.5 pl-4">
                  {m.classId !== null ? (
                    <Link to={`/clone-classes/${m.classId}`} className="text-accent-strong hover:underline">
                      class #{m.classId}
                    </Link>
                  ) : (
                    <span className="text-muted">its only copy there</span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </Panel>
      <ClassMembers detail={detail} />
      {detail.pairs.length > 1 ? (
        <Panel title={`Pairs (${detail.pairs.length})`}>
          <ClassPairs detail={detail} />
        </Panel>
      ) : null}
    </div>
  );
}

/** /clone-classes/across/:id: a class whose copies span repositories, its members side by side. */
export function CrossClassRoute() {
  const id = Number(useParams().id);
  const detail = useCrossClass(id);
  if (!detail.data) {
    return (
      <div className="max-w-lg">
        <QueryState query={detail} what="the clone class" />
      </div>
    );
  }
  return <CrossClassPage key={detail.data.id} detail={detail.data} />;
}
