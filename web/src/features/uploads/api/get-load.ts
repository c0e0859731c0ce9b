import { queryOptions, useQuery } from '@tanstack/react-query';
import { isLoadActive, type SnapshotDTO } from '@shared/api/snapshots';
import { api } from '@/lib/api-client';

/** How often a load in progress is asked for its progress. */
const POLL_MS = 1000;

/** GET /api/snapshots/:id. */
export function getLoad(id: number): Promise<SnapshotDTO> {
  return api.get<SnapshotDTO>(`/snapshots/${id}`);
}

/** Query options of a snapshot whose load is followed: asked again every second until it has ended. */
export const loadQueryOptions = (id: number) =>
  queryOptions({
    queryKey: ['snapshots', id],
    queryFn: () => getLoad(id),
    refetchInterval: (query) => (query.state.data && !isLoadActive(query.state.data.status) ? false : POLL_MS),
  });

/** A snapshot, polled while its load is queued or running. */
export function useLoad(id: number) {
  return useQuery(loadQueryOptions(id));
}
