import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { repositoriesQueryOptions } from './get-repositories';

/** DELETE /api/repositories/:id. */
export function deleteRepository(id: number): Promise<void> {
  return api.delete<void>(`/repositories/${id}`);
}

/**
 * Deletes a repository with its snapshots, then refetches the list only (`exact`): the deleted
 * repository's own keys would answer 404 if refetched while its page is still on screen; ids are
 * never reused, so they simply age out of the cache.
 */
export function useDeleteRepository() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteRepository,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: repositoriesQueryOptions().queryKey, exact: true }),
  });
}
