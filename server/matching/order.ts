/**
 * The global token order of the join: rarest first (ascending document frequency), ties by id.
 * Any total order gives the same pairs; rarest-first puts rare tokens in the prefixes, so the
 * inverted lists the join walks are short. Every set that is compared with another must be
 * ranked in the same order.
 */

import type { FlatSets } from './set-bytes';

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
 * token's value. Repeats inside one set count once. Used by the benchmark and the tests; the
 * command line reads its input as FlatSets and calls rankFlatIntegerSets directly.
 *
 * @example
 * rankIntegerSets([[7, 3, 3], [3, 9]])
 * // document frequencies: 3 → 2, 7 → 1, 9 → 1, so 7 → 0, 9 → 1, 3 → 2
 * // ranked: [Int32Array [0, 2], Int32Array [1, 2]]
 * @throws when a token is not an integer in [0, 2^31)
 */
export function rankIntegerSets(sets: readonly ArrayLike<number>[]): RankedSets<number> {
  let total = 0;
  for (let s = 0; s < sets.length; s++) {
    const set = sets[s];
    for (let i = 0; i < set.length; i++) {
      const token = set[i];
      if (!Number.isInteger(token) || token < 0 || token > 0x7fffffff) {
        throw new Error(`set ${s}: token ${token} is not an integer in [0, 2^31)`);
      }
    }
    total += set.length;
  }
  const tokens = new Int32Array(total);
  const offsets = new Int32Array(sets.length + 1);
  for (let s = 0, at = 0; s < sets.length; s++) {
    tokens.set(sets[s], at);
    at += sets[s].length;
    offsets[s + 1] = at;
  }
  const { ranked, tokenOfRank } = rankFlatIntegerSets({ tokens, offsets });
  // in token value order, as the dictionary has always been built
  const byValue = Int32Array.from(tokenOfRank.keys()).sort((a, b) => tokenOfRank[a] - tokenOfRank[b]);
  const dictionary = new Map<number, number>();
  for (const rank of byValue) dictionary.set(tokenOfRank[rank], rank);
  return { ranked, dictionary };
}

/** Integer sets ranked: the sets, and the token each rank stands for. */
export interface FlatRanking {
  /** One per input set, same index: ascending ranks, no duplicates (views into one buffer). */
  ranked: Int32Array[];
  /** tokenOfRank[r] is the token ranked r; ranks are exactly 0..length−1. */
  tokenOfRank: Int32Array;
}

/** Tokens up to this bound index typed arrays directly (when the input is not far sparser). */
const DIRECT_TOKENS = 1 << 25;

/**
 * rankIntegerSets over sets already in one flat array (set-bytes.ts), typed arrays throughout:
 * no Map, no per-token object. Tokens must be in [0, 2^31) (parseSetBytes guarantees it).
 *
 * @example
 * rankFlatIntegerSets({ tokens: Int32Array.of(7, 3, 3, 3, 9), offsets: Int32Array.of(0, 3, 5) })
 * // ranked: [Int32Array [0, 2], Int32Array [1, 2]], tokenOfRank: Int32Array [7, 9, 3]
 */
export function rankFlatIntegerSets({ tokens, offsets }: FlatSets): FlatRanking {
  let max = -1;
  for (let i = 0; i < tokens.length; i++) if (tokens[i] > max) max = tokens[i];
  // Small tokens are their own dense ids; otherwise ids are the tokens' places among the distinct
  // values (value order, which keeps "ties by value"), found by binary search.
  let dense = tokens;
  let values: Int32Array | undefined;
  let vocabulary = max + 1;
  if (max >= DIRECT_TOKENS || max >= 8 * tokens.length + 1024) {
    const sorted = tokens.slice().sort();
    let distinct = 0;
    for (let i = 0; i < sorted.length; i++) if (i === 0 || sorted[i] !== sorted[i - 1]) sorted[distinct++] = sorted[i];
    values = sorted.subarray(0, distinct);
    vocabulary = distinct;
    dense = new Int32Array(tokens.length);
    for (let i = 0; i < tokens.length; i++) {
      let lo = 0;
      let hi = distinct - 1;
      const token = tokens[i];
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (values[mid] < token) lo = mid + 1;
        else hi = mid;
      }
      dense[i] = lo;
    }
  }
  const { rankOf, used } = rankOrder(dense, offsets, vocabulary);
  const tokenOfRank = new Int32Array(used);
  for (let id = 0; id < vocabulary; id++) if (rankOf[id] >= 0) tokenOfRank[rankOf[id]] = values ? values[id] : id;

  const count = offsets.length - 1;
  const out = new Int32Array(tokens.length);
  const ranked: Int32Array[] = new Array(count);
  for (let s = 0; s < count; s++) {
    const from = offsets[s];
    const to = offsets[s + 1];
    for (let i = from; i < to; i++) out[i] = rankOf[dense[i]];
    out.subarray(from, to).sort();
    let unique = from;
    for (let i = from; i < to; i++) if (i === from || out[i] !== out[i - 1]) out[unique++] = out[i];
    ranked[s] = out.subarray(from, unique);
  }
  return { ranked, tokenOfRank };
}

/**
 * Ranks of dense ids in [0, vocabulary) by (document frequency, id), via a counting sort (stable,
 * so ties keep id order); -1 for an id in no set. A repeat inside one set is counted once (stamp).
 */
function rankOrder(dense: Int32Array, offsets: Int32Array, vocabulary: number) {
  const frequency = new Int32Array(vocabulary);
  const stamp = new Int32Array(vocabulary).fill(-1);
  let maxFrequency = 0;
  for (let s = 0; s + 1 < offsets.length; s++) {
    for (let i = offsets[s]; i < offsets[s + 1]; i++) {
      const id = dense[i];
      if (stamp[id] !== s) {
        stamp[id] = s;
        if (++frequency[id] > maxFrequency) maxFrequency = frequency[id];
      }
    }
  }
  const bucketStart = new Int32Array(maxFrequency + 2);
  let used = 0;
  for (let id = 0; id < vocabulary; id++) {
    if (frequency[id] > 0) {
      bucketStart[frequency[id] + 1]++;
      used++;
    }
  }
  for (let f = 1; f < bucketStart.length; f++) bucketStart[f] += bucketStart[f - 1];
  const rankOf = new Int32Array(vocabulary).fill(-1);
  for (let id = 0; id < vocabulary; id++) if (frequency[id] > 0) rankOf[id] = bucketStart[frequency[id]]++;
  return { rankOf, used };
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
