import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CloneClassDetailDTO } from '@shared/api/snapshots';
import { api } from '@/lib/api-client';

/** GET /api/clone-classes/:id. */
export function getCloneClass(id: number): Promise<CloneClassDetailDTO> {
  return api.get<CloneClassDetailDTO>(`/clone-classes/${id}`);
}

/** Query options of one class with its members' code; keys start with 'clone-classes'. */
export const cloneClassQueryOptions = (id: number) =>
  queryOptions({ queryKey: ['clone-classes', id], queryFn: () => getCloneClass(id) });

/** One clone class with its members' code and pairs. */
export function useCloneClass(id: number) {
  return useQuery(cloneClassQueryOptions(id));
}
