/**
 * The length-filter joins: every pair whose sizes pass t·|x| ≤ |y| ≤ |x|/t is verified by a
 * merge. The step between brute force and the prefix filter, kept for the tests and the benchmark.
 */
import { bySize, selfPair } from './join-helpers';
import { minOverlap, overlapAtLeast, reaches, sizeBounds, type Threshold } from './threshold';
import type { JoinStats, SimilarPair } from './types';

/** Self-join by the length filter alone, in size order. */
export function selfJoinByLength(sets: readonly Int32Array[], t: Threshold, stats?: JoinStats): SimilarPair[] {
  const order = bySize(sets);
  const pairs: SimilarPair[] = [];
  let candidates = 0;
  let first = 0; // first processed set whose size reaches the current lower bound (monotone)
  for (let k = 0; k < order.length; k++) {
    const x = sets[order[k]];
    const lower = sizeBounds(t, x.length)[0];
    while (sets[order[first]].length < lower) first++;
    for (let m = first; m < k; m++) {
      const y = sets[order[m]];
      candidates++;
      const overlap = overlapAtLeast(x, y, minOverlap(t, x.length, y.length));
      if (overlap >= 0 && reaches(t, x.length, y.length, overlap)) pairs.push(selfPair(order[k], order[m], overlap));
    }
  }
  if (stats) {
    stats.candidates += candidates;
    stats.verified += candidates;
  }
  return pairs;
}

/** Join against an index by the length filter alone: each probe meets the indexed sets in its size window. */
export function joinAgainstByLength(
  probe: readonly Int32Array[],
  indexed: readonly Int32Array[],
  t: Threshold,
  stats?: JoinStats,
): SimilarPair[] {
  const order = bySize(indexed);
  const sizes = new Int32Array(order.length);
  for (let m = 0; m < order.length; m++) sizes[m] = indexed[order[m]].length;
  const pairs: SimilarPair[] = [];
  let candidates = 0;
  for (let a = 0; a < probe.length; a++) {
    const x = probe[a];
    if (x.length === 0) continue;
    const [lower, upper] = sizeBounds(t, x.length);
    let m = 0;
    for (let hi = sizes.length; m < hi; ) {
      const mid = (m + hi) >>> 1;
      if (sizes[mid] < lower) m = mid + 1;
      else hi = mid;
    }
    for (; m < sizes.length && sizes[m] <= upper; m++) {
      const y = indexed[order[m]];
      candidates++;
      const overlap = overlapAtLeast(x, y, minOverlap(t, x.length, y.length));
      if (overlap >= 0 && reaches(t, x.length, y.length, overlap)) pairs.push({ a, b: order[m], overlap });
    }
  }
  if (stats) {
    stats.candidates += candidates;
    stats.verified += candidates;
  }
  return pairs;
}
