import type { GitImportDTO } from '@shared/api/git-links';
import { formatDateTime } from '@/lib/format';

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/**
 * The last import in one sentence, as the Git releases panel shows it.
 *
 * @example
 * describeImport({ status: 'succeeded', finishedAt, tagCount: 3, newTagCount: 1, loadedCount: 1, … })
 * // 'Last checked 2026-12-02 09:14: 3 matching tags, 1 new, 1 loaded.'
 */
export function describeImport(last: GitImportDTO): string {
  switch (last.status) {
    case 'queued':
      return `Queued at ${formatDateTime(last.requestedAt)}, waiting for a worker.`;
    case 'running':
      if (last.newTagCount === null) return `Fetching tags since ${formatDateTime(last.startedAt)}…`;
      if (last.currentTag) return `Loading ${last.currentTag}: ${last.loadedCount ?? 0} of ${plural(last.newTagCount, 'new tag')} loaded.`;
      return `Running since ${formatDateTime(last.startedAt)}.`;
    case 'succeeded': {
      const head = `Last checked ${formatDateTime(last.finishedAt)}: ${plural(last.tagCount ?? 0, 'matching tag')}`;
      if (!last.newTagCount) return `${head}, none new.`;
      const rest = (last.newTagCount ?? 0) - (last.loadedCount ?? 0);
      return `${head}, ${last.newTagCount} new, ${last.loadedCount ?? 0} loaded.${rest > 0 ? ` ${plural(rest, 'tag')} left: check again to load ${rest === 1 ? 'it' : 'them'}.` : ''}`;
    }
    case 'failed':
      return `The import of ${formatDateTime(last.startedAt)} failed after loading ${plural(last.loadedCount ?? 0, 'tag')}: ${last.error ?? 'no reason given.'}`;
  }
}
