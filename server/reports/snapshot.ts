import type { CloneReport } from '../../shared/api/clone-report';
import { repositoryThreshold } from '../clone-index/options';
import { clonePairsAcross, clonePairsWithin, snapshotFragments } from '../clone-index/snapshot-pairs';
import type { Repository } from '../models/Repository';
import type { Snapshot } from '../models/Snapshot';
import { buildReport } from './build';

/** The clone report of a snapshot from the database, with cross-repository pairs when asked. */
export async function snapshotReport(repository: Repository, snapshot: Snapshot, cross: boolean): Promise<CloneReport> {
  const settings = snapshot.settings;
  const threshold = repositoryThreshold({ threshold: settings.threshold });
  const fragments = await snapshotFragments(undefined, snapshot.id);
  const pairs = await clonePairsWithin(undefined, fragments, threshold);
  const report = buildReport({
    settings: { threshold: settings.threshold, minTokens: settings.minTokens, shingleSize: settings.shingleSize, repository: repository.name, snapshot: snapshot.label },
    fragments: fragments.map((x) => ({
      file: x.path,
      name: x.name,
      startLine: x.startLine,
      endLine: x.endLine,
      tokens: x.tokens,
      tokenStart: x.tokenStart,
      tokenEnd: x.tokenEnd,
      rawHash: x.rawHash,
      normalizedHash: x.normalizedHash,
    })),
    pairs,
    files: { analyzed: snapshot.fileCount - snapshot.skippedCount, skipped: snapshot.skippedCount, failed: snapshot.failedCount },
  });
  if (!cross) return report;
  const others = new Map<string, number>();
  for (const pair of await clonePairsAcross(undefined, repository.id, fragments, threshold)) {
    const o = pair.other;
    const key = `${o.snapshotId}:${o.snapshotFileId}:${o.fragmentId}`;
    let id = others.get(key);
    if (id === undefined) {
      id = fragments.length + others.size;
      others.set(key, id);
      report.fragments.push({ id, file: o.path, name: o.name, startLine: o.startLine, endLine: o.endLine, tokens: o.tokens, repository: `${o.repositoryName}@${o.snapshotLabel}` });
    }
    report.pairs.push({ a: pair.a, b: id, similarity: pair.similarity, type: pair.type });
  }
  return report;
}
