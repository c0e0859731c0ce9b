import type { Transaction } from 'sequelize';
import { type Threshold } from '../matching/threshold';
import { lookupShingles, ranksBelowKnown } from './dictionary';
import { probeSets } from './probe';
import { select } from './sql';

/** A stored set similar to a probe, with the exact overlap. */
export interface SimilarSet {
  setId: number;
  size: number;
  overlap: number;
  similarity: number;
}

/**
 * Every stored set whose similarity to the given shingle set reaches t (t at or above the index
 * threshold, which is what makes the stored prefixes long enough). Shingles the dictionary has
 * never seen get ranks below every known one: they count in the probe's size but match nothing.
 */
export async function findSimilarSets(tx: Transaction | undefined, shingles: string[], t: Threshold): Promise<SimilarSet[]> {
  const distinct = [...new Set(shingles)];
  if (distinct.length === 0) return [];
  const known = await lookupShingles(tx, distinct);
  const unknown = await ranksBelowKnown(tx, distinct.filter((s) => !known.has(s)).length);
  let next = 0;
  const ranks = Int32Array.from(distinct, (s) => known.get(s) ?? unknown[next++]).sort();
  const { matches } = await probeSets(tx, [ranks], t, () => false);
  return matches
    .map((m) => ({ setId: m.setId, size: m.size, overlap: m.overlap, similarity: m.similarity }))
    .sort((a, b) => b.similarity - a.similarity || a.setId - b.setId);
}

/** Where a similar set stands: a fragment in a file of the latest ready snapshot of a repository. */
export interface CopyLocation {
  setId: number;
  repositoryId: number;
  repositoryName: string;
  snapshotId: number;
  snapshotLabel: string;
  path: string;
  name: string;
  startLine: number;
  endLine: number;
}

/** The fragments holding the given sets in the latest ready snapshot of every repository of an organisation. */
export async function locateSets(tx: Transaction | undefined, organisationId: string, setIds: number[]): Promise<CopyLocation[]> {
  if (setIds.length === 0) return [];
  return select<CopyLocation>(
    tx,
    `with latest as (
       select s.id, s.repository_id, s.label from latest_ready_snapshots l
         join snapshots s on s.id = l.snapshot_id join repositories r on r.id = l.repository_id
        where r.organisation_id = $2)
     select f.set_id as "setId", r.id as "repositoryId", r.name as "repositoryName", l.id as "snapshotId",
            l.label as "snapshotLabel", sf.path, f.name, f.start_line as "startLine", f.end_line as "endLine"
       from fragments f
       join snapshot_files sf on sf.analysis_id = f.analysis_id
       join latest l on l.id = sf.snapshot_id
       join repositories r on r.id = l.repository_id
      where f.set_id = any($1::int[])
      order by r.name, sf.path, f.start_line`,
    [setIds, organisationId],
  );
}
