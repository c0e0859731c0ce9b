/**
 * A Jaccard threshold kept as an exact fraction p/q, so that every bound below is computed in
 * integers. In doubles, ⌈0.8/1.8·63⌉ comes out as 29 instead of 28 and a pair exactly at the
 * threshold would be lost; with integers a pair at the threshold always passes.
 */
export interface Threshold {
  /** numerator, 0 < p ≤ q */
  readonly p: number;
  /** denominator */
  readonly q: number;
}

const MAX_DECIMALS = 6;

/**
 * Parses "0.8", "4/5" or a number into an exact fraction in lowest terms.
 *
 * @example parseThreshold('0.8') // { p: 4, q: 5 }
 * @throws when the value is not a number in (0, 1] with at most six decimals
 */
export function parseThreshold(value: string | number): Threshold {
  const text = String(value).trim();
  let p: number;
  let q: number;
  const fraction = /^(\d+)\s*\/\s*(\d+)$/.exec(text);
  const decimal = /^(\d+)(?:\.(\d+))?$/.exec(text);
  if (fraction) {
    p = Number(fraction[1]);
    q = Number(fraction[2]);
  } else if (decimal && (decimal[2]?.length ?? 0) <= MAX_DECIMALS) {
    const decimals = decimal[2] ?? '';
    q = 10 ** decimals.length;
    p = Number(decimal[1]) * q + Number(decimals || '0');
  } else {
    throw new Error(`threshold "${text}" is not a number in (0, 1] with at most ${MAX_DECIMALS} decimals`);
  }
  if (!(q > 0 && p > 0 && p <= q)) throw new Error(`threshold "${text}" must be above 0 and at most 1`);
  const g = gcd(p, q);
  return { p: p / g, q: q / g };
}

function gcd(a: number, b: number): number {
  while (b) [a, b] = [b, a % b];
  return a;
}

/** The threshold as a number, for display only. */
export function thresholdValue(t: Threshold): number {
  return t.p / t.q;
}

/**
 * Smallest overlap two sets of sizes a and b need to reach the threshold: ⌈t/(1+t)·(a+b)⌉.
 *
 * @example minOverlap({ p: 4, q: 5 }, 31, 32) // 28
 */
export function minOverlap(t: Threshold, a: number, b: number): number {
  return Math.floor((t.p * (a + b) + t.p + t.q - 1) / (t.p + t.q));
}

/**
 * Length of the probing prefix of a set of this size: size − ⌈t·size⌉ + 1. Two sets that reach
 * the threshold share at least one id within their prefixes (in the same global order).
 * Empty sets have no prefix (they pair with nothing: J(∅, ∅) is taken as 0).
 */
export function prefixLength(t: Threshold, size: number): number {
  if (size === 0) return 0;
  return size - Math.floor((t.p * size + t.q - 1) / t.q) + 1;
}

/**
 * Sizes a partner of a set of this size may have: ⌈t·size⌉ ≤ partner ≤ ⌊size/t⌋.
 *
 * @example sizeBounds({ p: 9, q: 10 }, 100) // [90, 111]
 */
export function sizeBounds(t: Threshold, size: number): [number, number] {
  return [Math.floor((t.p * size + t.q - 1) / t.q), Math.floor((t.q * size) / t.p)];
}

/** Whether overlap o between sets of sizes a and b reaches the threshold: o/(a+b−o) ≥ p/q. */
export function reaches(t: Threshold, a: number, b: number, overlap: number): boolean {
  return overlap > 0 && t.q * overlap >= t.p * (a + b - overlap);
}

/**
 * Overlap of two ascending Int32Arrays, or −1 as soon as it can no longer reach `required`.
 *
 * @example overlapAtLeast(Int32Array.of(1, 2, 3), Int32Array.of(2, 3, 4), 2) // 2
 */
export function overlapAtLeast(x: Int32Array, y: Int32Array, required: number, startX = 0, startY = 0, found = 0): number {
  let i = startX;
  let j = startY;
  let overlap = found;
  while (i < x.length && j < y.length) {
    if (overlap + Math.min(x.length - i, y.length - j) < required) return -1;
    const a = x[i];
    const b = y[j];
    if (a === b) {
      overlap++;
      i++;
      j++;
    } else if (a < b) i++;
    else j++;
  }
  return overlap >= required ? overlap : -1;
}
