/** Small pieces the join methods share: size order, pair numbering, phase timing. */
import type { JoinProfile, SimilarPair } from './types';

/**
 * Indexes of the non-empty sets, ordered by size (counting sort, so equal sizes keep index
 * order). Empty sets are dropped: they pair with nothing.
 */
export function bySize(sets: readonly Int32Array[]): Int32Array {
  let maxSize = 0;
  let nonEmpty = 0;
  for (const set of sets) {
    if (set.length > maxSize) maxSize = set.length;
    if (set.length > 0) nonEmpty++;
  }
  const start = new Int32Array(maxSize + 2);
  for (const set of sets) if (set.length > 0) start[set.length + 1]++;
  for (let s = 1; s < start.length; s++) start[s] += start[s - 1];
  const order = new Int32Array(nonEmpty);
  for (let i = 0; i < sets.length; i++) if (sets[i].length > 0) order[start[sets[i].length]++] = i;
  return order;
}

/** A pair in input numbering, a < b. */
export function selfPair(u: number, v: number, overlap: number): SimilarPair {
  return u < v ? { a: u, b: v, overlap } : { a: v, b: u, overlap };
}

/** Adds the time since `since` to one phase and returns the new clock. */
export function lap(profile: JoinProfile, phase: keyof JoinProfile, since: number): number {
  const now = performance.now();
  profile[phase] += now - since;
  return now;
}
