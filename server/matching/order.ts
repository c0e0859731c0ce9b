/**
 * The global token order of the join: rarest first (ascending document frequency), ties by id.
 * Any total order gives the same pairs; rarest-first puts rare tokens in the prefixes, so the
 * inverted lists the join walks are short. Every set that is compared with another must be
 * ranked in the same order.
 */

/** Sets re-written as ascending, duplicate-free arrays of ranks, and the token → rank map. */
export interface RankedSets<Token> {
  /** One per input set, same index: ascending ranks, no duplicates. */
  ranked: Int32Array[];
  /** Token → rank (0 = the rarest token). */
  dictionary: Map<Token, number>;
}

/**
 * Ranks shingle sets: ids by ascending document frequency, ties by first-seen order. Repeats of
 * a shingle inside one set count once.
 *
 * @example
 * rankShingles([['a', 'b'], ['b', 'c']])
 * // dictionary: a → 0, c → 1, b → 2 (a and c occur once; a was seen first)
 * // ranked: [Int32Array [0, 2], Int32Array [1, 2]]
 */
export function rankShingles(sets: readonly (readonly string[])[]): RankedSets<string> {
  const firstSeen = new Map<string, number>();
  const dense: Int32Array[] = new Array(sets.length);
  for (let s = 0; s < sets.length; s++) {
    const set = sets[s];
    const ids = new Int32Array(set.length);
    for (let i = 0; i < set.length; i++) {
      let id = firstSeen.get(set[i]);
      if (id === undefined) {
        id = firstSeen.size;
        firstSeen.set(set[i], id);
      }
      ids[i] = id;
    }
    dense[s] = ids;
  }
  const { ranked, rankOf } = rankDense(dense, firstSeen.size);
  const dictionary = new Map<string, number>();
  for (const [shingle, id] of firstSeen) dictionary.set(shingle, rankOf[id]);
  return { ranked, dictionary };
}

/**
 * Ranks sets of non-negative integer tokens: ids by ascending document frequency, ties by the
 * token's value. Repeats inside one set count once. Used by `doublet join` and the benchmark.
 *
 * @example
 * rankIntegerSets([[7, 3, 3], [3, 9]])
 * // document frequencies: 3 → 2, 7 → 1, 9 → 1, so 7 → 0, 9 → 1, 3 → 2
 * // ranked: [Int32Array [0, 2], Int32Array [1, 2]]
 * @throws when a token is not an integer in [0, 2^31)
 */
export function rankIntegerSets(sets: readonly ArrayLike<number>[]): RankedSets<number> {
  let max = -1;
  for (let s = 0; s < sets.length; s++) {
    const set = sets[s];
    for (let i = 0; i < set.length; i++) {
      const token = set[i];
      if (!Number.isInteger(token) || token < 0 || token > 0x7fffffff) {
        throw new Error(`set ${s}: token ${token} is not an integer in [0, 2^31)`);
      }
      if (token > max) max = token;
    }
  }
  // Tokens up to 2^25 index a typed array directly (fast path for the benchmark's million sets);
  // larger ones are first compressed to dense ids in value order, which keeps "ties by value".
  let denseOf: (token: number) => number;
  let tokenOf: (id: number) => number;
  let vocabulary: number;
  if (max < 1 << 25) {
    denseOf = (token) => token;
    tokenOf = (id) => id;
    vocabulary = max + 1;
  } else {
    const distinct = new Set<number>();
    for (const set of sets) for (let i = 0; i < set.length; i++) distinct.add(set[i]);
    const values = Float64Array.from(distinct).sort();
    const index = new Map<number, number>();
    values.forEach((value, id) => index.set(value, id));
    denseOf = (token) => index.get(token)!;
    tokenOf = (id) => values[id];
    vocabulary = values.length;
  }
  const dense: Int32Array[] = new Array(sets.length);
  for (let s = 0; s < sets.length; s++) {
    const set = sets[s];
    const ids = new Int32Array(set.length);
    for (let i = 0; i < set.length; i++) ids[i] = denseOf(set[i]);
    dense[s] = ids;
  }
  const { ranked, rankOf, frequency } = rankDense(dense, vocabulary);
  const dictionary = new Map<number, number>();
  for (let id = 0; id < vocabulary; id++) if (frequency[id] > 0) dictionary.set(tokenOf(id), rankOf[id]);
  return { ranked, dictionary };
}

/**
 * The shared core: dense ids in [0, vocabulary) → ranks by (document frequency, id), via a
 * counting sort (stable, so ties keep id order). Sets are deduplicated with a stamp array so
 * that a repeat does not raise the document frequency.
 */
function rankDense(dense: Int32Array[], vocabulary: number) {
  const frequency = new Int32Array(vocabulary);
  const stamp = new Int32Array(vocabulary).fill(-1);
  for (let s = 0; s < dense.length; s++) {
    const ids = dense[s];
    for (let i = 0; i < ids.length; i++) {
      const id = ids[i];
      if (stamp[id] !== s) {
        stamp[id] = s;
        frequency[id]++;
      }
    }
  }
  let maxFrequency = 0;
  for (let id = 0; id < vocabulary; id++) if (frequency[id] > maxFrequency) maxFrequency = frequency[id];
  // Counting sort by frequency (stable: ties keep id order). Ids in no set (frequency 0) get no
  // rank, so the ranks of the tokens in use are exactly 0..used−1.
  const bucketStart = new Int32Array(maxFrequency + 2);
  for (let id = 0; id < vocabulary; id++) if (frequency[id] > 0) bucketStart[frequency[id] + 1]++;
  for (let f = 1; f < bucketStart.length; f++) bucketStart[f] += bucketStart[f - 1];
  const rankOf = new Int32Array(vocabulary).fill(-1);
  for (let id = 0; id < vocabulary; id++) if (frequency[id] > 0) rankOf[id] = bucketStart[frequency[id]]++;

  const ranked: Int32Array[] = new Array(dense.length);
  for (let s = 0; s < dense.length; s++) {
    const ids = dense[s];
    const out = new Int32Array(ids.length);
    for (let i = 0; i < ids.length; i++) out[i] = rankOf[ids[i]];
    out.sort();
    let unique = 0;
    for (let i = 0; i < out.length; i++) if (i === 0 || out[i] !== out[i - 1]) out[unique++] = out[i];
    ranked[s] = unique === out.length ? out : out.slice(0, unique);
  }
  return { ranked, rankOf, frequency };
}
