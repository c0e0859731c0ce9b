import type { Transaction } from 'sequelize';
import { compareClasses, fragmentKey, occurrences, type FragmentIdentity } from '../clone-index/compare';
import { assignLineages } from '../clone-index/lineage';
import { repositoryThreshold, type RepositorySettings } from '../clone-index/options';
import { clonePairsAcross, clonePairsWithin, snapshotFragments, type SnapshotFragment } from '../clone-index/snapshot-pairs';
import { cloneClasses, clonedTokens } from '../matching/classes';
import { classLineageIds, classMemberIds } from '../queries/classes';
import { storeCrossPairs } from '../queries/cross-classes';
import { insertSnapshotMetrics, previousReadySnapshot } from '../queries/snapshots';
import { activeWaivers, endWaivers } from '../queries/waivers';
import { storeClasses } from '../queries/write-classes';
import { classStats } from '../reports/class-stats';
import { endWaiversReachingRelease } from './waivers';

/** What deriving a snapshot's clones found. */
export interface DerivedClones {
  fragmentCount: number;
  pairCount: number;
  classCount: number;
  cloneRatio: number;
}

/**
 * The step of a load after its files are stored: the snapshot's clone pairs (from stored set
 * pairs, at the repository's threshold), its classes compared with the previous ready snapshot's
 * and linked to their lineages (server/clone-index/lineage.ts), its clone ratio and figures, and
 * its pairs with the other repositories' latest snapshots, all written in the load's transaction.
 */
export async function deriveClones(tx: Transaction, snapshotId: number, repository: RepositorySettings & { id: number }): Promise<DerivedClones> {
  const t = repositoryThreshold(repository);
  const fragments = await snapshotFragments(tx, snapshotId);
  const pairs = await clonePairsWithin(tx, fragments, t);
  const classes = cloneClasses(fragments.length, pairs);
  const tokens = clonedTokens(fragments.map((x) => ({ file: x.snapshotFileId, tokenStart: x.tokenStart, tokenEnd: x.tokenEnd })), pairs);
  const cloneRatio = tokens.total === 0 ? 0 : tokens.cloned / tokens.total;
  const cross = await clonePairsAcross(tx, repository.id, fragments, t);

  const mine = identities(fragments);
  const previous = await previousClasses(tx, repository.id, snapshotId);
  const comparison = compareClasses(classes.map((c) => c.map((i) => mine[i])), previous.classes, previous.fragments);
  const lineages = assignLineages(
    previous.classes.map((members, p) => ({ lineageId: previous.lineageIds[p], members: members.map(fragmentKey) })),
    classes.map((members) => members.map((i) => fragmentKey(mine[i]))),
  );

  await endWaiversReachingRelease(tx, snapshotId, repository.id);
  const waived = await settleWaivers(tx, snapshotId, fragments, mine, classes, lineages, previous);
  const unwaived = clonedTokens(
    fragments.map((x) => ({ file: x.snapshotFileId, tokenStart: x.tokenStart, tokenEnd: x.tokenEnd })),
    pairs.filter((p) => !waived.has(p.a)),
  );

  const stats = classStats(fragments.length, classes, pairs);
  await storeClasses(
    tx,
    snapshotId,
    classes.map((members, c) => ({
      size: members.length,
      tokens: members.reduce((sum, i) => sum + fragments[i].tokens, 0),
      ...stats[c],
      language: fragments[members[0]].language,
      status: comparison.classes[c].status,
      previousClassId: comparison.classes[c].previous >= 0 ? previous.classIds[comparison.classes[c].previous] : null,
      lineageId: lineages[c] === 'new' ? null : lineages[c],
      members: members.map((i, m) => ({ snapshotFileId: fragments[i].snapshotFileId, fragmentId: fragments[i].fragmentId, codeChanged: comparison.classes[c].changed[m] })),
    })),
  );
  await storeCrossPairs(
    tx,
    cross.map((p) => ({
      snapshotId,
      snapshotFileId: fragments[p.a].snapshotFileId,
      fragmentId: fragments[p.a].fragmentId,
      otherSnapshotId: p.other.snapshotId,
      otherSnapshotFileId: p.other.snapshotFileId,
      otherFragmentId: p.other.fragmentId,
      similarity: p.similarity,
      cloneType: p.type,
    })),
  );
  const [type1Pairs, type2Pairs, type3Pairs] = [1, 2, 3].map((type) => pairs.filter((p) => p.type === type).length);
  await insertSnapshotMetrics(tx, snapshotId, {
    fragmentTokens: tokens.total,
    clonedTokens: tokens.cloned,
    unwaivedClonedTokens: unwaived.cloned,
    cloneRatio,
    pairCount: pairs.length,
    classCount: classes.length,
    type1Pairs,
    type2Pairs,
    type3Pairs,
    crossPairCount: cross.length,
    newClassCount: comparison.classes.filter((c) => c.status === 'new').length,
    driftedClassCount: comparison.classes.filter((c) => c.status === 'drifted').length,
    goneClassCount: comparison.gone.length,
  });
  return { fragmentCount: fragments.length, pairCount: pairs.length, classCount: classes.length, cloneRatio };
}

/**
 * Ends, by itself, the active waiver of each lineage whose class in this snapshot has a member its
 * class in the previous snapshot did not have (a copy joined: the waiver no longer covers what it
 * was given for), naming the first such member by path and name. Returns the fragments (by index)
 * of the classes whose lineage stays waived, which the unwaived clone ratio leaves out; a clone
 * pair lies within one class, so leaving out its first fragment's class leaves out the pair.
 */
async function settleWaivers(
  tx: Transaction,
  snapshotId: number,
  fragments: SnapshotFragment[],
  mine: FragmentIdentity[],
  classes: number[][],
  lineages: (number | 'new')[],
  previous: Awaited<ReturnType<typeof previousClasses>>,
): Promise<Set<number>> {
  const continued = lineages.filter((l): l is number => l !== 'new');
  const waivers = await activeWaivers(continued, tx);
  if (waivers.size === 0) return new Set();
  const before = new Map<number, Set<string>>();
  previous.classes.forEach((members, p) => {
    const keys = before.get(previous.lineageIds[p]) ?? new Set<string>();
    for (const m of members) keys.add(fragmentKey(m));
    before.set(previous.lineageIds[p], keys);
  });
  const waivedFragments = new Set<number>();
  const ended: { lineageId: number; reason: string }[] = [];
  classes.forEach((members, c) => {
    const lineage = lineages[c];
    if (lineage === 'new' || !waivers.has(lineage)) return;
    const known = before.get(lineage) ?? new Set<string>();
    const joined = members.find((i) => !known.has(fragmentKey(mine[i])));
    if (joined === undefined) for (const i of members) waivedFragments.add(i);
    else ended.push({ lineageId: lineage, reason: `a new member joined: ${fragments[joined].path} ${fragments[joined].name}` });
  });
  await endWaivers(tx, snapshotId, ended);
  return waivedFragments;
}

function identities(fragments: SnapshotFragment[]): FragmentIdentity[] {
  const nth = occurrences(fragments);
  return fragments.map((x, i) => ({ path: x.path, name: x.name, occurrence: nth[i], rawHash: x.rawHash }));
}

/**
 * The previous ready snapshot's classes (as fragment identities, with their ids and lineage ids in
 * the same order) and the raw hash of every one of its fragments by fragment key; all empty for a
 * first snapshot.
 */
async function previousClasses(tx: Transaction, repositoryId: number, snapshotId: number) {
  const previous = await previousReadySnapshot(tx, repositoryId, snapshotId);
  if (!previous) return { classes: [], classIds: [], lineageIds: [], fragments: new Map<string, string>() };
  const before = await snapshotFragments(tx, previous.id);
  const theirs = identities(before);
  const indexOf = new Map(before.map((x, i) => [`${x.snapshotFileId}:${x.fragmentId}`, i]));
  const grouped = await classMemberIds(tx, previous.id);
  const lineageOf = await classLineageIds(tx, previous.id);
  return {
    classes: [...grouped.values()].map((members) => members.map((m) => theirs[indexOf.get(`${m.snapshotFileId}:${m.fragmentId}`)!])),
    classIds: [...grouped.keys()],
    lineageIds: [...grouped.keys()].map((id) => lineageOf.get(id)!),
    fragments: new Map(theirs.map((m) => [fragmentKey(m), m.rawHash])),
  };
}
