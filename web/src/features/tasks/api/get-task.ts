import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TaskDetailDTO } from '@shared/api/tasks';
import { api } from '@/lib/api-client';

/** GET /api/tasks/:id: a task with its history and comments. */
export function getTask(id: number): Promise<TaskDetailDTO> {
  return api.get<TaskDetailDTO>(`/tasks/${id}`);
}

/** Query options of one task; keys start with 'tasks'. */
export const taskQueryOptions = (id: number) => queryOptions({ queryKey: ['tasks', 'one', id], queryFn: () => getTask(id) });

/** One task with its history and comments. */
export function useTask(id: number) {
  return useQuery(taskQueryOptions(id));
}
