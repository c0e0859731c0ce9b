import { Link } from 'react-router-dom';
import { QueryState } from '@/components/data-state';
import { Panel } from '@/components/panel';
import { useTasks } from '@/features/tasks/api/get-tasks';
import { OverdueBadge, TaskStatusBadge } from './task-status-badge';

/** How many of the reader's tasks the overview lists (the rest are a click away). */
const SHOWN = 6;

/** The overview's card: the reader's active refactor tasks, soonest due first. */
export function MyOpenTasks() {
  const tasks = useTasks({ assignee: 'me', status: 'active', sort: 'due', pageSize: SHOWN });
  return (
    <Panel
      title="Your open tasks"
      actions={
        <Link to="/tasks?assignee=me&status=active" className="text-xs text-accent-strong hover:underline">
          All your tasks
        </Link>
      }
    >
      {!tasks.data ? (
        <QueryState query={tasks} what="your tasks" />
      ) : tasks.data.tasks.length === 0 ? (
        <p className="text-sm text-muted">No open refactor task is assigned to you.</p>
      ) : (
        <ul className="space-y-2 text-sm">
          {tasks.data.tasks.map((t) => (
            <li key={t.id} className="flex flex-wrap items-center justify-between gap-2">
              <Link to={`/tasks/${t.id}`} className="text-accent-strong hover:underline">
                #{t.id} {t.title}
              </Link>
              <span className="flex items-center gap-1 font-mono text-xs">
                <TaskStatusBadge status={t.status} />
                {t.dueOn ? <span className="text-muted">due {t.dueOn}</span> : null}
                {t.overdue ? <OverdueBadge /> : null}
              </span>
            </li>
          ))}
          {tasks.data.total > SHOWN ? <li className="text-xs text-muted">and {tasks.data.total - SHOWN} more</li> : null}
        </ul>
      )}
    </Panel>
  );
}
