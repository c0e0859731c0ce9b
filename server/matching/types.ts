/** Types shared by the join, the oracle and their callers. */

/**
 * The join methods, from the oracle to the most filtered; all return the same pairs. 'bitmap'
 * adds the bitmap filter to 'position' (self-join only; joinAgainst treats it as 'position');
 * 'auto' picks the fastest for the collection's size. "Method" is the one word for this choice
 * in code, on the command line (`doublet join --method`) and in the benchmark (`--methods`).
 */
export type JoinMethod = 'brute' | 'length' | 'prefix' | 'position' | 'bitmap' | 'auto';

/** Every method, in order of increasing filtering (for `--method` and the benchmark). */
export const JOIN_METHODS: readonly JoinMethod[] = ['brute', 'length', 'prefix', 'position', 'bitmap', 'auto'];

/**
 * A pair of sets that reaches the threshold. Self-join: a < b, both index the input. joinAgainst:
 * a indexes the probe sets, b the indexed sets. `overlap` is |A ∩ B| (exact).
 */
export interface SimilarPair {
  a: number;
  b: number;
  overlap: number;
}

/**
 * What a join did, for the command line and the benchmark. The join ADDS to these counters, so
 * one object can sum several batches.
 */
export interface JoinStats {
  /** Distinct set pairs the method looked at (brute: every pair; length: every pair in the size window). */
  candidates: number;
  /** Pairs whose overlap was computed by merging (after every filter). */
  verified: number;
  /** Pairs at or above the threshold. */
  results: number;
}

/** Options of `selfJoin` and `joinAgainst`. */
export interface JoinOptions {
  /** Default 'auto' (the fastest exact method). */
  method?: JoinMethod;
  /** Counters to add this join's figures to. */
  stats?: JoinStats;
  /** Where the time went (prefix and position methods only); costs two clock reads per set. */
  profile?: JoinProfile;
}

/** Milliseconds per phase, added to like JoinStats. */
export interface JoinProfile {
  /** Building the inverted index of prefixes (self-join: packing the sets, list offsets, appending each set after its probe). */
  indexMs: number;
  /** Walking the prefix lists: counting, length and position filters. */
  probeMs: number;
  /** Merging the survivors. */
  verifyMs: number;
}

/** Zeroed counters. */
export function newJoinStats(): JoinStats {
  return { candidates: 0, verified: 0, results: 0 };
}
