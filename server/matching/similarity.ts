/** Jaccard similarity from exact counts. */

/**
 * Jaccard similarity from an overlap and the two sizes, as a double: for display and sorting
 * only (decisions use reaches() on exact integers, threshold.ts). 0 for two empty sets.
 *
 * @example jaccard(28, 31, 32) // 0.8
 */
export function jaccard(overlap: number, sizeA: number, sizeB: number): number {
  const union = sizeA + sizeB - overlap;
  return union === 0 ? 0 : overlap / union;
}
