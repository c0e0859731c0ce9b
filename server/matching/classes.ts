/**
 * From clone pairs to clone classes (connected components), the clone ratio and the clone type.
 * Pure functions over plain data; fragments are numbered 0..count−1.
 */

/** The two hashes a clone type is decided by (a Fragment has both). */
export interface FragmentHashes {
  rawHash: string;
  normalizedHash: string;
}

/**
 * Clone classes: the connected components of the pair graph with at least two members (a
 * fragment in no pair is in no class). Each class is sorted ascending; classes are sorted by size
 * (largest first), then by first member.
 *
 * @example cloneClasses(5, [{ a: 3, b: 1 }, { a: 1, b: 4 }]) // [[1, 3, 4]]
 * @throws when a pair names a fragment outside 0..count−1
 */
export function cloneClasses(count: number, pairs: readonly { a: number; b: number }[]): number[][] {
  const parent = new Int32Array(count);
  for (let i = 0; i < count; i++) parent[i] = i;
  const find = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]]; // path halving keeps the trees flat
      i = parent[i];
    }
    return i;
  };
  const inPair = new Uint8Array(count);
  for (const { a, b } of pairs) {
    checkFragment(a, count);
    checkFragment(b, count);
    inPair[a] = inPair[b] = 1;
    const ra = find(a);
    const rb = find(b);
    // The smaller root wins, so a class's root is its first member and no rank array is needed.
    if (ra < rb) parent[rb] = ra;
    else if (rb < ra) parent[ra] = rb;
  }
  const members = new Map<number, number[]>();
  for (let i = 0; i < count; i++) {
    if (!inPair[i]) continue;
    const root = find(i);
    let list = members.get(root);
    if (!list) members.set(root, (list = []));
    list.push(i); // i ascends, so each class comes out sorted
  }
  return [...members.values()].sort((x, y) => y.length - x.length || x[0] - y[0]);
}

function checkFragment(i: number, count: number): void {
  if (!Number.isInteger(i) || i < 0 || i >= count) throw new Error(`pair names fragment ${i}, outside 0..${count - 1}`);
}

/** Token counts behind a clone ratio, kept as integers so a budget can be compared exactly. */
export interface ClonedTokens {
  /** Tokens of fragments that lie in at least one clone pair. */
  cloned: number;
  /** Tokens of all fragments. */
  total: number;
}

/**
 * Tokens in at least one clone pair and the total, each fragment counted once.
 *
 * @example clonedTokens([100, 50, 30], [{ a: 0, b: 2 }]) // { cloned: 130, total: 180 }
 */
export function clonedTokens(tokens: ArrayLike<number>, pairs: readonly { a: number; b: number }[]): ClonedTokens {
  const inPair = new Uint8Array(tokens.length);
  for (const { a, b } of pairs) {
    checkFragment(a, tokens.length);
    checkFragment(b, tokens.length);
    inPair[a] = inPair[b] = 1;
  }
  let cloned = 0;
  let total = 0;
  for (let i = 0; i < tokens.length; i++) {
    total += tokens[i];
    if (inPair[i]) cloned += tokens[i];
  }
  return { cloned, total };
}

/**
 * Clone ratio: share of the fragments' tokens (sum of Fragment.tokens) that lie in at least one
 * clone pair; 0 when there are no tokens.
 *
 * @example cloneRatio([100, 50, 30], [{ a: 0, b: 2 }]) // 130 / 180 ≈ 0.722
 */
export function cloneRatio(tokens: ArrayLike<number>, pairs: readonly { a: number; b: number }[]): number {
  const { cloned, total } = clonedTokens(tokens, pairs);
  return total === 0 ? 0 : cloned / total;
}

/**
 * Clone type of a pair: 1 identical raw token streams, 2 identical normalised streams, 3 similar.
 *
 * @example cloneType({ rawHash: 'r1', normalizedHash: 'n' }, { rawHash: 'r2', normalizedHash: 'n' }) // 2
 */
export function cloneType(a: FragmentHashes, b: FragmentHashes): 1 | 2 | 3 {
  if (a.rawHash === b.rawHash) return 1;
  if (a.normalizedHash === b.normalizedHash) return 2;
  return 3;
}
