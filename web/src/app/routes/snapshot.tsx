import { Link, useParams } from 'react-router-dom';
import type { SnapshotDTO } from '@shared/api/snapshots';
import { QueryState } from '@/components/data-state';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { formatDateTime, formatPercent } from '@/lib/format';
import { useSnapshot } from '@/features/clone-classes/api/get-snapshot';
import { useSnapshotClasses } from '@/features/clone-classes/api/get-snapshot-classes';
import { useSnapshotComparison } from '@/features/clone-classes/api/get-snapshot-comparison';
import { ClassFilters } from '@/features/clone-classes/components/class-filters';
import { CloneClassTable } from '@/features/clone-classes/components/clone-class-table';
import { ComparisonCounts } from '@/features/clone-classes/components/comparison-counts';
import { Pagination } from '@/features/clone-classes/components/pagination';
import { useClassFilters } from '@/features/clone-classes/hooks/use-class-filters';
import { toggleClassSort } from '@/features/clone-classes/lib/class-filters';
import { useRepository } from '@/features/repositories/api/get-repository';

function SnapshotFigures({ snapshot }: { snapshot: SnapshotDTO }) {
  const m = snapshot.metrics;
  const figures: [string, string][] = [
    ['clone ratio', formatPercent(m?.cloneRatio ?? snapshot.cloneRatio)],
    ['unwaived', m ? formatPercent(m.unwaivedCloneRatio) : '—'],
    ['files', String(snapshot.fileCount)],
    ['fragments', String(snapshot.fragmentCount)],
    ['clone pairs', m ? String(m.pairCount) : '—'],
    ['classes', m ? String(m.classCount) : '—'],
    ['pairs across repositories', m ? String(m.crossPairCount) : '—'],
  ];
  return (
    <dl className="flex flex-wrap gap-x-6 gap-y-1 text-xs">
      {figures.map(([label, value]) => (
        <div key={label} className="flex items-baseline gap-1.5">
          <dt className="text-muted">{label}</dt>
          <dd className="font-mono text-sm tabular-nums">
            {label === 'pairs across repositories' && m && m.crossPairCount > 0 ? (
              <Link to={`/clone-classes?repository=${snapshot.repositoryId}&scope=across`} className="text-accent-strong underline underline-offset-2" title="The classes whose copies span repositories">
                {value}
              </Link>
            ) : (
              value
            )}
          </dd>
        </div>
      ))}
    </dl>
  );
}

/** /snapshots/:id: what changed since the previous release, and the clone classes, filtered in the URL. */
export function SnapshotRoute() {
  const id = Number(useParams().id);
  const snapshot = useSnapshot(id);
  const comparison = useSnapshotComparison(id);
  const [query, setQuery] = useClassFilters();
  const classes = useSnapshotClasses(id, query);
  const repository = useRepository(snapshot.data?.repositoryId ?? 0, { enabled: snapshot.data !== undefined });

  if (!snapshot.data) {
    return (
      <div className="max-w-lg">
        <QueryState query={snapshot} what="the snapshot" />
      </div>
    );
  }
  const s = snapshot.data;
  const languages = comparison.data ? [...new Set(comparison.data.classes.map((c) => c.language))].sort() : [];
  return (
    <div className="max-w-6xl space-y-4">
      <div>
        <div className="mb-1 text-xs text-muted">
          <Link to="/repositories" className="hover:underline">
            Repositories
          </Link>{' '}
          /{' '}
          <Link to={`/repositories/${s.repositoryId}`} className="font-mono hover:underline">
            {repository.data?.name ?? `#${s.repositoryId}`}
          </Link>{' '}
          /
        </div>
        <PageHeader
          title={`Snapshot ${s.label}`}
          subtitle={
            <span className="font-mono text-xs">
              {s.source}
              {s.commitSha ? ` · ${s.commitSha.slice(0, 12)}` : ''} · {formatDateTime(s.createdAt)} · {s.status}
            </span>
          }
        />
        <SnapshotFigures snapshot={s} />
      </div>
      <Panel title="Since the previous release">
        {comparison.data ? (
          <ComparisonCounts comparison={comparison.data} active={query.status} onPick={(status) => setQuery({ status })} />
        ) : (
          <QueryState query={comparison} what="the comparison" />
        )}
      </Panel>
      <Panel title="Clone classes">
        <div className="space-y-3">
          <ClassFilters query={query} languages={languages} waivedCount={classes.data?.waivedCount} onChange={setQuery} />
          {classes.data ? (
            <>
              {classes.data.classes.length === 0 ? (
                <p className="py-4 text-sm text-muted">No clone class matches these filters.</p>
              ) : (
                <div className={classes.isPlaceholderData ? 'opacity-60' : undefined}>
                  <CloneClassTable classes={classes.data.classes} query={query} onSort={(column) => setQuery(toggleClassSort(query, column))} />
                </div>
              )}
              <Pagination page={query.page} pageSize={query.pageSize} total={classes.data.total} onPage={(page) => setQuery({ page })} />
            </>
          ) : (
            <QueryState query={classes} what="clone classes" />
          )}
        </div>
      </Panel>
    </div>
  );
}
