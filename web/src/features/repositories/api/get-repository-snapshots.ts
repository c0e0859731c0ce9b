import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SnapshotListDTO } from '@shared/api/snapshots';
import { api } from '@/lib/api-client';

/** GET /api/repositories/:id/snapshots, newest first. */
export function getRepositorySnapshots(id: number): Promise<SnapshotListDTO> {
  return api.get<SnapshotListDTO>(`/repositories/${id}/snapshots`);
}

/** Query options of a repository's snapshots. */
export const repositorySnapshotsQueryOptions = (id: number) =>
  queryOptions({ queryKey: ['repositories', id, 'snapshots'], queryFn: () => getRepositorySnapshots(id) });

/** A repository's snapshots, newest first. */
export function useRepositorySnapshots(id: number) {
  return useQuery(repositorySnapshotsQueryOptions(id));
}
