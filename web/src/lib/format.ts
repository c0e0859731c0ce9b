/**
 * A date as "2026-12-01 14:05" in local time; the dense, sortable form used across tables.
 *
 * @example
 * formatDateTime('2026-12-01T14:05:00Z')
 */
export function formatDateTime(iso: string | null): string {
  if (!iso) return '—';
  const d = new Date(iso);
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())} ${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

/**
 * A share (0..1) as a percentage with one decimal, or "—" when there is none.
 *
 * @example
 * formatPercent(0.1234) // '12.3 %'
 * formatPercent(null)   // '—'
 */
export function formatPercent(share: number | null | undefined): string {
  if (share === null || share === undefined || !Number.isFinite(share)) return '—';
  return `${(share * 100).toFixed(1)} %`;
}

/**
 * A similarity (0..1) with three decimals, the precision at which thresholds are usually set.
 *
 * @example
 * formatSimilarity(0.8) // '0.800'
 */
export function formatSimilarity(similarity: number): string {
  return similarity.toFixed(3);
}

/**
 * A path with its line range, the way an editor's "go to" understands it.
 *
 * @example
 * formatLocation('billing/tariff.js', 2, 13) // 'billing/tariff.js:2–13'
 */
export function formatLocation(path: string, startLine: number, endLine: number): string {
  return startLine === endLine ? `${path}:${startLine}` : `${path}:${startLine}–${endLine}`;
}
