/**
 * The benchmarks' synthetic data: a seedable random stream, a Zipf table over a fixed vocabulary
 * (token r drawn with probability proportional to 1/(r+1)), and the index benchmark's collection
 * of shingle sets (Collection).
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

/**
 * A per-item seed: the same (seed, salt, i) always gives the same stream.
 *
 * @example random(mix(7, 1, 42))() // the same number on every run
 */
export function mix(seed: number, salt: number, i: number): number {
  let h = Math.imul(seed ^ 0x85ebca6b, 0xc2b2ae35) ^ Math.imul(salt + 1, 0x27d4eb2f) ^ Math.imul(i + 1, 0x165667b1);
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
  return (h ^ (h >>> 16)) >>> 0;
}

type Kind = 'original' | 'near' | 'exact';

/**
 * The index benchmark's synthetic collection: set i as a shingle list, from (seed, i) alone, so a
 * stage generates its sets on the fly and never holds the whole collection (see clone-index.ts).
 *
 * @example new Collection(7).set(0) // ['s123', 's77', 's123#2', …]
 */
export class Collection {
  private readonly table = zipfTable();

  constructor(private readonly seed: number) {}

  private draw(next: () => number): number {
    return Math.imul(this.table[(next() * ZIPF_TABLE) | 0], RELABEL) & (VOCABULARY - 1);
  }

  kind(i: number): Kind {
    if (i < 100) return 'original';
    const x = random(mix(this.seed, 1, i))();
    return x < 0.1 ? 'near' : x < 0.12 ? 'exact' : 'original';
  }

  /** Token ids of an original set (with repeats, as drawn). */
  private originalTokens(salt: number, i: number): number[] {
    const next = random(mix(this.seed, salt, i));
    const gauss = Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
    const size = Math.max(8, Math.min(800, Math.round(48 * Math.exp(0.55 * gauss))));
    const tokens: number[] = [];
    for (let k = 0; k < size; k++) tokens.push(this.draw(next));
    return tokens;
  }

  /** The source of a copy: an earlier original (copies never copy copies, to keep this cheap). */
  private source(i: number): number {
    const next = random(mix(this.seed, 3, i));
    let j = Math.floor(next() * i);
    while (this.kind(j) !== 'original') j = Math.floor(next() * i);
    return j;
  }

  /** Drops or replaces up to `share` of the tokens: an edited copy. */
  private edit(tokens: number[], next: () => number, share: number): number[] {
    const copy = [...tokens];
    const edits = Math.floor(next() * share * copy.length);
    for (let e = 0; e < edits; e++) {
      const at = Math.floor(next() * copy.length);
      if (next() < 0.5 && copy.length > 8) copy.splice(at, 1);
      else copy[at] = this.draw(next);
    }
    return copy;
  }

  private tokens(i: number): number[] {
    switch (this.kind(i)) {
      case 'original':
        return this.originalTokens(2, i);
      case 'exact':
        return this.originalTokens(2, this.source(i));
      case 'near':
        return this.edit(this.originalTokens(2, this.source(i)), random(mix(this.seed, 4, i)), 0.2);
    }
  }

  /** Set i of the collection. */
  set(i: number): string[] {
    return shingleStrings(this.tokens(i));
  }

  /** A near-copy (0–15% edited) of indexed set i, as someone would paste into find copies. */
  nearQuery(i: number, q: number): string[] {
    return shingleStrings(this.edit(this.tokens(i), random(mix(this.seed, 5, q)), 0.15));
  }

  /** A set drawn like an original but indexed nowhere. */
  freshQuery(q: number): string[] {
    return shingleStrings(this.originalTokens(6, q));
  }

  /** A fresh set for the probe-rate batch: the same mix as the collection, sources among indexed sets. */
  releaseSet(q: number, indexed: number): string[] {
    const next = random(mix(this.seed, 7, q));
    const x = next();
    if (x < 0.1) return shingleStrings(this.edit(this.tokens(Math.floor(next() * indexed)), next, 0.2));
    return shingleStrings(this.originalTokens(8, q));
  }
}

/** Token ids → shingle strings; the n-th repeat of a shingle becomes `s<id>#n`, so the set keeps multiset counts. */
function shingleStrings(tokens: number[]): string[] {
  const seen = new Map<number, number>();
  return tokens.map((t) => {
    const n = (seen.get(t) ?? 0) + 1;
    seen.set(t, n);
    return n === 1 ? `s${t}` : `s${t}#${n}`;
  });
}

/**
 * The join benchmarks' synthetic collection (bench:join, bench:cli; described in join.ts): `count`
 * sets of token ids (not yet ranked). Token ids are scrambled
 * against their frequency rank so that the rarest-first ranking has real work to do.
 */
export function generateCollection(count: number, seed: number): Int32Array[] {
  const next = random(seed);
  const table = zipfTable();
  const stamp = new Int32Array(VOCABULARY).fill(-1);
  const sets: Int32Array[] = new Array(count);
  const draw = () => Math.imul(table[(next() * ZIPF_TABLE) | 0], RELABEL) & (VOCABULARY - 1);
  for (let s = 0; s < count; s++) {
    if (s > 10 && next() < 0.1) {
      // planted near-duplicate of an earlier set
      const source = sets[Math.floor(next() * s)];
      const edits = Math.floor(next() * 0.15 * source.length);
      const copy = Array.from(source);
      for (let e = 0; e < edits; e++) {
        const at = Math.floor(next() * copy.length);
        if (next() < 0.5) copy.splice(at, 1);
        else copy[at] = draw();
      }
      sets[s] = Int32Array.from(new Set(copy));
      continue;
    }
    // log-normal size: median 80, sigma 0.7 (Box–Muller), clamped to 20..3000
    const gauss = Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
    const size = Math.max(20, Math.min(3000, Math.round(80 * Math.exp(0.7 * gauss))));
    const set = new Int32Array(size);
    let filled = 0;
    for (let attempt = 0; filled < size && attempt < size * 8; attempt++) {
      const token = draw();
      if (stamp[token] === s) continue;
      stamp[token] = s;
      set[filled++] = token;
    }
    sets[s] = filled === size ? set : set.slice(0, filled);
  }
  return sets;
}
