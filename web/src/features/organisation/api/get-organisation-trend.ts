import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OrganisationTrendDTO } from '@shared/api/organisation';
import { api } from '@/lib/api-client';

/** GET /api/organisation/trend: the organisation's clone ratio after each load, oldest first. */
export function getOrganisationTrend(): Promise<OrganisationTrendDTO> {
  return api.get<OrganisationTrendDTO>('/organisation/trend');
}

/** The organisation's clone ratio over time. */
export function useOrganisationTrend() {
  return useQuery(queryOptions({ queryKey: ['organisation', 'trend'], queryFn: getOrganisationTrend }));
}
