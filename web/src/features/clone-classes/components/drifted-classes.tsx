import { Link } from 'react-router-dom';
import { QueryState } from '@/components/data-state';
import { useOrganisationClasses } from '@/features/clone-classes/api/get-organisation-classes';

/**
 * The drifted classes of every repository's latest release, largest first: copies of which some
 * changed and others did not, so a fix may have missed one.
 */
export function DriftedClasses({ limit = 6 }: { limit?: number }) {
  const drifted = useOrganisationClasses({ status: 'drifted', sort: 'tokens', order: 'desc', pageSize: limit });
  if (!drifted.data) return <QueryState query={drifted} what="drifted classes" />;
  const { classes, total } = drifted.data;
  if (total === 0) return <p className="text-sm text-muted">No class drifted in the latest releases.</p>;
  return (
    <div className="space-y-2">
      <ul className="divide-y divide-line text-sm" aria-label="Drifted classes">
        {classes.map((c) => (
          <li key={c.id} className="py-1.5">
            <Link to={`/clone-classes/${c.id}`} className="flex items-baseline justify-between gap-3 hover:text-accent">
              <span className="min-w-0 truncate font-mono text-xs" title={c.paths.join(', ')}>
                <span className="text-accent-strong">#{c.id}</span> {c.paths[0]}
                {c.size > 1 ? <span className="text-muted"> and {c.size - 1} more</span> : null}
              </span>
              <span className="shrink-0 font-mono text-xs text-muted">
                {c.repositories[0]?.name}@{c.snapshot?.label}
              </span>
            </Link>
          </li>
        ))}
      </ul>
      <Link to="/clone-classes?status=drifted" className="text-xs text-accent-strong hover:underline">
        {total > classes.length ? `All ${total} drifted classes` : 'Open in the class list'}
      </Link>
    </div>
  );
}
