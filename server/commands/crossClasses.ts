import type { Transaction } from 'sequelize';
import { cloneClasses } from '../matching/classes';
import {
  classesHolding,
  crossPairsOfLatest,
  memberFacts,
  replaceCrossClasses,
  type CrossClassToStore,
  type MemberKey,
} from '../queries/cross-classes';

const keyOf = (m: MemberKey) => `${m.snapshotFileId}:${m.fragmentId}`;

/**
 * Rebuilds the organisation's classes that span repositories, in the caller's transaction: the
 * connected components of the current latest snapshots' fragments, linked by the stored pairs
 * across repositories and by each snapshot's own classes (a repository's class joins whole).
 * Only components that hold a pair across repositories are kept, so each spans two or more.
 * Run after every load (once the snapshot is ready) and after a repository is deleted.
 */
export async function rebuildCrossClasses(tx: Transaction, organisationId: string): Promise<number> {
  const pairs = await crossPairsOfLatest(tx, organisationId);
  const index = new Map<string, number>();
  const keys: MemberKey[] = [];
  const node = (m: MemberKey) => {
    const key = keyOf(m);
    let i = index.get(key);
    if (i === undefined) {
      i = keys.length;
      index.set(key, i);
      keys.push({ snapshotFileId: m.snapshotFileId, fragmentId: m.fragmentId });
    }
    return i;
  };
  const edges: { a: number; b: number; similarity: number; cloneType: number }[] = pairs.map((p) => ({
    a: node(p),
    b: node({ snapshotFileId: p.otherSnapshotFileId, fragmentId: p.otherFragmentId }),
    similarity: p.similarity,
    cloneType: p.cloneType,
  }));
  const holding = await classesHolding(tx, [...keys]);
  const classOf = new Map<number, number>();
  const classStats = new Map<number, { minSimilarity: number; maxSimilarity: number; cloneType: number }>();
  let previousClass = -1;
  let previousNode = -1;
  for (const row of holding) {
    const i = node(row);
    classOf.set(i, row.classId);
    classStats.set(row.classId, { minSimilarity: row.minSimilarity, maxSimilarity: row.maxSimilarity, cloneType: row.cloneType });
    // a repository's class is connected already: chaining its members keeps it in one component
    if (previousClass === row.classId) edges.push({ a: previousNode, b: i, similarity: row.maxSimilarity, cloneType: row.cloneType });
    previousClass = row.classId;
    previousNode = i;
  }
  const facts = new Map((await memberFacts(tx, keys)).map((f) => [keyOf(f), f]));
  const componentOf = new Int32Array(keys.length).fill(-1);
  const components = cloneClasses(keys.length, edges);
  components.forEach((members, c) => members.forEach((i) => (componentOf[i] = c)));

  const classes: CrossClassToStore[] = components.map((members) => {
    const rows = members
      .map((i) => ({ i, fact: facts.get(keyOf(keys[i]))! }))
      .sort((x, y) => x.fact.repositoryName.localeCompare(y.fact.repositoryName) || x.fact.path.localeCompare(y.fact.path) || x.fact.startLine - y.fact.startLine);
    const languages = new Map<string, number>();
    for (const { fact } of rows) languages.set(fact.language, (languages.get(fact.language) ?? 0) + 1);
    return {
      size: rows.length,
      tokens: rows.reduce((sum, r) => sum + r.fact.tokens, 0),
      repositoryCount: new Set(rows.map((r) => r.fact.repositoryId)).size,
      minSimilarity: Infinity,
      maxSimilarity: -Infinity,
      cloneType: 1,
      // the most common language among the members (a tie: the first by name)
      language: [...languages].sort((x, y) => y[1] - x[1] || x[0].localeCompare(y[0]))[0][0],
      members: rows.map(({ i, fact }) => ({ ...keys[i], snapshotId: fact.snapshotId, classId: classOf.get(i) ?? null })),
    };
  });
  const widen = (c: CrossClassToStore, s: { minSimilarity: number; maxSimilarity: number; cloneType: number }) => {
    c.minSimilarity = Math.min(c.minSimilarity, s.minSimilarity);
    c.maxSimilarity = Math.max(c.maxSimilarity, s.maxSimilarity);
    c.cloneType = Math.max(c.cloneType, s.cloneType);
  };
  for (const p of pairs) widen(classes[componentOf[index.get(keyOf(p))!]], { minSimilarity: p.similarity, maxSimilarity: p.similarity, cloneType: p.cloneType });
  for (const [i, classId] of classOf) if (componentOf[i] >= 0) widen(classes[componentOf[i]], classStats.get(classId)!);
  // largest first, so the stored order is a sensible default
  const ordered = classes.filter((c) => c.repositoryCount > 1).sort((x, y) => y.tokens - x.tokens || y.size - x.size);
  await replaceCrossClasses(tx, organisationId, ordered);
  return ordered.length;
}
