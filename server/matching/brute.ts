import { reaches, type Threshold } from './threshold';
import type { JoinStats, SimilarPair } from './types';

/**
 * The oracle: every pair, full overlap by merging, exact acceptance test. Deliberately free of
 * filters and early exits, so that it shares no shortcut with the join it checks.
 */

/**
 * Size of the intersection of two ascending, duplicate-free arrays.
 *
 * @example intersectionSize(Int32Array.of(1, 4, 6), Int32Array.of(4, 5, 6)) // 2
 */
export function intersectionSize(x: Int32Array, y: Int32Array): number {
  let i = 0;
  let j = 0;
  let overlap = 0;
  while (i < x.length && j < y.length) {
    if (x[i] === y[j]) {
      overlap++;
      i++;
      j++;
    } else if (x[i] < y[j]) i++;
    else j++;
  }
  return overlap;
}

/**
 * Every pair a < b of `sets` whose Jaccard similarity reaches t, sorted by (a, b). Quadratic.
 *
 * @example bruteSelfJoin([Int32Array.of(1, 2), Int32Array.of(1, 2)], { p: 1, q: 1 }) // [{ a: 0, b: 1, overlap: 2 }]
 */
export function bruteSelfJoin(sets: readonly Int32Array[], t: Threshold, stats?: JoinStats): SimilarPair[] {
  const pairs: SimilarPair[] = [];
  const n = sets.length;
  for (let a = 0; a < n; a++) {
    for (let b = a + 1; b < n; b++) {
      const overlap = intersectionSize(sets[a], sets[b]);
      if (reaches(t, sets[a].length, sets[b].length, overlap)) pairs.push({ a, b, overlap });
    }
  }
  if (stats) {
    const all = (n * (n - 1)) / 2;
    stats.candidates += all;
    stats.verified += all;
    stats.results += pairs.length;
  }
  return pairs;
}

/**
 * Every pair (a in probe, b in indexed) whose Jaccard similarity reaches t, sorted by (a, b).
 *
 * @example bruteJoinAgainst([Int32Array.of(1)], [Int32Array.of(2), Int32Array.of(1)], { p: 4, q: 5 }) // [{ a: 0, b: 1, overlap: 1 }]
 */
export function bruteJoinAgainst(
  probe: readonly Int32Array[],
  indexed: readonly Int32Array[],
  t: Threshold,
  stats?: JoinStats,
): SimilarPair[] {
  const pairs: SimilarPair[] = [];
  for (let a = 0; a < probe.length; a++) {
    for (let b = 0; b < indexed.length; b++) {
      const overlap = intersectionSize(probe[a], indexed[b]);
      if (reaches(t, probe[a].length, indexed[b].length, overlap)) pairs.push({ a, b, overlap });
    }
  }
  if (stats) {
    const all = probe.length * indexed.length;
    stats.candidates += all;
    stats.verified += all;
    stats.results += pairs.length;
  }
  return pairs;
}
