import { actionsOf } from '../../../../shared/permissions';
import { ROLE_LABELS } from '../../../../shared/roles';
import { PageHeader } from '../../components/page-header';
import { Panel } from '../../components/panel';
import { useSession } from '../../features/auth/api/get-session';

const FIGURES = [
  { label: 'Repositories', hint: 'tracked codebases' },
  { label: 'Clone ratio', hint: 'latest snapshots' },
  { label: 'Open clone classes', hint: 'not waived' },
  { label: 'Refactor tasks', hint: 'open' },
];

/** /: the organisation at a glance (figures fill in once repositories have snapshots). */
export function OverviewRoute() {
  const session = useSession();
  const user = session.data?.user;
  if (!user) return null;
  return (
    <div className="max-w-5xl">
      <PageHeader title="Overview" subtitle={`${session.data?.organisation?.name ?? ''} · signed in as ${ROLE_LABELS[user.role]}`} />
      <div className="mb-5 grid grid-cols-2 gap-3 lg:grid-cols-4">
        {FIGURES.map((figure) => (
          <div key={figure.label} className="rounded-sm border border-line bg-panel px-4 py-3">
            <div className="text-xs tracking-wide text-muted uppercase">{figure.label}</div>
            <div className="mt-1 font-mono text-2xl text-ink/40">—</div>
            <div className="text-xs text-muted">{figure.hint}</div>
          </div>
        ))}
      </div>
      <div className="grid items-start gap-4 lg:grid-cols-[2fr_1fr]">
        <Panel title="Clone ratio by release">
          <div className="flex h-40 items-center justify-center rounded-sm border border-dashed border-line text-sm text-muted">
            No snapshots yet. Each repository's trend appears here once two releases are loaded.
          </div>
        </Panel>
        <Panel title="Your access">
          <ul className="space-y-1 font-mono text-xs">
            {actionsOf(user.role).map((action) => (
              <li key={action} className="flex items-center gap-2">
                <span className="inline-block h-1.5 w-1.5 rounded-full bg-accent" />
                {action}
              </li>
            ))}
          </ul>
        </Panel>
      </div>
    </div>
  );
}
