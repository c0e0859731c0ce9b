/**
 * A list query (filters, sort, page) kept in URL search parameters, so a filtered list can be
 * linked, reloaded and gone back to. The shared zod schema is the one truth: what it rejects is
 * dropped one parameter at a time (a hand-edited `?status=sideways` just shows all statuses), and
 * defaults stay out of the URL so links are short.
 */
import type { z } from 'zod';

/** The readers and writers of one list query's search parameters. */
export interface SearchQuery<Q extends Record<string, unknown>> {
  /** the query with nothing chosen: the server's defaults */
  defaults: Q;
  read(params: URLSearchParams): Q;
  /** only what differs from the defaults, in the order of the keys */
  write(query: Partial<Q>): URLSearchParams;
  /** the query after a change; anything but a page change goes back to page 1 */
  change(query: Q, change: Partial<{ [K in keyof Q]: Q[K] | undefined }>): Q;
}

/**
 * @example
 * const q = searchQuery(schema, ['status', 'page']);
 * q.read(new URLSearchParams('status=drifted&page=x')) // { status: 'drifted', page: 1, … }
 */
export function searchQuery<S extends z.ZodType<Record<string, unknown>, Record<string, unknown>>>(
  schema: S,
  keys: readonly (keyof z.output<S> & string)[],
): SearchQuery<z.output<S>> {
  type Q = z.output<S>;
  const defaults = schema.parse({}) as Q;
  const read = (params: URLSearchParams): Q => {
    const raw: Record<string, string> = {};
    for (const key of keys) {
      const value = params.get(key);
      if (value !== null && value.trim() !== '') raw[key] = value;
    }
    // each failed round drops the parameters the schema named; at most keys.length rounds
    for (let round = 0; round <= keys.length; round++) {
      const result = schema.safeParse(raw);
      if (result.success) return result.data as Q;
      for (const issue of result.error.issues) delete raw[String(issue.path[0])];
    }
    return defaults;
  };
  const write = (query: Partial<Q>): URLSearchParams => {
    const params = new URLSearchParams();
    for (const key of keys) {
      const value = query[key];
      if (value === undefined || value === '' || value === defaults[key]) continue;
      params.set(key, String(value));
    }
    return params;
  };
  const change = (query: Q, delta: Partial<{ [K in keyof Q]: Q[K] | undefined }>): Q => {
    const next: Record<string, unknown> = { ...query, ...delta };
    if (!Object.keys(delta).every((key) => key === 'page')) next.page = 1;
    for (const key of keys) if (next[key] === '' || next[key] === undefined) delete next[key];
    return { ...defaults, ...next } as Q;
  };
  return { defaults, read, write, change };
}
