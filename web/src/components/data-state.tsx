import { Notice, errorMessage } from './notice';

/**
 * What a panel shows while its query has no data: "Loading …" or the error. Returns null once
 * data is there, so a component reads `if (!query.data) return <QueryState … />`.
 */
export function QueryState({ query, what }: { query: { isPending: boolean; isError: boolean; error: unknown }; what: string }) {
  if (query.isError) return <Notice tone="error">{errorMessage(query.error)}</Notice>;
  if (query.isPending) return <p className="text-sm text-muted">Loading {what}…</p>;
  return null;
}
