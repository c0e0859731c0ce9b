/** How every benchmark prints its figures, so tables from different runs read alike. */

/**
 * A duration: seconds with two decimals from 1 s (one from 10 s), whole milliseconds from 10 ms,
 * one decimal below.
 *
 * @example formatMs(1534.2) // '1.53 s'
 */
export function formatMs(ms: number): string {
  if (ms >= 10_000) return `${(ms / 1000).toFixed(1)} s`;
  if (ms >= 1000) return `${(ms / 1000).toFixed(2)} s`;
  if (ms >= 10) return `${ms.toFixed(0)} ms`;
  return `${ms.toFixed(1)} ms`;
}

/**
 * A count, rounded, with thousands separators.
 *
 * @example formatCount(1234567.4) // '1,234,567'
 */
export function formatCount(n: number): string {
  return Math.round(n).toLocaleString('en-US');
}

/**
 * A size in bytes: GB with two decimals from 1 GiB, whole MB below.
 *
 * @example formatBytes(3 * 2 ** 20) // '3 MB'
 */
export function formatBytes(n: number): string {
  return n >= 1 << 30 ? `${(n / (1 << 30)).toFixed(2)} GB` : `${(n / (1 << 20)).toFixed(0)} MB`;
}
