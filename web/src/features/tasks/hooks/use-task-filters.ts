import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { TaskListQuery } from '@shared/api/tasks';
import { changeTaskFilters, readTaskFilters, writeTaskFilters, type TaskFilterChange } from '@/features/tasks/lib/task-filters';

/** The task list query kept in the page's search parameters, and a setter (each change a history entry). */
export function useTaskFilters(): [TaskListQuery, (change: TaskFilterChange) => void] {
  const [params, setParams] = useSearchParams();
  const query = useMemo(() => readTaskFilters(params), [params]);
  const set = useCallback((change: TaskFilterChange) => setParams(writeTaskFilters(changeTaskFilters(query, change))), [query, setParams]);
  return [query, set];
}
