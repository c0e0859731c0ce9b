import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { OrganisationClassQuery } from '@shared/api/clone-classes';
import { organisationClassFilters, type OrganisationClassChange } from '@/features/clone-classes/lib/organisation-class-filters';

/**
 * The organisation's class list query kept in the page's search parameters, and a setter that
 * writes changes back (each change is a history entry, so Back undoes a filter).
 */
export function useOrganisationClassFilters(): [OrganisationClassQuery, (change: OrganisationClassChange | OrganisationClassQuery) => void] {
  const [params, setParams] = useSearchParams();
  const query = useMemo(() => organisationClassFilters.read(params), [params]);
  const set = useCallback(
    (change: OrganisationClassChange | OrganisationClassQuery) => setParams(organisationClassFilters.write(organisationClassFilters.change(query, change))),
    [query, setParams],
  );
  return [query, set];
}
