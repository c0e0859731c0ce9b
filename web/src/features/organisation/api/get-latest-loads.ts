import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LatestLoadsDTO } from '@shared/api/organisation';
import { isLoadActive } from '@shared/api/snapshots';
import { api } from '@/lib/api-client';

/** GET /api/organisation/loads: the most recent snapshots of every repository, whatever their status. */
export function getLatestLoads(limit: number): Promise<LatestLoadsDTO> {
  return api.get<LatestLoadsDTO>(`/organisation/loads?limit=${limit}`);
}

/** The latest loads; refreshed every few seconds while one is still running. */
export function useLatestLoads(limit: number) {
  return useQuery(
    queryOptions({
      queryKey: ['organisation', 'loads', limit],
      queryFn: () => getLatestLoads(limit),
      refetchInterval: (query) => (query.state.data?.loads.some((l) => isLoadActive(l.status)) ? 5000 : false),
    }),
  );
}
