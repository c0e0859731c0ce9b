import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SnapshotDTO } from '@shared/api/snapshots';
import { api } from '@/lib/api-client';

/** GET /api/snapshots/:id. */
export function getSnapshot(id: number): Promise<SnapshotDTO> {
  return api.get<SnapshotDTO>(`/snapshots/${id}`);
}

/** Query options of one snapshot; every snapshot key starts with 'snapshots'. */
export const snapshotQueryOptions = (id: number) => queryOptions({ queryKey: ['snapshots', id], queryFn: () => getSnapshot(id) });

/** One snapshot with its counts and figures. */
export function useSnapshot(id: number) {
  return useQuery(snapshotQueryOptions(id));
}
