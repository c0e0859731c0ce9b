import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SnapshotComparisonDTO } from '@shared/api/snapshots';
import { api } from '@/lib/api-client';

/** GET /api/snapshots/:id/comparison: the classes by status against the previous snapshot. */
export function getSnapshotComparison(id: number): Promise<SnapshotComparisonDTO> {
  return api.get<SnapshotComparisonDTO>(`/snapshots/${id}/comparison`);
}

/** Query options of a snapshot's comparison with the previous one. */
export const snapshotComparisonQueryOptions = (id: number) =>
  queryOptions({ queryKey: ['snapshots', id, 'comparison'], queryFn: () => getSnapshotComparison(id) });

/** What changed since the previous snapshot, counted by status. */
export function useSnapshotComparison(id: number) {
  return useQuery(snapshotComparisonQueryOptions(id));
}
