import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CloneMapDTO } from '@shared/api/repositories';
import { api } from '@/lib/api-client';

/** GET /api/repositories/:id/clone-map: the latest snapshot's directory tree with token figures. */
export function getCloneMap(id: number): Promise<CloneMapDTO> {
  return api.get<CloneMapDTO>(`/repositories/${id}/clone-map`);
}

/** A repository's clone map. */
export function useCloneMap(id: number) {
  return useQuery(queryOptions({ queryKey: ['repositories', id, 'clone-map'], queryFn: () => getCloneMap(id) }));
}
