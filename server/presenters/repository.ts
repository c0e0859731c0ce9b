import type { LatestSnapshotDTO, RepositoryDTO, TrendPointDTO } from '../../shared/api/repositories';
import type { Repository } from '../models/Repository';

/** The latest ready snapshot of a repository as a row of the list needs it. */
export interface LatestSnapshot {
  id: number;
  label: string;
  cloneRatio: number | null;
  createdAt: Date;
}

/** A repository with its settings and where its latest snapshot stands against the budget. */
export function presentRepository(repository: Repository, latest: LatestSnapshot | null): RepositoryDTO {
  const cloneBudget = repository.cloneBudget === null ? null : Number(repository.cloneBudget);
  const latestSnapshot: LatestSnapshotDTO | null = latest && {
    id: latest.id,
    label: latest.label,
    cloneRatio: latest.cloneRatio,
    createdAt: latest.createdAt.toISOString(),
  };
  return {
    id: repository.id,
    name: repository.name,
    description: repository.description,
    threshold: Number(repository.threshold),
    minTokens: repository.minTokens,
    shingleSize: repository.shingleSize,
    ignore: repository.ignore,
    cloneBudget,
    createdAt: repository.createdAt.toISOString(),
    latestSnapshot,
    overBudget: cloneBudget !== null && latest?.cloneRatio != null && latest.cloneRatio > cloneBudget,
  };
}

/** One trend point from a metrics row joined with its snapshot. */
export function presentTrendPoint(row: Omit<TrendPointDTO, 'createdAt'> & { createdAt: Date }): TrendPointDTO {
  return {
    snapshotId: row.snapshotId,
    label: row.label,
    createdAt: row.createdAt.toISOString(),
    cloneRatio: row.cloneRatio,
    fragmentTokens: Number(row.fragmentTokens),
    clonedTokens: Number(row.clonedTokens),
    pairCount: row.pairCount,
    classCount: row.classCount,
    crossPairCount: row.crossPairCount,
    newClassCount: row.newClassCount,
    driftedClassCount: row.driftedClassCount,
    goneClassCount: row.goneClassCount,
  };
}
