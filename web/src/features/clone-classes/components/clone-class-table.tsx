import { Link } from 'react-router-dom';
import clsx from 'clsx';
import type { ClassListQuery, CloneClassSummaryDTO } from '@shared/api/snapshots';
import { formatSimilarity } from '@/lib/format';
import { WaivedBadge } from './class-waiver';
import { StatusBadge } from './status-badge';

type SortColumn = ClassListQuery['sort'];

function SortHeader({
  column,
  label,
  query,
  onSort,
  className,
}: {
  column: SortColumn;
  label: string;
  query: ClassListQuery;
  onSort: (column: SortColumn) => void;
  className?: string;
}) {
  const active = query.sort === column;
  return (
    <th className={clsx('pb-2 font-semibold', className)} aria-sort={active ? (query.order === 'asc' ? 'ascending' : 'descending') : 'none'}>
      <button type="button" onClick={() => onSort(column)} className={clsx('uppercase hover:text-ink', active && 'text-ink')}>
        {label}
        <span aria-hidden="true" className="ml-0.5 inline-block w-2 font-mono">
          {active ? (query.order === 'asc' ? '↑' : '↓') : ''}
        </span>
      </button>
    </th>
  );
}

/** One page of clone classes; the sortable headers ask the server for another order. */
export function CloneClassTable({
  classes,
  query,
  onSort,
}: {
  classes: CloneClassSummaryDTO[];
  query: ClassListQuery;
  onSort: (column: SortColumn) => void;
}) {
  return (
    <table className="w-full table-fixed text-sm" aria-label="Clone classes">
      <colgroup>
        <col className="w-16" />
        <col className="w-24" />
        <col className="w-16" />
        <col className="w-20" />
        <col className="w-20" />
        <col className="w-32" />
        <col className="w-24" />
        <col />
      </colgroup>
      <thead>
        <tr className="text-left text-xs tracking-wide text-muted uppercase">
          <th className="pb-2 font-semibold">Class</th>
          <th className="pb-2 font-semibold">Status</th>
          <SortHeader column="type" label="Type" query={query} onSort={onSort} />
          <SortHeader column="size" label="Members" query={query} onSort={onSort} className="text-right" />
          <SortHeader column="tokens" label="Tokens" query={query} onSort={onSort} className="text-right" />
          <SortHeader column="similarity" label="Similarity" query={query} onSort={onSort} className="pl-4" />
          <th className="pb-2 font-semibold">Language</th>
          <th className="pb-2 font-semibold">Paths</th>
        </tr>
      </thead>
      <tbody>
        {classes.map((c) => (
          <tr key={c.id} className="border-t border-line align-top hover:bg-paper/60">
            <td className="py-1.5 pr-2 font-mono">
              <Link to={`/clone-classes/${c.id}`} className="text-accent hover:underline" aria-label={`Open clone class ${c.id}`}>
                #{c.id}
              </Link>
            </td>
            <td className="py-1.5 pr-2">
              <StatusBadge status={c.status} />
              {c.waiver ? (
                <span className="ml-1">
                  <WaivedBadge reason={c.waiver.reason} />
                </span>
              ) : null}
            </td>
            <td className="py-1.5 pr-2 font-mono">{c.cloneType}</td>
            <td className="py-1.5 pr-2 text-right font-mono tabular-nums">{c.size}</td>
            <td className="py-1.5 pr-2 text-right font-mono tabular-nums">{c.tokens}</td>
            <td className="py-1.5 pr-2 pl-4 font-mono text-xs tabular-nums">
              {c.minSimilarity === c.maxSimilarity
                ? formatSimilarity(c.minSimilarity)
                : `${formatSimilarity(c.minSimilarity)}–${formatSimilarity(c.maxSimilarity)}`}
            </td>
            <td className="py-1.5 pr-2 text-xs">{c.language}</td>
            <td className="py-1.5 font-mono text-xs">
              <Link to={`/clone-classes/${c.id}`} className="block hover:text-accent">
                {c.paths.map((p, i) => (
                  <span key={`${p}-${i}`} className="block truncate" title={p}>
                    {p}
                  </span>
                ))}
                {c.size > c.paths.length ? <span className="text-muted">+{c.size - c.paths.length} more</span> : null}
              </Link>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
