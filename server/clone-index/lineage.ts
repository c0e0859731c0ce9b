/**
 * Class lineage: which group of copies a snapshot's clone class continues. A lineage follows one
 * group of copies from release to release (each snapshot has its own class rows); tasks, waivers and
 * comments point at the lineage. Pure: no I/O.
 */

/** A class of the previous ready snapshot: its lineage and its members' keys (see fragmentKey). */
export interface LineageClass {
  lineageId: number;
  members: string[];
}

/** What a current class gets: the lineage it continues, or 'new' for a lineage that starts with it. */
export type LineageAssignment = number | 'new';

/**
 * Assigns each current class (its members' fragment keys, as compare.ts matches members across
 * snapshots: path, name, occurrence — a member whose code changed keeps its key) a lineage of the
 * previous snapshot's classes, or 'new'.
 *
 * The rule: the previous lineages are taken oldest first (smallest id, which is also the earliest
 * first snapshot, as ids are handed out in load order). Each goes to the current class, not already
 * given a lineage, that holds most of its members; ties go to the larger class, then to the class
 * whose smallest member key sorts first (UTF-16 code-unit order). A lineage no untaken class shares a
 * member with ends here. Every class left without a lineage starts a new one. So when two lineages
 * merge into one class the class keeps the older one, and when a lineage splits the part with most
 * of its members keeps it while the other parts start new lineages (or continue another lineage they
 * hold members of).
 *
 * Invariant: every lineage id goes to at most one class; a class that gets lineage L shares at least
 * one member with L's previous class; the result depends only on the sets of members, not on the
 * order of the classes or of their members. Classes of one snapshot are disjoint (they are the
 * components of its clone pairs); should a key appear in two previous classes, it counts for the
 * older lineage.
 *
 * @example
 * assignLineages([{ lineageId: 7, members: ['a', 'b', 'c'] }], [['a', 'b'], ['c', 'd'], ['e']])
 * //=> [7, 'new', 'new']   (split: the part holding two of the three members keeps lineage 7)
 */
export function assignLineages(previous: readonly LineageClass[], current: readonly (readonly string[])[]): LineageAssignment[] {
  const lineageOf = new Map<string, number>();
  for (const c of previous) {
    for (const key of c.members) {
      const known = lineageOf.get(key);
      if (known === undefined || c.lineageId < known) lineageOf.set(key, c.lineageId);
    }
  }
  // per lineage: the current classes holding its members, with how many each holds
  const holders = new Map<number, Map<number, number>>();
  current.forEach((members, index) => {
    for (const key of new Set(members)) {
      const lineage = lineageOf.get(key);
      if (lineage === undefined) continue;
      const counts = holders.get(lineage) ?? new Map<number, number>();
      counts.set(index, (counts.get(index) ?? 0) + 1);
      holders.set(lineage, counts);
    }
  });
  const size = current.map((members) => new Set(members).size);
  const smallestKey = current.map((members) => members.reduce<string | undefined>((min, k) => (min === undefined || k < min ? k : min), undefined) ?? '');
  const result: LineageAssignment[] = current.map(() => 'new');
  const taken = new Set<number>();
  for (const lineage of [...holders.keys()].sort((a, b) => a - b)) {
    let best = -1;
    let bestShared = 0;
    for (const [index, shared] of holders.get(lineage)!) {
      if (taken.has(index)) continue;
      if (best < 0 || isBetter(shared, index, bestShared, best)) {
        best = index;
        bestShared = shared;
      }
    }
    if (best < 0) continue;
    taken.add(best);
    result[best] = lineage;
  }
  return result;

  function isBetter(shared: number, index: number, bestShared: number, best: number): boolean {
    if (shared !== bestShared) return shared > bestShared;
    if (size[index] !== size[best]) return size[index] > size[best];
    return smallestKey[index] < smallestKey[best];
  }
}
