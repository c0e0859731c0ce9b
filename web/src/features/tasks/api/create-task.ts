import { useMutation } from '@tanstack/react-query';
import type { CreateTaskInput, TaskAnswerDTO } from '@shared/api/tasks';
import { api } from '@/lib/api-client';
import { useRefreshTasks } from './refresh-tasks';

/** POST /api/tasks. */
export function createTask(input: CreateTaskInput): Promise<TaskAnswerDTO> {
  return api.post<TaskAnswerDTO>('/tasks', input);
}

/** Creates a task, then refetches the task queries. */
export function useCreateTask() {
  const refresh = useRefreshTasks();
  return useMutation({ mutationFn: createTask, onSuccess: refresh });
}
