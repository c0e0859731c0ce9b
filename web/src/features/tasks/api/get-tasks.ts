import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { TaskListQuery, TaskPageDTO } from '@shared/api/tasks';
import { api } from '@/lib/api-client';
import { writeTaskFilters } from '@/features/tasks/lib/task-filters';

/** GET /api/tasks, filtered, sorted and paged on the server. */
export function getTasks(query: Partial<TaskListQuery>): Promise<TaskPageDTO> {
  const search = writeTaskFilters(query).toString();
  return api.get<TaskPageDTO>(`/tasks${search ? `?${search}` : ''}`);
}

/** Query options of one page of tasks; keys start with 'tasks'. */
export const tasksQueryOptions = (query: Partial<TaskListQuery>) =>
  queryOptions({ queryKey: ['tasks', 'list', query], queryFn: () => getTasks(query), placeholderData: keepPreviousData });

/** One page of the organisation's tasks. */
export function useTasks(query: Partial<TaskListQuery>, options: { enabled?: boolean } = {}) {
  return useQuery({ ...tasksQueryOptions(query), enabled: options.enabled ?? true });
}
