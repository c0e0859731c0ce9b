/**
 * Matching clone classes across two snapshots of one repository through their members.
 * A fragment is known across snapshots by its file path and qualified name (the n-th fragment of
 * that name in the file), and it has changed when its raw token hash differs.
 */
import type { ClassStatus } from '../../shared/api/snapshots';

/** A fragment as the comparison needs it: who it is across snapshots, and its raw hash. */
export interface FragmentIdentity {
  path: string;
  name: string;
  /** occurrence of this name within the file, 0-based, to tell apart same-named fragments */
  occurrence: number;
  rawHash: string;
}

/** The key a fragment is known by across snapshots. */
export function fragmentKey(m: Pick<FragmentIdentity, 'path' | 'name' | 'occurrence'>): string {
  return `${m.path}\u0000${m.name}\u0000${m.occurrence}`;
}

/** The outcome for one current class. */
export interface ClassComparison {
  status: ClassStatus;
  /** index of the matched previous class, or −1 */
  previous: number;
  /** per member: whether its code changed since the previous snapshot */
  changed: boolean[];
}

/**
 * Compares current classes with the previous snapshot's classes.
 * `previousFragments` maps member keys of every fragment of the previous snapshot to its raw hash,
 * so a member that was in no class before still tells whether its code changed.
 * Status, first that applies: new (no member was in a previous class), drifted (some members that
 * existed before changed and others did not), grown / shrunk (more / fewer members than the matched
 * class), edited (every member that existed before changed), unchanged.
 * Returns the comparisons and the indexes of previous classes that no current class continues
 * (gone; a class merged into a larger one is gone too, its members now count in the larger one).
 */
export function compareClasses(
  current: FragmentIdentity[][],
  previous: FragmentIdentity[][],
  previousFragments: Map<string, string>,
): { classes: ClassComparison[]; gone: number[] } {
  const previousClassOf = new Map<string, number>();
  previous.forEach((members, index) => members.forEach((m) => previousClassOf.set(fragmentKey(m), index)));
  const matched = new Set<number>();
  const classes = current.map((members): ClassComparison => {
    const votes = new Map<number, number>();
    const changed: boolean[] = [];
    let existed = 0;
    let changedCount = 0;
    for (const m of members) {
      const key = fragmentKey(m);
      const before = previousFragments.get(key);
      const isChanged = before !== undefined && before !== m.rawHash;
      changed.push(isChanged);
      if (before !== undefined) existed++;
      if (isChanged) changedCount++;
      const cls = previousClassOf.get(key);
      if (cls !== undefined) votes.set(cls, (votes.get(cls) ?? 0) + 1);
    }
    if (votes.size === 0) return { status: 'new', previous: -1, changed };
    // the previous class sharing most members (ties: the earlier one) is this class's ancestor
    const [prev] = [...votes.entries()].sort((x, y) => y[1] - x[1] || x[0] - y[0])[0];
    matched.add(prev);
    let status: ClassStatus;
    if (changedCount > 0 && changedCount < existed) status = 'drifted';
    else if (members.length > previous[prev].length) status = 'grown';
    else if (members.length < previous[prev].length) status = 'shrunk';
    else if (changedCount > 0) status = 'edited';
    else status = 'unchanged';
    return { status, previous: prev, changed };
  });
  const gone = previous.map((_, i) => i).filter((i) => !matched.has(i));
  return { classes, gone };
}

/** Numbers same-named fragments within a file in order (the `occurrence` of FragmentIdentity). */
export function occurrences(items: { path: string; name: string }[]): number[] {
  const seen = new Map<string, number>();
  return items.map((x) => {
    const key = `${x.path}\u0000${x.name}`;
    const n = seen.get(key) ?? 0;
    seen.set(key, n + 1);
    return n;
  });
}
