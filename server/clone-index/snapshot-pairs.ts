import type { Transaction } from 'sequelize';
import { cloneType } from '../matching/classes';
import { jaccard } from '../matching/similarity';
import { reaches, type Threshold } from '../matching/threshold';
import { select } from './sql';

/** One fragment as it stands in one snapshot (a fragment row seen through a snapshot file). */
export interface SnapshotFragment {
  snapshotFileId: number;
  fragmentId: number;
  setId: number;
  setSize: number;
  path: string;
  language: string;
  name: string;
  kind: string;
  startLine: number;
  endLine: number;
  tokens: number;
  /** the fragment's token range in its file, [tokenStart, tokenEnd) */
  tokenStart: number;
  tokenEnd: number;
  rawHash: string;
  normalizedHash: string;
}

/** A clone pair between two fragments (indexes into the fragment list), a < b. */
export interface FragmentPair {
  a: number;
  b: number;
  similarity: number;
  type: 1 | 2 | 3;
}

/** Every fragment of a snapshot, ordered by path then position in the file. */
export async function snapshotFragments(tx: Transaction | undefined, snapshotId: number): Promise<SnapshotFragment[]> {
  return select<SnapshotFragment>(
    tx,
    `select sf.id as "snapshotFileId", f.id as "fragmentId", f.set_id as "setId", s.size as "setSize",
            sf.path, sf.language, f.name, f.kind, f.start_line as "startLine", f.end_line as "endLine",
            f.tokens, f.token_start as "tokenStart", f.token_end as "tokenEnd",
            f.raw_hash as "rawHash", f.normalized_hash as "normalizedHash"
       from snapshot_files sf
       join fragments f on f.analysis_id = sf.analysis_id
       join shingle_sets s on s.id = f.set_id
      where sf.snapshot_id = $1
      order by sf.path, f.ordinal`,
    [snapshotId],
  );
}

/** Stored set pairs with one set in `left` and the other in `right` (both directions), with sizes. */
async function setPairsBetween(tx: Transaction | undefined, left: number[], right: number[]) {
  return select<{ setA: number; setB: number; overlap: number; sizeA: number; sizeB: number }>(
    tx,
    `with l as (select distinct unnest($1::int[]) as id), r as (select distinct unnest($2::int[]) as id)
     select p.set_a as "setA", p.set_b as "setB", p.overlap, sa.size as "sizeA", sb.size as "sizeB"
       from set_pairs p
       join shingle_sets sa on sa.id = p.set_a
       join shingle_sets sb on sb.id = p.set_b
      where (p.set_a in (select id from l) and p.set_b in (select id from r))
         or (p.set_a in (select id from r) and p.set_b in (select id from l))`,
    [left, right],
  );
}

function groupBySet(fragments: SnapshotFragment[]) {
  const bySet = new Map<number, number[]>();
  fragments.forEach((x, i) => {
    if (x.setSize === 0) return; // an empty set pairs with nothing
    const list = bySet.get(x.setId);
    if (list) list.push(i);
    else bySet.set(x.setId, [i]);
  });
  return bySet;
}

/**
 * The clone pairs among a snapshot's fragments at threshold t: fragments sharing one set
 * (similarity 1) and fragments whose sets form a stored pair that reaches t (exact integer test).
 * Sorted by (a, b).
 */
export async function clonePairsWithin(
  tx: Transaction | undefined,
  fragments: SnapshotFragment[],
  t: Threshold,
): Promise<FragmentPair[]> {
  const bySet = groupBySet(fragments);
  const ids = [...bySet.keys()];
  const pairs: FragmentPair[] = [];
  const add = (i: number, j: number, similarity: number) => {
    const [a, b] = i < j ? [i, j] : [j, i];
    pairs.push({ a, b, similarity, type: cloneType(fragments[a], fragments[b]) });
  };
  for (const members of bySet.values()) {
    for (let x = 0; x < members.length; x++) for (let y = x + 1; y < members.length; y++) add(members[x], members[y], 1);
  }
  for (const p of await setPairsBetween(tx, ids, ids)) {
    if (!reaches(t, p.sizeA, p.sizeB, p.overlap)) continue;
    const similarity = jaccard(p.overlap, p.sizeA, p.sizeB);
    for (const i of bySet.get(p.setA)!) for (const j of bySet.get(p.setB)!) add(i, j, similarity);
  }
  return pairs.sort((x, y) => x.a - y.a || x.b - y.b);
}

/** A clone pair between a fragment of this snapshot and one of another repository's snapshot. */
export interface CrossPair {
  a: number;
  other: SnapshotFragment & { repositoryId: number; repositoryName: string; snapshotId: number; snapshotLabel: string };
  similarity: number;
  type: 1 | 2 | 3;
}

/**
 * Pairs between a snapshot's fragments and the fragments of the latest ready snapshot of every
 * other repository of the same organisation, at threshold t. Kept apart from the pairs within the
 * repository; never across organisations.
 */
export async function clonePairsAcross(
  tx: Transaction | undefined,
  repositoryId: number,
  fragments: SnapshotFragment[],
  t: Threshold,
): Promise<CrossPair[]> {
  const others = await select<{ id: number; label: string; repositoryId: number; repositoryName: string }>(
    tx,
    `select s.id, s.label, s.repository_id as "repositoryId", r.name as "repositoryName"
       from latest_ready_snapshots l join snapshots s on s.id = l.snapshot_id join repositories r on r.id = l.repository_id
      where l.repository_id <> $1 and r.organisation_id = (select organisation_id from repositories where id = $1)
      order by l.repository_id`,
    [repositoryId],
  );
  const result: CrossPair[] = [];
  const bySet = groupBySet(fragments);
  for (const other of others) {
    const theirs = await snapshotFragments(tx, other.id);
    const theirBySet = groupBySet(theirs);
    const link = (mine: number[] | undefined, their: number[] | undefined, similarity: number) => {
      for (const a of mine ?? []) {
        for (const j of their ?? []) {
          const o = theirs[j];
          result.push({
            a,
            other: { ...o, repositoryId: other.repositoryId, repositoryName: other.repositoryName, snapshotId: other.id, snapshotLabel: other.label },
            similarity,
            type: cloneType(fragments[a], o),
          });
        }
      }
    };
    for (const [setId, mine] of bySet) link(mine, theirBySet.get(setId), 1);
    for (const p of await setPairsBetween(tx, [...bySet.keys()], [...theirBySet.keys()])) {
      if (!reaches(t, p.sizeA, p.sizeB, p.overlap)) continue;
      const similarity = jaccard(p.overlap, p.sizeA, p.sizeB);
      if (bySet.has(p.setA)) link(bySet.get(p.setA), theirBySet.get(p.setB), similarity);
      if (bySet.has(p.setB)) link(bySet.get(p.setB), theirBySet.get(p.setA), similarity);
    }
  }
  return result;
}
