import { Link } from 'react-router-dom';
import clsx from 'clsx';
import type { TaskDTO, TaskListQuery, TaskSort } from '@shared/api/tasks';
import { DEFAULT_SORT_ORDER } from '@/features/tasks/lib/task-filters';
import { OverdueBadge, TaskStatusBadge } from './task-status-badge';

function SortHeader({ column, label, query, onSort, className }: { column: TaskSort; label: string; query: TaskListQuery; onSort: (column: TaskSort) => void; className?: string }) {
  const active = query.sort === column;
  const ascending = (query.order ?? DEFAULT_SORT_ORDER[column]) === 'asc';
  return (
    <th className={clsx('pb-2 font-semibold', className)} aria-sort={active ? (ascending ? 'ascending' : 'descending') : 'none'}>
      <button type="button" onClick={() => onSort(column)} className={clsx('uppercase hover:text-ink', active && 'text-ink')}>
        {label}
        <span aria-hidden="true" className="ml-0.5 inline-block w-2 font-mono">
          {active ? (ascending ? '↑' : '↓') : ''}
        </span>
      </button>
    </th>
  );
}

/** One page of tasks; the sortable headers ask the server for another order. */
export function TaskTable({ tasks, query, onSort }: { tasks: TaskDTO[]; query: TaskListQuery; onSort: (column: TaskSort) => void }) {
  return (
    <table className="w-full text-sm" aria-label="Refactor tasks">
      <thead>
        <tr className="text-left text-xs tracking-wide text-muted uppercase">
          <SortHeader column="title" label="Task" query={query} onSort={onSort} />
          <SortHeader column="status" label="Status" query={query} onSort={onSort} />
          <th className="pb-2 font-semibold">Assignee</th>
          <th className="pb-2 font-semibold">Repository</th>
          <SortHeader column="due" label="Due" query={query} onSort={onSort} />
          <SortHeader column="updated" label="Updated" query={query} onSort={onSort} />
        </tr>
      </thead>
      <tbody>
        {tasks.map((t) => (
          <tr key={t.id} className="border-t border-line align-top hover:bg-paper/60">
            <td className="py-1.5 pr-3">
              <Link to={`/tasks/${t.id}`} className="text-accent-strong hover:underline">
                <span className="font-mono text-xs text-muted">#{t.id}</span> {t.title}
              </Link>
            </td>
            <td className="py-1.5 pr-3">
              <TaskStatusBadge status={t.status} />
            </td>
            <td className="py-1.5 pr-3">{t.assignee?.name ?? <span className="text-muted">nobody</span>}</td>
            <td className="py-1.5 pr-3 font-mono text-xs">{t.repositoryName}</td>
            <td className="py-1.5 pr-3 font-mono text-xs whitespace-nowrap">
              {t.dueOn ?? '—'}
              {t.overdue ? <OverdueBadge /> : null}
            </td>
            <td className="py-1.5 font-mono text-xs whitespace-nowrap text-muted">{t.updatedAt.slice(0, 10)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
