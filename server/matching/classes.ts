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
  /** Source tokens inside at least one fragment that is in a clone pair, each counted once. */
  cloned: number;
  /** Source tokens inside at least one fragment, each counted once. */
  total: number;
}

/** Where a fragment's tokens lie: its file (any key) and its [tokenStart, tokenEnd) range there. */
export interface TokenSpan {
  file: string | number;
  tokenStart: number;
  tokenEnd: number;
}

/**
 * Source tokens in at least one clone pair, and in any fragment, each token counted once by its
 * position: a nested function's tokens also lie in the function around it, so summing fragment
 * sizes would count them twice. The union of the ranges is taken per file.
 *
 * @example
 * // an outer function (tokens 0..100) holding a nested one (20..50), and a copy of the nested one elsewhere
 * clonedTokens([{ file: 'a', tokenStart: 0, tokenEnd: 100 }, { file: 'a', tokenStart: 20, tokenEnd: 50 },
 *   { file: 'b', tokenStart: 0, tokenEnd: 30 }], [{ a: 1, b: 2 }]) // { cloned: 60, total: 130 }
 */
export function clonedTokens(spans: readonly TokenSpan[], pairs: readonly { a: number; b: number }[]): ClonedTokens {
  const inPair = new Uint8Array(spans.length);
  for (const { a, b } of pairs) {
    checkFragment(a, spans.length);
    checkFragment(b, spans.length);
    inPair[a] = inPair[b] = 1;
  }
  return {
    cloned: coveredTokens(spans.filter((_, i) => inPair[i])),
    total: coveredTokens(spans),
  };
}

/**
 * Size of the union of the spans' ranges, per file: each token once however many spans cover it.
 *
 * @example coveredTokens([{ file: 'a', tokenStart: 0, tokenEnd: 100 }, { file: 'a', tokenStart: 20, tokenEnd: 150 }]) // 150
 */
export function coveredTokens(spans: readonly TokenSpan[]): number {
  const sorted = [...spans].sort((x, y) =>
    x.file < y.file ? -1 : x.file > y.file ? 1 : x.tokenStart - y.tokenStart,
  );
  let covered = 0;
  let file: string | number | undefined;
  let end = 0;
  for (const span of sorted) {
    if (span.file !== file) {
      file = span.file;
      end = -Infinity;
    }
    const start = Math.max(span.tokenStart, end);
    if (span.tokenEnd > start) covered += span.tokenEnd - start;
    end = Math.max(end, span.tokenEnd);
  }
  return covered;
}

/**
 * Clone ratio: share of the source tokens inside fragments that lie in at least one clone pair
 * (see clonedTokens); 0 when there are no tokens.
 *
 * @example cloneRatio([{ file: 'a', tokenStart: 0, tokenEnd: 60 }, { file: 'b', tokenStart: 0, tokenEnd: 60 }], [{ a: 0, b: 1 }]) // 1
 */
export function cloneRatio(spans: readonly TokenSpan[], pairs: readonly { a: number; b: number }[]): number {
  const { cloned, total } = clonedTokens(spans, pairs);
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
