/**
 * Pieces shared by the benchmarks' synthetic collections: a seedable random stream and a Zipf
 * table over a fixed vocabulary (token r drawn with probability proportional to 1/(r+1)).
 */

/** Token ids a collection draws from. */
export const VOCABULARY = 1 << 20;
/** Slots of the Zipf table: a uniform index into it is a Zipf draw. */
export const ZIPF_TABLE = 1 << 21;
/** Odd, so multiplying by it modulo 2^20 is a bijection: a cheap shuffle of ids against frequency. */
export const RELABEL = 0x9e3779b1;

/** mulberry32: small, fast and seedable; quality is ample for test data. */
export function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let x = a;
    x = Math.imul(x ^ (x >>> 15), x | 1);
    x ^= x + Math.imul(x ^ (x >>> 7), x | 61);
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
}

/** Token r fills a share of the table proportional to 1/(r+1): a uniform index into it is a Zipf draw. */
export function zipfTable(): Int32Array {
  let harmonic = 0;
  for (let r = 0; r < VOCABULARY; r++) harmonic += 1 / (r + 1);
  const table = new Int32Array(ZIPF_TABLE);
  let filled = 0;
  let cumulative = 0;
  for (let r = 0; r < VOCABULARY && filled < ZIPF_TABLE; r++) {
    cumulative += 1 / (r + 1) / harmonic;
    const until = Math.min(ZIPF_TABLE, Math.round(cumulative * ZIPF_TABLE));
    for (; filled < until; filled++) table[filled] = r;
  }
  // Rounding can leave a few slots at the end: give them to the rarest ids.
  for (; filled < ZIPF_TABLE; filled++) table[filled] = VOCABULARY - 1 - (filled % 1024);
  return table;
}
