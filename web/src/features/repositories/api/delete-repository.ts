import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RepositoryListDTO } from '@shared/api/repositories';
import { api } from '@/lib/api-client';
import { repositoriesQueryOptions } from './get-repositories';

/** DELETE /api/repositories/:id. */
export function deleteRepository(id: number): Promise<void> {
  return api.delete<void>(`/repositories/${id}`);
}

/**
 * Deletes a repository with its snapshots. The cached list drops it at once (the list page is
 * usually the next screen and would otherwise show it until its refetch lands), then the list
 * alone is refetched (`exact`): the deleted repository's own keys would answer 404 if refetched
 * while its page is still on screen; ids are never reused, so they simply age out of the cache.
 */
export function useDeleteRepository() {
  const queryClient = useQueryClient();
  const listKey = repositoriesQueryOptions().queryKey;
  return useMutation({
    mutationFn: deleteRepository,
    onSuccess: (_nothing, id) => {
      queryClient.setQueryData<RepositoryListDTO>(listKey, (list) =>
        list ? { repositories: list.repositories.filter((r) => r.id !== id) } : list,
      );
      return queryClient.invalidateQueries({ queryKey: listKey, exact: true });
    },
  });
}
