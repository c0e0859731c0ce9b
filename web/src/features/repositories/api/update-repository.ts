import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RepositoryDTO, UpdateRepositoryInput } from '@shared/api/repositories';
import { api } from '@/lib/api-client';
import { repositoriesQueryOptions } from './get-repositories';

/** PATCH /api/repositories/:id (settings and budget). */
export function updateRepository({ id, ...input }: UpdateRepositoryInput & { id: number }): Promise<RepositoryDTO> {
  return api.patch<RepositoryDTO>(`/repositories/${id}`, input);
}

/**
 * Saves settings; the list, the repository and its trend (whose budget line moves) all sit under
 * the 'repositories' key, so one invalidation refreshes them.
 */
export function useUpdateRepository() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateRepository,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: repositoriesQueryOptions().queryKey }),
  });
}
