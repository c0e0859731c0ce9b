import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ClassListQuery, CloneClassPageDTO } from '@shared/api/snapshots';
import { api } from '@/lib/api-client';
import { writeClassFilters } from '@/features/clone-classes/lib/class-filters';

/** GET /api/snapshots/:id/classes, sorted, filtered and paged on the server. */
export function getSnapshotClasses(id: number, query: ClassListQuery): Promise<CloneClassPageDTO> {
  const search = writeClassFilters(query).toString();
  return api.get<CloneClassPageDTO>(`/snapshots/${id}/classes${search ? `?${search}` : ''}`);
}

/** Query options of one page of a snapshot's classes. */
export const snapshotClassesQueryOptions = (id: number, query: ClassListQuery) =>
  queryOptions({
    queryKey: ['snapshots', id, 'classes', query],
    queryFn: () => getSnapshotClasses(id, query),
    // The table keeps the last page on screen while the next sort or filter loads, instead of flashing empty.
    placeholderData: keepPreviousData,
  });

/** One page of a snapshot's clone classes. */
export function useSnapshotClasses(id: number, query: ClassListQuery) {
  return useQuery(snapshotClassesQueryOptions(id, query));
}
