import { useMutation } from '@tanstack/react-query';
import type { TaskAnswerDTO, UpdateTaskInput } from '@shared/api/tasks';
import { api } from '@/lib/api-client';
import { useRefreshTasks } from './refresh-tasks';

/** PATCH /api/tasks/:id. */
export function updateTask(id: number, input: UpdateTaskInput): Promise<TaskAnswerDTO> {
  return api.patch<TaskAnswerDTO>(`/tasks/${id}`, input);
}

/** Changes a task (status, assignee, fields), then refetches the task queries. */
export function useUpdateTask(id: number) {
  const refresh = useRefreshTasks();
  return useMutation({ mutationFn: (input: UpdateTaskInput) => updateTask(id, input), onSuccess: refresh });
}
