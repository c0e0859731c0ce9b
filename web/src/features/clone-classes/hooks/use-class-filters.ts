import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { ClassListQuery } from '@shared/api/snapshots';
import { changeClassFilters, readClassFilters, writeClassFilters, type ClassFilterChange } from '@/features/clone-classes/lib/class-filters';

/**
 * The class list query kept in the page's search parameters, and a setter that writes changes
 * back (each change is a history entry, so Back undoes a filter).
 */
export function useClassFilters(): [ClassListQuery, (change: ClassFilterChange | ClassListQuery) => void] {
  const [params, setParams] = useSearchParams();
  const query = useMemo(() => readClassFilters(params), [params]);
  const set = useCallback(
    (change: ClassFilterChange | ClassListQuery) => setParams(writeClassFilters(changeClassFilters(query, change))),
    [query, setParams],
  );
  return [query, set];
}
