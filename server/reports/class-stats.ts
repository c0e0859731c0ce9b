/** What a clone class's list row shows besides its members: the similarity range and the clone type. */
export interface ClassStats {
  /** lowest and highest similarity among the class's clone pairs */
  minSimilarity: number;
  maxSimilarity: number;
  /** the highest clone type among the class's pairs (3 as soon as one pair is only similar) */
  cloneType: 1 | 2 | 3;
}

/**
 * The similarity range and clone type of each class, from the pairs that make the classes (a pair
 * a = b is ignored). Used by the report (scan, classes) and by a load storing a snapshot's classes.
 *
 * @example classStats(3, [[0, 1, 2]], [{ a: 0, b: 1, similarity: 1, type: 1 }, { a: 1, b: 2, similarity: 0.85, type: 3 }])
 * // [{ minSimilarity: 0.85, maxSimilarity: 1, cloneType: 3 }]
 */
export function classStats(
  count: number,
  classes: readonly (readonly number[])[],
  pairs: readonly { a: number; b: number; similarity: number; type: 1 | 2 | 3 }[],
): ClassStats[] {
  const classOf = new Int32Array(count).fill(-1);
  classes.forEach((members, c) => {
    for (const m of members) classOf[m] = c;
  });
  const stats: ClassStats[] = classes.map(() => ({ minSimilarity: Infinity, maxSimilarity: -Infinity, cloneType: 1 }));
  for (const { a, b, similarity, type } of pairs) {
    if (a === b) continue;
    const s = stats[classOf[a]];
    s.minSimilarity = Math.min(s.minSimilarity, similarity);
    s.maxSimilarity = Math.max(s.maxSimilarity, similarity);
    if (type > s.cloneType) s.cloneType = type;
  }
  return stats;
}
