/**
 * Shingle sets: k consecutive tokens joined into one string; the n-th repeat of a shingle is
 * written `shingle#n` (the first stays bare), so a set keeps multiset counts and set Jaccard
 * equals multiset Jaccard (|min counts| / |max counts|).
 */

/** Separator between the tokens of one shingle; tokens never contain it (see tokenForm). */
export const SHINGLE_SEPARATOR = '\u001f';

/**
 * The shingle set of a token sequence, sorted by the default string order, without duplicates.
 * A sequence shorter than k gives one shingle of all its tokens (so a tiny fragment still has a
 * non-empty set); an empty sequence gives an empty set.
 *
 * @example shingleSet(['a', 'b', 'a', 'b'], 2) // ['a\u001fb', 'a\u001fb#2', 'b\u001fa']
 */
export function shingleSet(tokens: readonly string[], k: number): string[] {
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`shingle size must be a positive integer, got ${k}`);
  if (tokens.length === 0) return [];
  if (tokens.length < k) return [tokens.join(SHINGLE_SEPARATOR)];
  const counts = new Map<string, number>();
  const out: string[] = [];
  for (let i = 0; i + k <= tokens.length; i++) {
    let s = tokens[i];
    for (let j = 1; j < k; j++) s += SHINGLE_SEPARATOR + tokens[i + j];
    const seen = (counts.get(s) ?? 0) + 1;
    counts.set(s, seen);
    out.push(seen === 1 ? s : `${s}#${seen}`);
  }
  return out.sort();
}

/**
 * Jaccard similarity |A∩B| / |A∪B| of two sorted, duplicate-free shingle sets (as produced by
 * shingleSet). Two empty sets are similar 1 by convention (they are equal).
 *
 * @example jaccard(['a', 'b'], ['b', 'c']) // 1/3
 */
export function jaccard(a: readonly string[], b: readonly string[]): number {
  if (a.length === 0 && b.length === 0) return 1;
  let i = 0;
  let j = 0;
  let shared = 0;
  while (i < a.length && j < b.length) {
    if (a[i] === b[j]) {
      shared++;
      i++;
      j++;
    } else if (a[i] < b[j]) i++;
    else j++;
  }
  return shared / (a.length + b.length - shared);
}
