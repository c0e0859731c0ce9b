import { TASK_STATUS_LABELS, TASK_STATUSES, type TaskListQuery, type TaskStatusFilter } from '@shared/api/tasks';
import { Button } from '@/components/button';
import { SelectField } from '@/components/field';
import type { TaskFilterChange } from '@/features/tasks/lib/task-filters';

/**
 * The task list's filters: whose (mine, anyone, or — for leads — a member), status, repository and
 * overdue. Each applies at once and lands in the URL.
 */
export function TaskFilters({
  query,
  repositories,
  members,
  onChange,
}: {
  query: TaskListQuery;
  repositories: { id: number; name: string }[];
  /** the people a lead may filter by (absent for other roles) */
  members?: { id: string; name: string }[];
  onChange: (change: TaskFilterChange) => void;
}) {
  const filtered = query.assignee !== undefined || query.status !== undefined || query.repositoryId !== undefined || query.overdue !== undefined;
  return (
    <form role="search" aria-label="Filter tasks" onSubmit={(e) => e.preventDefault()} className="grid items-end gap-2 sm:grid-cols-[11rem_10rem_12rem_8rem_auto]">
      <SelectField label="Assignee" value={query.assignee ?? ''} onChange={(e) => onChange({ assignee: e.target.value || undefined })}>
        <option value="">anyone</option>
        <option value="me">mine</option>
        {(members ?? []).map((m) => (
          <option key={m.id} value={m.id}>
            {m.name}
          </option>
        ))}
      </SelectField>
      <SelectField label="Status" value={query.status ?? ''} onChange={(e) => onChange({ status: (e.target.value || undefined) as TaskStatusFilter | undefined })}>
        <option value="">any</option>
        <option value="active">active (not closed)</option>
        <option value="closed">closed</option>
        {TASK_STATUSES.map((status) => (
          <option key={status} value={status}>
            {TASK_STATUS_LABELS[status]}
          </option>
        ))}
      </SelectField>
      <SelectField label="Repository" value={query.repositoryId ?? ''} onChange={(e) => onChange({ repositoryId: e.target.value ? Number(e.target.value) : undefined })}>
        <option value="">any</option>
        {repositories.map((r) => (
          <option key={r.id} value={r.id}>
            {r.name}
          </option>
        ))}
      </SelectField>
      <SelectField label="Due" value={query.overdue ?? ''} onChange={(e) => onChange({ overdue: (e.target.value || undefined) as TaskListQuery['overdue'] })}>
        <option value="">any</option>
        <option value="1">overdue</option>
      </SelectField>
      <div>
        {filtered ? (
          <Button variant="secondary" onClick={() => onChange({ assignee: undefined, status: undefined, repositoryId: undefined, overdue: undefined })}>
            Clear
          </Button>
        ) : null}
      </div>
    </form>
  );
}
