/**
 * The clone class list's sort, filters and page as URL search parameters, so a filtered list can
 * be linked, reloaded and gone back to. The shared query schema is the one truth: what it rejects
 * is dropped (a hand-edited `?status=sideways` just shows all statuses), and defaults stay out of
 * the URL so links are short.
 */
import { classListQuerySchema, type ClassListQuery } from '@shared/api/snapshots';

/** Every parameter, in the order they are written. */
const KEYS = ['sort', 'order', 'type', 'language', 'path', 'status', 'waived', 'page', 'pageSize'] as const;

/** The list query with nothing chosen: the server's defaults. */
export const DEFAULT_CLASS_QUERY: ClassListQuery = classListQuerySchema.parse({});

/**
 * The list query held in search parameters; invalid or unknown parameters fall back to defaults
 * one by one.
 *
 * @example
 * readClassFilters(new URLSearchParams('status=drifted&type=3&page=2'))
 * // { sort: 'tokens', order: 'desc', status: 'drifted', type: 3, page: 2, pageSize: 50 }
 */
export function readClassFilters(params: URLSearchParams): ClassListQuery {
  const raw: Record<string, string> = {};
  for (const key of KEYS) {
    const value = params.get(key);
    if (value !== null && value.trim() !== '') raw[key] = value;
  }
  // Each failed round drops the parameters the schema named; at most KEYS.length rounds.
  for (let round = 0; round <= KEYS.length; round++) {
    const result = classListQuerySchema.safeParse(raw);
    if (result.success) return result.data;
    for (const issue of result.error.issues) delete raw[String(issue.path[0])];
  }
  return DEFAULT_CLASS_QUERY;
}

/**
 * Search parameters for a list query: only what differs from the defaults, in a fixed order.
 *
 * @example
 * writeClassFilters({ ...DEFAULT_CLASS_QUERY, status: 'drifted' }).toString() // 'status=drifted'
 */
export function writeClassFilters(query: Partial<ClassListQuery>): URLSearchParams {
  const params = new URLSearchParams();
  for (const key of KEYS) {
    const value = query[key];
    if (value === undefined || value === '' || value === DEFAULT_CLASS_QUERY[key]) continue;
    params.set(key, String(value));
  }
  return params;
}

/** A change to the list: any filter, the sort, or the page. */
export type ClassFilterChange = Partial<{ [K in keyof ClassListQuery]: ClassListQuery[K] | undefined }>;

/**
 * The query after a change. Changing a filter, the sort or the page size goes back to page 1,
 * since the old page number means nothing in the new list.
 *
 * @example
 * changeClassFilters({ ...DEFAULT_CLASS_QUERY, page: 3 }, { type: 2 }).page // 1
 */
export function changeClassFilters(query: ClassListQuery, change: ClassFilterChange): ClassListQuery {
  const next = { ...query, ...change } as ClassListQuery;
  const onlyPage = Object.keys(change).every((key) => key === 'page');
  if (!onlyPage) next.page = 1;
  for (const key of KEYS) if (next[key] === '' || next[key] === undefined) delete next[key];
  return { ...DEFAULT_CLASS_QUERY, ...next };
}

/**
 * The query after a click on a sortable column: the same column flips the order, another column
 * starts with its largest values first.
 *
 * @example
 * toggleClassSort({ ...DEFAULT_CLASS_QUERY, sort: 'size', order: 'desc' }, 'size').order // 'asc'
 */
export function toggleClassSort(query: ClassListQuery, column: ClassListQuery['sort']): ClassListQuery {
  if (query.sort === column) return changeClassFilters(query, { order: query.order === 'desc' ? 'asc' : 'desc' });
  return changeClassFilters(query, { sort: column, order: 'desc' });
}
