import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateRepositoryInput, RepositoryDTO } from '@shared/api/repositories';
import { api } from '@/lib/api-client';
import { repositoriesQueryOptions } from './get-repositories';

/** POST /api/repositories. */
export function createRepository(input: CreateRepositoryInput): Promise<RepositoryDTO> {
  return api.post<RepositoryDTO>('/repositories', input);
}

/** Creates a repository, then refetches the list. */
export function useCreateRepository() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createRepository,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: repositoriesQueryOptions().queryKey }),
  });
}
