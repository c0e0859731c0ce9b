import { CLASS_STATUSES, isLoadActive, type ClassWaiverDTO, type CloneClassDetailDTO, type CloneClassSummaryDTO, type GoneClassDTO, type SnapshotComparisonDTO, type SnapshotDTO, type SnapshotMetricsDTO } from '../../shared/api/snapshots';
import type { FragmentPair } from '../clone-index/snapshot-pairs';
import type { ClassRow, MemberRow } from '../queries/classes';
import type { Snapshot } from '../models/Snapshot';
import type { SnapshotMetric } from '../models/SnapshotMetric';

/** A snapshot with its counts, timings and (once ready) its figures. */
export function presentSnapshot(snapshot: Snapshot, metric: SnapshotMetric | null): SnapshotDTO {
  const metrics: SnapshotMetricsDTO | null = metric && {
    fragmentTokens: Number(metric.fragmentTokens),
    clonedTokens: Number(metric.clonedTokens),
    cloneRatio: metric.cloneRatio,
    unwaivedClonedTokens: Number(metric.unwaivedClonedTokens),
    unwaivedCloneRatio: Number(metric.fragmentTokens) === 0 ? 0 : Number(metric.unwaivedClonedTokens) / Number(metric.fragmentTokens),
    pairCount: metric.pairCount,
    classCount: metric.classCount,
    type1Pairs: metric.type1Pairs,
    type2Pairs: metric.type2Pairs,
    type3Pairs: metric.type3Pairs,
    crossPairCount: metric.crossPairCount,
    newClassCount: metric.newClassCount,
    driftedClassCount: metric.driftedClassCount,
    goneClassCount: metric.goneClassCount,
  };
  return {
    id: snapshot.id,
    repositoryId: snapshot.repositoryId,
    label: snapshot.label,
    source: snapshot.source,
    commitSha: snapshot.commitSha,
    status: snapshot.status,
    error: snapshot.error,
    progress: isLoadActive(snapshot.status) ? (snapshot.progress ?? { phase: 'unpacking', done: 0, total: 0 }) : null,
    startedById: snapshot.startedBy,
    fileCount: snapshot.fileCount,
    skippedCount: snapshot.skippedCount,
    failedCount: snapshot.failedCount,
    analyzedFileCount: snapshot.analyzedFileCount,
    fragmentCount: snapshot.fragmentCount,
    newSetCount: snapshot.newSetCount,
    cloneRatio: snapshot.cloneRatio,
    timings: snapshot.timings,
    createdAt: snapshot.createdAt.toISOString(),
    metrics,
  };
}

/** A clone class as a list row. */
export function presentCloneClass(row: ClassRow): CloneClassSummaryDTO {
  return {
    id: row.id,
    snapshotId: row.snapshotId,
    size: row.size,
    tokens: row.tokens,
    minSimilarity: row.minSimilarity,
    maxSimilarity: row.maxSimilarity,
    cloneType: row.cloneType,
    language: row.language,
    status: row.status,
    lineageId: row.lineageId,
    paths: row.paths,
    waiver: row.waiver && presentWaiver(row.waiver),
    waiverEnded: row.waiverEnded,
  };
}

/** A lineage's active waiver as class views show it. */
export function presentWaiver(row: { reason: string; untilLabel: string | null; createdByName: string | null; createdAt: Date | string }): ClassWaiverDTO {
  return { reason: row.reason, untilLabel: row.untilLabel, createdByName: row.createdByName, createdAt: new Date(row.createdAt).toISOString() };
}

/** A previous class that no current class continues. */
export function presentGoneClass(row: ClassRow): GoneClassDTO {
  return { id: row.id, size: row.size, tokens: row.tokens, paths: row.paths };
}

/** A clone class with its members' code and the pairs among them. */
export function presentCloneClassDetail(
  row: ClassRow & { repositoryId: number; snapshotLabel: string },
  members: MemberRow[],
  pairs: FragmentPair[],
): CloneClassDetailDTO {
  return {
    ...presentCloneClass(row),
    repositoryId: row.repositoryId,
    snapshotLabel: row.snapshotLabel,
    members: members.map((m) => ({
      fragmentId: m.fragmentId,
      path: m.path,
      name: m.name,
      kind: m.kind,
      startLine: m.startLine,
      endLine: m.endLine,
      tokens: m.tokens,
      changed: m.codeChanged,
      code: m.code,
    })),
    pairs: pairs.map((p) => ({ a: p.a, b: p.b, similarity: p.similarity, type: p.type })),
  };
}

/** A snapshot's comparison with the previous ready one: its classes, the gone ones, and a count of each status. */
export function presentComparison(
  snapshotId: number,
  previous: { id: number; label: string } | undefined,
  classes: ClassRow[],
  gone: ClassRow[],
): SnapshotComparisonDTO {
  const counts = Object.fromEntries([...CLASS_STATUSES, 'gone'].map((status) => [status, 0])) as SnapshotComparisonDTO['counts'];
  for (const c of classes) counts[c.status]++;
  counts.gone = gone.length;
  return { snapshotId, previous: previous ? { id: previous.id, label: previous.label } : null, counts, classes: classes.map(presentCloneClass), gone: gone.map(presentGoneClass) };
}
