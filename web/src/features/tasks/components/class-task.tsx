import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '@/components/button';
import { useTasks } from '@/features/tasks/api/get-tasks';
import { CreateTaskForm } from './create-task-form';
import { OverdueBadge, TaskStatusBadge } from './task-status-badge';

/**
 * A clone class's refactor task: the open one of its lineage, if any, with a link to it; otherwise,
 * for a lead, "Create refactor task".
 */
export function ClassTask({ cloneClassId, lineageId, suggestedTitle, mayCreate }: { cloneClassId: number; lineageId: number; suggestedTitle: string; mayCreate: boolean }) {
  const tasks = useTasks({ lineageId, status: 'active', pageSize: 1 });
  const [creating, setCreating] = useState(false);
  const task = tasks.data?.tasks[0];
  if (task) {
    return (
      <div className="flex flex-wrap items-center gap-2 text-sm" role="group" aria-label="Refactor task">
        <span className="text-xs font-semibold tracking-wide text-muted uppercase">Refactor task</span>
        <TaskStatusBadge status={task.status} />
        <Link to={`/tasks/${task.id}`} className="text-accent-strong hover:underline">
          #{task.id} {task.title}
        </Link>
        <span className="text-xs text-muted">
          {task.assignee ? `assigned to ${task.assignee.name}` : 'unassigned'}
          {task.dueOn ? ` · due ${task.dueOn}` : ''}
        </span>
        {task.overdue ? <OverdueBadge /> : null}
      </div>
    );
  }
  if (!mayCreate || !tasks.data) return null;
  if (!creating) {
    return (
      <Button variant="secondary" onClick={() => setCreating(true)}>
        Create refactor task
      </Button>
    );
  }
  return <CreateTaskForm cloneClassId={cloneClassId} suggestedTitle={suggestedTitle} onDone={() => setCreating(false)} />;
}

/**
 * The title a new task on a class starts with: what to merge and how many copies.
 *
 * @example
 * suggestTaskTitle({ size: 3, members: [{ name: 'tariffFor' }] }) // 'Merge the 3 copies of tariffFor'
 */
export function suggestTaskTitle(detail: { size: number; members: { name: string }[] }): string {
  const name = detail.members[0]?.name;
  return name ? `Merge the ${detail.size} copies of ${name}` : `Merge the ${detail.size} copies`;
}
