import { jaccard } from '../matching/similarity';
import { minOverlap, overlapAtLeast, prefixLength, reaches, sizeBounds, type Threshold } from '../matching/threshold';

/** A candidate of a probe: an indexed set that shares a rank with the probe's prefix and passed the position filter. */
export interface ProbeCandidate {
  /** index of the probe set in the batch */
  probe: number;
  setId: number;
  /** size of the indexed set */
  size: number;
}

/** A probe set's match: an indexed set and their exact overlap. */
export interface SetMatch {
  probe: number;
  setId: number;
  /** size of the indexed set */
  size: number;
  overlap: number;
  /** Jaccard similarity overlap / (|x| + |y| − overlap), for display and sorting */
  similarity: number;
}

/**
 * The prefix entries a probe of set `ranks` at threshold t looks up, each with the range of partner
 * sizes the length filter allows. Only positions i with |x| − i ≥ α(|x|, lo) are kept: a rank
 * further on can never be the first shared one of a pair that reaches t (see probeHitFilter), and
 * the smallest partner size lo needs the smallest overlap. That is never past prefixLength(t, |x|).
 *
 * @example probeKeys(Int32Array.of(1, 2, 3, 4, 5), { p: 4, q: 5 }) // { ranks: [1, 2], lo: 4, hi: 6 }
 */
export function probeKeys(ranks: Int32Array, t: Threshold) {
  const [lo, hi] = sizeBounds(t, ranks.length);
  const length = Math.min(prefixLength(t, ranks.length), ranks.length - minOverlap(t, ranks.length, lo) + 1);
  return { ranks: ranks.subarray(0, Math.max(0, length)), lo, hi };
}

/**
 * The position filter as an SQL condition on one hit, for a probe p(pos, sz) and a prefix entry
 * e(position, size), with α = minOverlap(t, p.sz, e.size) in integers.
 *
 * Why one hit is enough: the first shared rank of x and y sits at positions i and j with nothing
 * shared before it (both arrays are in the same global order), so the overlap is at most
 * 1 + min(|x|−i−1, |y|−j−1). A pair that reaches t therefore has its first shared rank at
 * |x| − i ≥ α and |y| − j ≥ α, inside both probing prefixes (α ≥ ⌈t·|x|⌉ whenever |y| ≥ t·|x|),
 * so the pair keeps at least that hit. Later hits of a pair only get smaller bounds, so hits
 * failing the condition carry nothing a pair needs. The database drops them before they travel.
 */
export function probeHitFilter(t: Threshold, probe = 'p', entry = 'e'): string {
  const { p, q } = t;
  // bigint: p and q reach 10^6 for six-decimal thresholds, and p·(a+b) would overflow int4
  const alpha = `((${p}::bigint * (${probe}.sz + ${entry}.size) + ${p + q - 1}) / ${p + q})`;
  return `${probe}.sz - ${probe}.pos >= ${alpha} and ${entry}.size - ${entry}.position >= ${alpha}`;
}

/**
 * The partner sizes a probe key p(pos, sz) can pair with, as SQL bounds for the index condition on
 * prefix_entries (rank, size): from ⌈t·sz⌉ (the length filter) to the largest size whose hit still
 * passes the probe side of probeHitFilter. That side, sz − pos ≥ α = ⌈p(sz+size)/(p+q)⌉, holds iff
 * (p+q)(sz − pos) ≥ p·sz + p·size (the left side is an integer), i.e. iff
 * size ≤ ⌊(q·sz − (p+q)·pos) / p⌋, which is never above the length filter's ⌊q·sz/p⌋ and shrinks as
 * the key lies further in: the index then reads only the entries that side keeps, instead of
 * reading them all and filtering. (When the numerator is negative SQL division truncates to 0 or
 * less, and no stored size is below 1, so nothing is read, as it should be.)
 *
 * @example probeSizeBounds({ p: 3, q: 5 }) // ['(3::bigint * p.sz + 4) / 5', '(5::bigint * p.sz - 8::bigint * p.pos) / 3']
 */
export function probeSizeBounds(t: Threshold, probe = 'p'): [string, string] {
  const { p, q } = t;
  return [`(${p}::bigint * ${probe}.sz + ${q - 1}) / ${q}`, `(${q}::bigint * ${probe}.sz - ${p + q}::bigint * ${probe}.pos) / ${p}`];
}

/**
 * prefixLength(t, size) as an SQL expression over an integer column, for statements that write
 * prefix entries inside the database (the rebuild): size − ⌈t·size⌉ + 1 in integer division, 0
 * for an empty set. A test evaluates it in PostgreSQL against prefixLength for every size.
 *
 * @example prefixLengthSql({ p: 3, q: 5 }, 'ss.size') // '(case when ss.size = 0 then 0 else ss.size - ((3::bigint * ss.size + 4) / 5) + 1 end)::int'
 */
export function prefixLengthSql(t: Threshold, size: string): string {
  // bigint inside (p·size passes 2^31 for six-decimal thresholds), int outside (array subscripts)
  return `(case when ${size} = 0 then 0 else ${size} - ((${t.p}::bigint * ${size} + ${t.q - 1}) / ${t.q}) + 1 end)::int`;
}

/**
 * Verifies candidates by merging the sorted rank arrays, with early exit. Returns only the pairs
 * that reach the threshold, with their exact overlap.
 */
export function verifyCandidates(
  candidates: ProbeCandidate[],
  probes: Int32Array[],
  stored: Map<number, Int32Array>,
  t: Threshold,
): SetMatch[] {
  const matches: SetMatch[] = [];
  for (const { probe, setId } of candidates) {
    const x = probes[probe];
    const y = stored.get(setId);
    if (!y) throw new Error(`candidate set ${setId} was not loaded for verification`);
    const overlap = overlapAtLeast(x, y, minOverlap(t, x.length, y.length));
    if (overlap > 0 && reaches(t, x.length, y.length, overlap)) {
      matches.push({ probe, setId, size: y.length, overlap, similarity: jaccard(overlap, x.length, y.length) });
    }
  }
  return matches;
}
