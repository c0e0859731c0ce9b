/**
 * Bitmap signatures: a cheap upper bound on the overlap of two sets from 128 bits each, checked
 * before the join touches anything of the candidate but its index entry.
 *
 * Every id sets one bit, chosen by hashing the id. A bit set in one signature and not in the
 * other comes from an id of that set which the other set lacks (no id of the other set hashes
 * there), and different bits come from different ids. So the number h of differing bits is at
 * most the size of the symmetric difference |x| + |y| − 2·|x ∩ y|, that is
 * |x ∩ y| ≤ ⌊(|x| + |y| − h) / 2⌋, whatever the collisions. Exact: it never drops a pair that
 * reaches the threshold; it only saves merging pairs that cannot.
 */

/** Int32 words per signature. */
export const SIGNATURE_WORDS = 4;

/** Bit of an id: the top 7 bits of a multiplicative hash, so neighbouring ranks spread out. */
function bitOf(id: number): number {
  return Math.imul(id, 0x9e3779b1) >>> 25;
}

/**
 * Writes the signature of the ascending run data[from, to) into out[at .. at + 4).
 *
 * @example
 * const out = new Int32Array(4); writeSignature(Int32Array.of(3, 8), 0, 2, out, 0) // two bits set in out
 */
export function writeSignature(data: Int32Array, from: number, to: number, out: Int32Array, at: number): void {
  out[at] = 0;
  out[at + 1] = 0;
  out[at + 2] = 0;
  out[at + 3] = 0;
  for (let i = from; i < to; i++) {
    const bit = bitOf(data[i]);
    out[at + (bit >>> 5)] |= 1 << (bit & 31);
  }
}

/**
 * Number of set bits of a 32-bit value (SWAR; JavaScript has no popcount).
 *
 * @example popcount(0b1011) // 3
 */
export function popcount(v: number): number {
  v = v - ((v >>> 1) & 0x55555555);
  v = (v & 0x33333333) + ((v >>> 2) & 0x33333333);
  return Math.imul((v + (v >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24;
}

/**
 * The largest overlap two sets of these sizes can have given their signatures (a at `i` in
 * `sa`, b at `j` in `sb`): ⌊(|a| + |b| − differing bits) / 2⌋.
 *
 * @example
 * // {1, 2} and {3, 4}: the bound is below 2 whenever their ids hash to different bits
 * overlapBound(sa, 0, 2, sb, 0, 2)
 */
export function overlapBound(sa: Int32Array, i: number, sizeA: number, sb: Int32Array, j: number, sizeB: number): number {
  const differing =
    popcount(sa[i] ^ sb[j]) + popcount(sa[i + 1] ^ sb[j + 1]) + popcount(sa[i + 2] ^ sb[j + 2]) + popcount(sa[i + 3] ^ sb[j + 3]);
  return (sizeA + sizeB - differing) >> 1;
}
