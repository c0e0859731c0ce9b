/**
 * The shingle window table: every shingle set of the token ranges inside one file, built from
 * shared per-file work. It must give exactly what shingleSet (shingles.ts) gives for the same
 * tokens; tests/analyzers/shingles.test.ts checks the two agree.
 */
import { SHINGLE_SEPARATOR, shingleSet } from './shingles';

/**
 * The repeat numbers 2..max in the string order of their decimal spelling, the order in which
 * `s#n` sort: a preorder walk of the digit tree, linear in max.
 *
 * @example repeatsInStringOrder(12) // [10, 11, 12, 2, 3, 4, 5, 6, 7, 8, 9]
 */
function repeatsInStringOrder(max: number): number[] {
  const out: number[] = [];
  const visit = (n: number): void => {
    if (n >= 2) out.push(n);
    for (let digit = 0; digit <= 9 && n * 10 + digit <= max; digit++) visit(n * 10 + digit);
  };
  for (let first = 1; first <= 9 && first <= max; first++) visit(first);
  return out;
}

/**
 * Per-file shingle machinery for the windows of k tokens inside [lo, hi). Each token form gets a
 * small integer id, each window a numeric key (exact while vocabulary^k stays below 2^53) and a
 * dense window id. A fragment's n-th repeat of a window is the string `shingle#n`, and n can be no
 * larger than the window's count in [lo, hi); so every string any fragment can produce is known
 * up front: one per window position. They are built and sorted once per file, and a fragment's
 * set is its windows' ranks, sorted as integers, mapped back to the shared strings. This keeps
 * the default string order of shingleSet while nested fragments share all the string work.
 *
 * @example new WindowTable(forms, 3, 0, forms.length).shingles(0, forms.length) // shingleSet(forms, 3)
 */
export class WindowTable {
  /** Dense window id per window position (index i - lo), or undefined when keys would be inexact. */
  private readonly windowIds: Int32Array | undefined;
  /** Start of each dense id's block in the rank table; block entry n - 1 is the n-th repeat. */
  private readonly blocks: Int32Array = new Int32Array(0);
  /** Rank (position in `sorted`) of each (dense id, repeat). */
  private readonly ranks: Int32Array = new Int32Array(0);
  /** Every shingle string of [lo, hi), in the default string order. */
  private readonly sorted: string[] = [];
  /** Per dense id: repeats seen so far in the fragment being built; all zero between calls. */
  private readonly seen: Int32Array = new Int32Array(0);

  constructor(
    private readonly forms: readonly string[],
    private readonly k: number,
    private readonly lo: number,
    hi: number,
  ) {
    const windows = hi - lo - k + 1;
    if (windows <= 0) {
      this.windowIds = undefined;
      return;
    }
    const vocabulary = new Map<string, number>();
    const ids = new Int32Array(hi - lo);
    for (let i = lo; i < hi; i++) {
      let id = vocabulary.get(forms[i]);
      if (id === undefined) {
        id = vocabulary.size;
        vocabulary.set(forms[i], id);
      }
      ids[i - lo] = id;
    }
    const base = vocabulary.size + 1;
    if (!(Math.pow(base, k) < Number.MAX_SAFE_INTEGER)) {
      this.windowIds = undefined;
      return;
    }
    const dense = new Map<number, number>();
    const windowIds = new Int32Array(windows);
    const firstAt: number[] = [];
    const counts: number[] = [];
    for (let w = 0; w < windows; w++) {
      let key = 0;
      for (let j = 0; j < k; j++) key = key * base + ids[w + j] + 1;
      let d = dense.get(key);
      if (d === undefined) {
        d = firstAt.length;
        dense.set(key, d);
        firstAt.push(w);
        counts.push(0);
      }
      counts[d]++;
      windowIds[w] = d;
    }
    const distinct = firstAt.length;
    const blocks = new Int32Array(distinct);
    const strings: string[] = new Array(windows);
    const bases: string[] = new Array(distinct);
    let at = 0;
    for (let d = 0; d < distinct; d++) {
      blocks[d] = at;
      const w = lo + firstAt[d];
      let text = forms[w];
      for (let j = 1; j < k; j++) text += SHINGLE_SEPARATOR + forms[w + j];
      bases[d] = text;
      strings[at++] = text;
      for (let n = 2; n <= counts[d]; n++) strings[at++] = `${text}#${n}`;
    }
    // All strings are distinct (tokenForm keeps `#n` and the separator out of tokens), so no
    // comparator below ever sees a tie and the order is exactly the default sort's.
    const ranks = new Int32Array(windows);
    const sorted: string[] = new Array(windows);
    const baseOrder = Array.from({ length: distinct }, (_, d) => d);
    baseOrder.sort((a, b) => (bases[a] < bases[b] ? -1 : 1));
    // Every string with prefix p sorts in one interval. So the sorted shingles fall into groups:
    // a shingle p and the shingles after it that start with p (rare: it takes a last token that
    // extends another, like `=` and `==`). A group's shingles and their repeats `s#n` fill one
    // interval of the order, and the groups keep the order of their first shingles. A group of
    // one is just `s`, then its repeats in the string order of n ("#10" < "#2"); a larger group
    // is sorted as strings. `s#n` never lands in another group: it would need `s` to end in `#`
    // and digits, which tokenForm escapes.
    let r = 0;
    const place = (u: number) => {
      ranks[u] = r;
      sorted[r++] = strings[u];
    };
    for (let g = 0; g < distinct; ) {
      const top = bases[baseOrder[g]];
      let end = g + 1;
      while (end < distinct && bases[baseOrder[end]].startsWith(top)) end++;
      if (end === g + 1) {
        const d = baseOrder[g];
        const block = blocks[d];
        const count = counts[d];
        place(block);
        const repeats = count <= 9 ? undefined : repeatsInStringOrder(count);
        for (let i = 0; i < count - 1; i++) place(block + (repeats ? repeats[i] : i + 2) - 1);
      } else {
        const members: number[] = [];
        for (let i = g; i < end; i++) {
          const d = baseOrder[i];
          for (let n = 0; n < counts[d]; n++) members.push(blocks[d] + n);
        }
        members.sort((a, b) => (strings[a] < strings[b] ? -1 : 1));
        for (const u of members) place(u);
      }
      g = end;
    }
    this.windowIds = windowIds;
    this.blocks = blocks;
    this.ranks = ranks;
    this.sorted = sorted;
    this.seen = new Int32Array(distinct);
  }

  /** The shingle set of the tokens [from, to) (inside [lo, hi)), exactly as shingleSet computes it. */
  shingles(from: number, to: number): string[] {
    const k = this.k;
    const windowIds = this.windowIds;
    if (!windowIds || to - from < k) return shingleSet(this.forms.slice(from, to), k);
    const { blocks, ranks, sorted, seen } = this;
    const first = from - this.lo;
    const count = to - from - k + 1;
    const picked = new Int32Array(count);
    for (let w = 0; w < count; w++) {
      const d = windowIds[first + w];
      picked[w] = ranks[blocks[d] + seen[d]];
      seen[d]++;
    }
    for (let w = 0; w < count; w++) seen[windowIds[first + w]] = 0;
    picked.sort();
    const out: string[] = new Array(count);
    for (let i = 0; i < count; i++) out[i] = sorted[picked[i]];
    return out;
  }
}
