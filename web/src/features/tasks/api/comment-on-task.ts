import { useMutation } from '@tanstack/react-query';
import type { CreateTaskCommentInput, TaskCommentAnswerDTO } from '@shared/api/tasks';
import { api } from '@/lib/api-client';
import { useRefreshTasks } from './refresh-tasks';

/** POST /api/tasks/:id/comments. */
export function commentOnTask(id: number, input: CreateTaskCommentInput): Promise<TaskCommentAnswerDTO> {
  return api.post<TaskCommentAnswerDTO>(`/tasks/${id}/comments`, input);
}

/** Comments on a task, then refetches the task queries. */
export function useCommentOnTask(id: number) {
  const refresh = useRefreshTasks();
  return useMutation({ mutationFn: (input: CreateTaskCommentInput) => commentOnTask(id, input), onSuccess: refresh });
}
