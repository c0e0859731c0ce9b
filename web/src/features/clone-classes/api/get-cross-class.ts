import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CrossClassDetailDTO } from '@shared/api/clone-classes';
import { api } from '@/lib/api-client';

/** GET /api/cross-classes/:id. */
export function getCrossClass(id: number): Promise<CrossClassDetailDTO> {
  return api.get<CrossClassDetailDTO>(`/cross-classes/${id}`);
}

/** One class that spans repositories, with its members' code and pairs. */
export function useCrossClass(id: number) {
  return useQuery(queryOptions({ queryKey: ['cross-classes', id], queryFn: () => getCrossClass(id) }));
}
