import { bruteJoinAgainst, bruteSelfJoin } from './brute';
import { joinAgainstByPrefix } from './join-against';
import { joinAgainstByLength, selfJoinByLength } from './length-join';
import { selfJoinByPrefix } from './self-join';
import type { Threshold } from './threshold';
import type { JoinOptions, SimilarPair } from './types';

export type { JoinMethod, JoinOptions, JoinProfile, JoinStats, SimilarPair } from './types';
export { JOIN_METHODS, newJoinStats } from './types';
export { jaccard } from './similarity';

/**
 * The exact similarity join over sets of ranks (ascending in the global rarest-first order).
 *
 * Invariant: for every method the result equals the brute-force pairs exactly; every bound comes
 * from threshold.ts (integer p/q arithmetic), never from a floating point comparison with t.
 *
 * Methods (each adds one filter to the one before):
 * - length:   every pair whose sizes pass the length filter t·|x| ≤ |y| ≤ |x|/t;
 * - prefix:   only pairs that share an id in their prefixes, found through an inverted index
 *             of prefixes (one counter per indexed set, reused, with a touched list);
 * - position: drops a candidate as soon as the ids left after a shared one cannot bring the
 *             overlap up to the required α;
 * - bitmap:   position plus the bitmap filter (bitmap.ts), which drops most pairs that share a
 *             rare id by chance before their state is touched (on the benchmark's million sets,
 *             28.4M verified pairs → 6.7M). Self-join only; joinAgainst runs position for it;
 * - auto:     the fastest exact one for the collection: bitmap from BITMAP_MIN_IDS ids on,
 *             position below (see server/bench/join.ts).
 * Survivors are verified by merging the two arrays from just after the last shared prefix id,
 * stopping as soon as α is out of reach. The self-join works on the sets packed into one
 * Int32Array (packed.ts). Files: length-join.ts, self-join.ts (packed, in size order),
 * join-against.ts, with the list entry layout in entry-layout.ts.
 */

/**
 * Every pair a < b of `sets` with Jaccard similarity ≥ t, sorted by (a, b). Empty sets pair
 * with nothing.
 *
 * @example
 * selfJoin([Int32Array.of(0, 1, 2, 3, 4), Int32Array.of(0, 1, 2, 3, 4, 5), Int32Array.of(6)], parseThreshold('0.8'))
 * // [{ a: 0, b: 1, overlap: 5 }]  (5/6 ≥ 0.8)
 * @throws when a set is not ascending and duplicate-free, or holds a negative id
 */
export function selfJoin(sets: readonly Int32Array[], t: Threshold, options: JoinOptions = {}): SimilarPair[] {
  checkSets(sets, 'set');
  const stats = options.stats;
  const method = options.method ?? 'auto';
  let pairs: SimilarPair[];
  switch (method) {
    case 'brute':
      return bruteSelfJoin(sets, t, stats);
    case 'length':
      pairs = selfJoinByLength(sets, t, stats);
      break;
    case 'prefix':
      pairs = selfJoinByPrefix(sets, t, false, false, stats, options.profile);
      break;
    case 'position':
    case 'bitmap':
    case 'auto': {
      const bitmap = method === 'bitmap' || (method === 'auto' && totalIds(sets) >= BITMAP_MIN_IDS);
      pairs = selfJoinByPrefix(sets, t, true, bitmap, stats, options.profile);
      break;
    }
    default:
      throw new Error(`unknown method "${String(method)}"`);
  }
  if (stats) stats.results += pairs.length;
  return sortPairs(pairs);
}

/**
 * Every pair (a in probe, b in indexed) with Jaccard similarity ≥ t, sorted by (a, b): what
 * incremental loading needs (new sets against the collection already indexed). Both sides must
 * be ranked in the same global order.
 *
 * @example
 * joinAgainst([Int32Array.of(0, 1, 2, 3)], [Int32Array.of(5), Int32Array.of(0, 1, 2, 3, 4)], parseThreshold('0.8'))
 * // [{ a: 0, b: 1, overlap: 4 }]
 * @throws when a set is not ascending and duplicate-free, or holds a negative id
 */
export function joinAgainst(
  probe: readonly Int32Array[],
  indexed: readonly Int32Array[],
  t: Threshold,
  options: JoinOptions = {},
): SimilarPair[] {
  checkSets(probe, 'probe set');
  checkSets(indexed, 'indexed set');
  const stats = options.stats;
  const method = options.method ?? 'auto';
  let pairs: SimilarPair[];
  switch (method) {
    case 'brute':
      return bruteJoinAgainst(probe, indexed, t, stats);
    case 'length':
      pairs = joinAgainstByLength(probe, indexed, t, stats);
      break;
    case 'prefix':
      pairs = joinAgainstByPrefix(probe, indexed, t, false, stats, options.profile);
      break;
    case 'position':
    case 'bitmap':
    case 'auto':
      pairs = joinAgainstByPrefix(probe, indexed, t, true, stats, options.profile);
      break;
    default:
      throw new Error(`unknown method "${String(method)}"`);
  }
  if (stats) stats.results += pairs.length;
  return sortPairs(pairs);
}

/**
 * From how many ids in all (the sum of the set sizes) 'auto' uses the bitmap filter. Below it
 * the candidates' ids mostly sit in the cache, a merge that fails is cheap, and the filter's
 * per-entry cost does not pay back; `npm run bench:join` measures where it starts to pay (the
 * figures are in the README's Measured section).
 */
export const BITMAP_MIN_IDS = 50_000_000;

function totalIds(sets: readonly Int32Array[]): number {
  let total = 0;
  for (const set of sets) total += set.length;
  return total;
}

/** Largest id over all sets (−1 when there is none), after checking each set's shape. */
function checkSets(sets: readonly Int32Array[], what: string): number {
  let max = -1;
  for (let s = 0; s < sets.length; s++) {
    const set = sets[s];
    if (!(set instanceof Int32Array)) throw new Error(`${what} ${s} is not an Int32Array`);
    if (set.length > 0 && set[0] < 0) throw new Error(`${what} ${s} holds a negative id (${set[0]})`);
    for (let i = 1; i < set.length; i++) {
      if (set[i] <= set[i - 1]) {
        throw new Error(`${what} ${s} is not ascending and duplicate-free at position ${i} (${set[i - 1]}, ${set[i]})`);
      }
    }
    if (set.length > 0 && set[set.length - 1] > max) max = set[set.length - 1];
  }
  return max;
}

function sortPairs(pairs: SimilarPair[]): SimilarPair[] {
  return pairs.sort((x, y) => x.a - y.a || x.b - y.b);
}
