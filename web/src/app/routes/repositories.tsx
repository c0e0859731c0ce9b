import { can } from '@shared/permissions';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { useSession } from '@/features/auth/api/get-session';
import { CreateRepositoryForm } from '@/features/repositories/components/create-repository-form';
import { RepositoryTable } from '@/features/repositories/components/repository-table';

/** /repositories: every tracked codebase against its budget; leads add new ones. */
export function RepositoriesRoute() {
  const role = useSession().data?.user?.role;
  const mayCreate = role !== undefined && can(role, 'repositories.create');
  return (
    <div className="max-w-6xl">
      <PageHeader title="Repositories" subtitle="Tracked codebases, the clone ratio of their latest release, and their budgets." />
      <div className={mayCreate ? 'grid items-start gap-4 xl:grid-cols-[1fr_320px]' : ''}>
        <Panel title="Tracked">
          <RepositoryTable />
        </Panel>
        {mayCreate ? (
          <Panel title="Add a repository">
            <CreateRepositoryForm />
          </Panel>
        ) : null}
      </div>
    </div>
  );
}
