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
