import { can } from '@shared/permissions';
import { QueryState } from '@/components/data-state';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { useSession } from '@/features/auth/api/get-session';
import { Pagination } from '@/features/clone-classes/components/pagination';
import { useRepositories } from '@/features/repositories/api/get-repositories';
import { useMembers } from '@/features/tasks/api/get-members';
import { useTasks } from '@/features/tasks/api/get-tasks';
import { TaskFilters } from '@/features/tasks/components/task-filters';
import { TaskTable } from '@/features/tasks/components/task-table';
import { useTaskFilters } from '@/features/tasks/hooks/use-task-filters';
import { toggleTaskSort } from '@/features/tasks/lib/task-filters';

/** /tasks: the organisation's refactor tasks, filtered, sorted and paged in the URL. */
export function TasksRoute() {
  const role = useSession().data?.user?.role;
  const isLead = role !== undefined && can(role, 'tasks.assign');
  const [query, setQuery] = useTaskFilters();
  const tasks = useTasks(query);
  const repositories = useRepositories();
  const members = useMembers({ enabled: isLead });
  return (
    <div className="max-w-6xl space-y-4">
      <PageHeader title="Tasks" subtitle="Refactor work on clone classes: who merges which copies, and where it stands." />
      <TaskFilters query={query} repositories={repositories.data?.repositories ?? []} members={members.data?.members} onChange={setQuery} />
      <Panel>
        {!tasks.data ? (
          <QueryState query={tasks} what="tasks" />
        ) : tasks.data.tasks.length === 0 ? (
          <p className="text-sm text-muted">
            No task matches.{isLead ? ' Open a clone class and choose “Create refactor task” to start one.' : ''}
          </p>
        ) : (
          <div className="space-y-3">
            <TaskTable tasks={tasks.data.tasks} query={query} onSort={(column) => setQuery(toggleTaskSort(query, column))} />
            <Pagination page={query.page} pageSize={query.pageSize} total={tasks.data.total} onPage={(page) => setQuery({ page })} />
          </div>
        )}
      </Panel>
    </div>
  );
}
