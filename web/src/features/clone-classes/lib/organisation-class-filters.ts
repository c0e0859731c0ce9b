import { organisationClassQuerySchema, type OrganisationClassQuery } from '@shared/api/clone-classes';
import { searchQuery } from '@/lib/search-query';

/** The organisation's class list query in the URL (every parameter, in the order they are written). */
export const organisationClassFilters = searchQuery(organisationClassQuerySchema, [
  'repository',
  'scope',
  'status',
  'waived',
  'type',
  'language',
  'minMembers',
  'minTokens',
  'path',
  'name',
  'sort',
  'order',
  'page',
  'pageSize',
]);

/** A change to the organisation's class list. */
export type OrganisationClassChange = Partial<{ [K in keyof OrganisationClassQuery]: OrganisationClassQuery[K] | undefined }>;

/**
 * The query after a click on a sortable column: the same column flips the order, another column
 * starts with its largest values first (names: from A).
 */
export function toggleOrganisationSort(query: OrganisationClassQuery, column: OrganisationClassQuery['sort']): OrganisationClassQuery {
  if (query.sort === column) return organisationClassFilters.change(query, { order: query.order === 'desc' ? 'asc' : 'desc' });
  return organisationClassFilters.change(query, { sort: column, order: column === 'repository' ? 'asc' : 'desc' });
}
