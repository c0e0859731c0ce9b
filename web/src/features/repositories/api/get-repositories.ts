import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RepositoryListDTO } from '@shared/api/repositories';
import { api } from '@/lib/api-client';

/** GET /api/repositories. */
export function getRepositories(): Promise<RepositoryListDTO> {
  return api.get<RepositoryListDTO>('/repositories');
}

/** Query options of the repository list; every repository key starts with 'repositories'. */
export const repositoriesQueryOptions = () => queryOptions({ queryKey: ['repositories'], queryFn: getRepositories });

/** The organisation's repositories, each with its latest snapshot and budget state. */
export function useRepositories() {
  return useQuery(repositoriesQueryOptions());
}
