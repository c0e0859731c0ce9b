import type { LatestSnapshotDTO, RepositoryDTO, TrendPointDTO } from '../../shared/api/repositories';
import type { Repository } from '../models/Repository';
import type { LatestSnapshot, TrendRow } from '../queries/repositories';
import { exceedsBudget, parseBudget } from '../reports/budget';

/**
 * Whether the latest snapshot is over the repository's budget: the exact verdict `doublet scan
 * --budget` gives (token counts against the stored decimal, in integers), never the rounded ratio.
 * Classes whose lineage is waived are left out (the unwaived cloned tokens).
 */
function isOverBudget(cloneBudget: string | null, latest: LatestSnapshot | null): boolean {
  if (cloneBudget === null || latest?.unwaivedClonedTokens == null || latest.fragmentTokens == null) return false;
  // numeric(7,6) arrives as "0.400000"; a value set in this request may still be a longer number
  // string, so it is put in the form the column stores first
  return exceedsBudget({ clonedTokens: latest.unwaivedClonedTokens, fragmentTokens: latest.fragmentTokens }, parseBudget(Number(cloneBudget).toFixed(6)));
}

/** cloned / total, 0 without tokens, null without figures. */
function ratio(cloned: number | null, total: number | null): number | null {
  if (cloned === null || total === null) return null;
  return total === 0 ? 0 : cloned / total;
}

/** A repository with its settings and where its latest snapshot stands against the budget. */
export function presentRepository(repository: Repository, latest: LatestSnapshot | null): RepositoryDTO {
  const cloneBudget = repository.cloneBudget === null ? null : Number(repository.cloneBudget);
  const latestSnapshot: LatestSnapshotDTO | null = latest && {
    id: latest.id,
    label: latest.label,
    cloneRatio: latest.cloneRatio,
    unwaivedCloneRatio: ratio(latest.unwaivedClonedTokens, latest.fragmentTokens),
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
    overBudget: isOverBudget(repository.cloneBudget, latest),
  };
}

/** One trend point from a metrics row joined with its snapshot. */
export function presentTrendPoint(row: TrendRow): TrendPointDTO {
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
