import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { OrganisationClassPageDTO, OrganisationClassQuery } from '@shared/api/clone-classes';
import { api } from '@/lib/api-client';
import { organisationClassFilters } from '@/features/clone-classes/lib/organisation-class-filters';

/** GET /api/clone-classes: the organisation's classes, sorted, filtered and paged on the server. */
export function getOrganisationClasses(query: Partial<OrganisationClassQuery>): Promise<OrganisationClassPageDTO> {
  const search = organisationClassFilters.write(query).toString();
  return api.get<OrganisationClassPageDTO>(`/clone-classes${search ? `?${search}` : ''}`);
}

/** Query options of one page of the organisation's classes. */
export const organisationClassesQueryOptions = (query: Partial<OrganisationClassQuery>) =>
  queryOptions({
    queryKey: ['clone-classes', 'organisation', query],
    queryFn: () => getOrganisationClasses(query),
    // the table keeps the last page on screen while the next sort or filter loads
    placeholderData: keepPreviousData,
  });

/** One page of the organisation's clone classes. */
export function useOrganisationClasses(query: Partial<OrganisationClassQuery>) {
  return useQuery(organisationClassesQueryOptions(query));
}
