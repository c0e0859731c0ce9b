import { Link } from 'react-router-dom';
import clsx from 'clsx';
import type { OrganisationClassDTO, OrganisationClassQuery } from '@shared/api/clone-classes';
import { formatSimilarity } from '@/lib/format';
import { WaivedBadge } from './class-waiver';
import { StatusBadge } from './status-badge';

type SortColumn = OrganisationClassQuery['sort'];

function SortHeader({ column, label, query, onSort, className }: { column: SortColumn; label: string; query: OrganisationClassQuery; onSort: (column: SortColumn) => void; className?: string }) {
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

/** Where a row's class page is: a repository's class, or a class across repositories. */
export function organisationClassLink(c: Pick<OrganisationClassDTO, 'scope' | 'id'>): string {
  return c.scope === 'within' ? `/clone-classes/${c.id}` : `/clone-classes/across/${c.id}`;
}

/** A small label for a class that spans repositories (it has no status of its own). */
export function AcrossBadge({ count }: { count: number }) {
  return (
    <span title="Its copies lie in more than one repository" className="inline-block rounded-sm bg-span-soft px-1.5 py-0.5 font-mono text-[11px] leading-none text-span">
      {count} repos
    </span>
  );
}

/** One page of the organisation's clone classes; the sortable headers ask the server for another order. */
export function OrganisationClassTable({ classes, query, onSort }: { classes: OrganisationClassDTO[]; query: OrganisationClassQuery; onSort: (column: SortColumn) => void }) {
  return (
    <table className="w-full table-fixed text-sm" aria-label="Clone classes">
      <colgroup>
        <col className="w-20" />
        <col className="w-44" />
        <col className="w-28" />
        <col className="w-14" />
        <col className="w-20" />
        <col className="w-20" />
        <col className="w-32" />
        <col className="w-24" />
        <col />
      </colgroup>
      <thead>
        <tr className="text-left text-xs tracking-wide text-muted uppercase">
          <th className="pb-2 font-semibold">Class</th>
          <SortHeader column="repository" label="Repository" query={query} onSort={onSort} />
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
        {classes.map((c) => {
          const to = organisationClassLink(c);
          const name = c.scope === 'within' ? `clone class ${c.id}` : `class ${c.id} across ${c.repositories.map((r) => r.name).join(' and ')}`;
          return (
            <tr key={`${c.scope}-${c.id}`} className="border-t border-line align-top hover:bg-paper/60">
              <td className="py-1.5 pr-2 font-mono">
                <Link to={to} className="text-accent hover:underline" aria-label={`Open ${name}`}>
                  {c.scope === 'within' ? `#${c.id}` : `×${c.id}`}
                </Link>
              </td>
              <td className="py-1.5 pr-2 font-mono text-xs">
                {c.repositories.map((r) => (
                  <span key={r.id} className="block truncate" title={r.name}>
                    {r.name}
                    {c.snapshot ? <span className="text-muted"> @{c.snapshot.label}</span> : null}
                  </span>
                ))}
              </td>
              <td className="py-1.5 pr-2">
                {c.status ? <StatusBadge status={c.status} /> : <AcrossBadge count={c.repositories.length} />}
                {c.waiver ? (
                  <span className="ml-1">
                    <WaivedBadge reason={c.waiver.reason} />
                  </span>
                ) : null}
                {c.acrossClassId !== null ? (
                  <Link to={`/clone-classes/across/${c.acrossClassId}`} className="mt-1 block text-xs text-accent-strong hover:underline">
                    also in other repositories
                  </Link>
                ) : null}
              </td>
              <td className="py-1.5 pr-2 font-mono">{c.cloneType}</td>
              <td className="py-1.5 pr-2 text-right font-mono tabular-nums">{c.size}</td>
              <td className="py-1.5 pr-2 text-right font-mono tabular-nums">{c.tokens}</td>
              <td className="py-1.5 pr-2 pl-4 font-mono text-xs tabular-nums">
                {c.minSimilarity === c.maxSimilarity ? formatSimilarity(c.minSimilarity) : `${formatSimilarity(c.minSimilarity)}–${formatSimilarity(c.maxSimilarity)}`}
              </td>
              <td className="py-1.5 pr-2 text-xs">{c.language}</td>
              <td className="py-1.5 font-mono text-xs">
                <Link to={to} className="block hover:text-accent" tabIndex={-1}>
                  {c.paths.map((p, i) => (
                    <span key={`${p}-${i}`} className="block truncate" title={p}>
                      {p}
                    </span>
                  ))}
                  {c.size > c.paths.length ? <span className="text-muted">+{c.size - c.paths.length} more</span> : null}
                </Link>
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
