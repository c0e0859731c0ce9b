import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RepositoryMetricsDTO } from '@shared/api/repositories';
import { api } from '@/lib/api-client';

/** GET /api/repositories/:id/metrics: the trend, oldest first, with the budget. */
export function getRepositoryMetrics(id: number): Promise<RepositoryMetricsDTO> {
  return api.get<RepositoryMetricsDTO>(`/repositories/${id}/metrics`);
}

/** Query options of a repository's trend. */
export const repositoryMetricsQueryOptions = (id: number) =>
  queryOptions({ queryKey: ['repositories', id, 'metrics'], queryFn: () => getRepositoryMetrics(id) });

/** A repository's figures over releases; pass `enabled: false` while the id is not known yet. */
export function useRepositoryMetrics(id: number, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...repositoryMetricsQueryOptions(id), enabled });
}
