/**
 * Sets packed into one Int32Array, in the order the join processes them. One flat array instead
 * of an array of Int32Arrays: a candidate is reached by one offset read instead of two pointer
 * hops (the array slot, then the typed array's backing store), and sets processed one after the
 * other sit next to each other in memory.
 */

/** Set m is data[start[m] .. start[m + 1]); order[m] is its index in the caller's input. */
export interface PackedSets {
  /** The ids of every set, one after the other. */
  data: Int32Array;
  /** length = count + 1; start[count] = data.length. */
  start: Int32Array;
  /** Input index of each packed set. */
  order: Int32Array;
}

/**
 * Packs the non-empty sets by ascending size, equal sizes by their first (rarest) id, then by
 * input index. Empty sets are dropped: they pair with nothing.
 *
 * Why the first id: sets that share it, near copies above all, end up next to each other, so a
 * probe's candidates and the list entries it walks are mostly already in the cache. Two counting
 * sorts (first id, then size, both stable) cost O(sets + ids); a full lexicographic sort with a
 * comparator cost more time on a million sets than it saved (`npm run bench:join`). The
 * order changes no result (any processing order in non-decreasing size is valid), only the
 * memory traffic.
 *
 * @example
 * packBySize([Int32Array.of(5, 6), new Int32Array(0), Int32Array.of(1, 9), Int32Array.of(4)])
 * // order [3, 2, 0], start [0, 1, 3, 5], data [4, 1, 9, 5, 6]
 */
export function packBySize(sets: readonly Int32Array[]): PackedSets {
  let maxSize = 0;
  let maxFirst = -1;
  let nonEmpty = 0;
  let total = 0;
  for (const set of sets) {
    if (set.length === 0) continue;
    if (set.length > maxSize) maxSize = set.length;
    if (set[0] > maxFirst) maxFirst = set[0];
    nonEmpty++;
    total += set.length;
  }
  const byFirst = countingSort(sets, nonEmpty, maxFirst + 1, (set) => set[0], null);
  const order = countingSort(sets, nonEmpty, maxSize + 1, (set) => set.length, byFirst);
  const start = new Int32Array(nonEmpty + 1);
  const data = new Int32Array(total);
  let offset = 0;
  for (let m = 0; m < nonEmpty; m++) {
    const set = sets[order[m]];
    start[m] = offset;
    data.set(set, offset);
    offset += set.length;
  }
  start[nonEmpty] = offset;
  return { data, start, order };
}

/** Stable counting sort of the non-empty sets' indexes (taken in `within` order, or input order) by a key in [0, keys). */
function countingSort(
  sets: readonly Int32Array[],
  nonEmpty: number,
  keys: number,
  keyOf: (set: Int32Array) => number,
  within: Int32Array | null,
): Int32Array {
  const bucket = new Int32Array(keys + 1);
  for (const set of sets) if (set.length > 0) bucket[keyOf(set) + 1]++;
  for (let key = 1; key <= keys; key++) bucket[key] += bucket[key - 1];
  const out = new Int32Array(nonEmpty);
  if (within) {
    for (let n = 0; n < within.length; n++) out[bucket[keyOf(sets[within[n]])]++] = within[n];
  } else {
    for (let i = 0; i < sets.length; i++) if (sets[i].length > 0) out[bucket[keyOf(sets[i])]++] = i;
  }
  return out;
}

/**
 * Overlap of two ascending, duplicate-free runs of `data`, x = [x0, x1) and y = [y0, y1), resumed
 * at positions i (in x) and j (in y) with `found` ids already known to be shared before them;
 * −1 as soon as the overlap can no longer reach `required`.
 *
 * Resuming is exact when every id shared by x[x0..i) and y[y0..j) is counted in `found` and the
 * last of them sits at x[i − 1] = y[j − 1] (or i = x0, j = y0): an id of x before i can then only
 * match one of y before j, because both runs ascend. The ids skipped so far are misses: x may
 * miss at most |x| − required ids in all, y at most |y| − required, so the merge stops on the
 * first miss past either budget, which is the earliest point at which the answer is known.
 *
 * @example
 * // x = [1, 3, 5, 7] at 0..4, y = [3, 5, 7, 9] at 4..8; 3 already matched at x[1] = y[4]
 * overlapFrom(Int32Array.of(1, 3, 5, 7, 3, 5, 7, 9), 0, 4, 4, 8, 2, 5, 1, 3) // 3
 */
export function overlapFrom(
  data: Int32Array,
  x0: number,
  x1: number,
  y0: number,
  y1: number,
  i: number,
  j: number,
  found: number,
  required: number,
): number {
  // Budgets: misses still allowed on each side (the misses so far are the ids before i, j not found).
  let budgetX = x1 - x0 - required - (i - x0 - found);
  let budgetY = y1 - y0 - required - (j - y0 - found);
  if (budgetX < 0 || budgetY < 0) return -1;
  let overlap = found;
  while (i < x1 && j < y1) {
    const a = data[i];
    const b = data[j];
    if (a === b) {
      overlap++;
      i++;
      j++;
    } else if (a < b) {
      i++;
      if (--budgetX < 0) return -1;
    } else {
      j++;
      if (--budgetY < 0) return -1;
    }
  }
  // The ids left on one side are misses too; the budgets were checked, so count and compare.
  return overlap >= required ? overlap : -1;
}
