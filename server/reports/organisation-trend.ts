/** One point of the organisation's trend: its clone ratio right after one load. */
export interface OrganisationTrendPoint {
  snapshotId: number;
  repositoryName: string;
  label: string;
  createdAt: Date;
  repositoryCount: number;
  fragmentTokens: number;
  clonedTokens: number;
  cloneRatio: number;
}

/**
 * The organisation's clone ratio after each load (in load order): the cloned tokens over the
 * fragment tokens of the latest snapshot of every repository loaded so far, so a large repository
 * weighs more than a small one. Keeps the last `limit` points.
 *
 * @example organisationTrend([{ repositoryId: 1, fragmentTokens: 100, clonedTokens: 10, … }, { repositoryId: 2, fragmentTokens: 300, clonedTokens: 90, … }])
 * // ratios 0.1, then (10 + 90) / (100 + 300) = 0.25
 */
export function organisationTrend(
  loads: readonly { snapshotId: number; repositoryId: number; repositoryName: string; label: string; createdAt: Date; fragmentTokens: number; clonedTokens: number }[],
  limit: number,
): OrganisationTrendPoint[] {
  const latest = new Map<number, { fragmentTokens: number; clonedTokens: number }>();
  let fragmentTokens = 0;
  let clonedTokens = 0;
  const points: OrganisationTrendPoint[] = [];
  for (const load of loads) {
    const before = latest.get(load.repositoryId);
    if (before) {
      fragmentTokens -= before.fragmentTokens;
      clonedTokens -= before.clonedTokens;
    }
    latest.set(load.repositoryId, { fragmentTokens: load.fragmentTokens, clonedTokens: load.clonedTokens });
    fragmentTokens += load.fragmentTokens;
    clonedTokens += load.clonedTokens;
    points.push({
      snapshotId: load.snapshotId,
      repositoryName: load.repositoryName,
      label: load.label,
      createdAt: load.createdAt,
      repositoryCount: latest.size,
      fragmentTokens,
      clonedTokens,
      cloneRatio: fragmentTokens === 0 ? 0 : clonedTokens / fragmentTokens,
    });
  }
  return points.slice(-limit);
}
