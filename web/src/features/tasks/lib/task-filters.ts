/**
 * The task list's filters, sort and page as URL search parameters, like the clone class list's:
 * the shared query schema is the one truth, what it rejects is dropped one parameter at a time,
 * and defaults stay out of the URL.
 */
import { taskListQuerySchema, type TaskListQuery } from '@shared/api/tasks';

/** Every parameter, in the order they are written. */
const KEYS = ['assignee', 'status', 'repositoryId', 'overdue', 'sort', 'order', 'page', 'pageSize'] as const;

/** The list query with nothing chosen: the server's defaults. */
export const DEFAULT_TASK_QUERY: TaskListQuery = taskListQuerySchema.parse({});

/**
 * The list query held in search parameters; invalid or unknown parameters fall back to defaults.
 *
 * @example
 * readTaskFilters(new URLSearchParams('assignee=me&status=active')) // { assignee: 'me', status: 'active', sort: 'updated', page: 1, pageSize: 25 }
 */
export function readTaskFilters(params: URLSearchParams): TaskListQuery {
  const raw: Record<string, string> = {};
  for (const key of KEYS) {
    const value = params.get(key);
    if (value !== null && value.trim() !== '') raw[key] = value;
  }
  for (let round = 0; round <= KEYS.length; round++) {
    const result = taskListQuerySchema.safeParse(raw);
    if (result.success) return result.data;
    for (const issue of result.error.issues) delete raw[String(issue.path[0])];
  }
  return DEFAULT_TASK_QUERY;
}

/**
 * Search parameters for a list query: only what differs from the defaults, in a fixed order.
 *
 * @example
 * writeTaskFilters({ ...DEFAULT_TASK_QUERY, assignee: 'me' }).toString() // 'assignee=me'
 */
export function writeTaskFilters(query: Partial<TaskListQuery>): URLSearchParams {
  const params = new URLSearchParams();
  for (const key of KEYS) {
    const value = query[key];
    if (value === undefined || value === '' || value === DEFAULT_TASK_QUERY[key]) continue;
    params.set(key, String(value));
  }
  return params;
}

/** A change to the list: any filter, the sort, or the page. */
export type TaskFilterChange = Partial<{ [K in keyof TaskListQuery]: TaskListQuery[K] | undefined }>;

/**
 * The query after a change; anything but a page change goes back to page 1.
 *
 * @example
 * changeTaskFilters({ ...DEFAULT_TASK_QUERY, page: 3 }, { status: 'open' }).page // 1
 */
export function changeTaskFilters(query: TaskListQuery, change: TaskFilterChange): TaskListQuery {
  const next = { ...query, ...change } as TaskListQuery;
  const onlyPage = Object.keys(change).every((key) => key === 'page');
  if (!onlyPage) next.page = 1;
  for (const key of KEYS) if (next[key] === undefined) delete next[key];
  return { ...DEFAULT_TASK_QUERY, ...next };
}

/** The order each sort starts with (the server's default for it). */
export const DEFAULT_SORT_ORDER: Record<TaskListQuery['sort'], 'asc' | 'desc'> = { due: 'asc', updated: 'desc', created: 'desc', status: 'asc', title: 'asc' };

/**
 * The query after a click on a sortable column: the same column flips the order, another column
 * starts in its own default order.
 *
 * @example
 * toggleTaskSort({ ...DEFAULT_TASK_QUERY, sort: 'due' }, 'due').order // 'desc'
 */
export function toggleTaskSort(query: TaskListQuery, column: TaskListQuery['sort']): TaskFilterChange {
  if (query.sort !== column) return { sort: column, order: undefined };
  const current = query.order ?? DEFAULT_SORT_ORDER[column];
  return { order: current === 'asc' ? 'desc' : 'asc' };
}
