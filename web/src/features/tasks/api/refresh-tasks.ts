import { useQueryClient } from '@tanstack/react-query';

/** Refetches every task query (lists, a class's open task, one task) after a change. */
export function useRefreshTasks() {
  const queryClient = useQueryClient();
  return () => queryClient.invalidateQueries({ queryKey: ['tasks'] });
}
