import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RepositoryDTO } from '@shared/api/repositories';
import { api } from '@/lib/api-client';

/** GET /api/repositories/:id. */
export function getRepository(id: number): Promise<RepositoryDTO> {
  return api.get<RepositoryDTO>(`/repositories/${id}`);
}

/** Query options of one repository (under the list's key, so invalidating the list refreshes it too). */
export const repositoryQueryOptions = (id: number) =>
  queryOptions({ queryKey: ['repositories', id], queryFn: () => getRepository(id) });

/** One repository with its settings; pass `enabled: false` while the id is not known yet. */
export function useRepository(id: number, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...repositoryQueryOptions(id), enabled });
}
