/**
 * The generator's only source of chance: mulberry32, a small seedable generator, wrapped with the
 * few draws the generator needs. The same seed gives the same stream on every machine.
 */
export class Random {
  private state: number;

  constructor(seed: number) {
    this.state = seed >>> 0;
  }

  /** A stream of its own for one named part (a module, a release), so adding parts elsewhere never shifts it. */
  static for(seed: number, ...names: (string | number)[]): Random {
    let h = seed >>> 0;
    for (const ch of names.join('/')) h = Math.imul(h ^ ch.charCodeAt(0), 0x01000193) >>> 0;
    return new Random(Math.imul(h ^ (h >>> 16), 0x45d9f3b) >>> 0);
  }

  /** A number in [0, 1). */
  next(): number {
    this.state = (this.state + 0x6d2b79f5) >>> 0;
    let x = this.state;
    x = Math.imul(x ^ (x >>> 15), x | 1);
    x ^= x + Math.imul(x ^ (x >>> 7), x | 61);
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  }

  /** An integer in [min, max], both included. */
  int(min: number, max: number): number {
    return min + Math.floor(this.next() * (max - min + 1));
  }

  /** True with probability p. */
  chance(p: number): boolean {
    return this.next() < p;
  }

  pick<T>(items: readonly T[]): T {
    if (items.length === 0) throw new Error('pick from an empty list');
    return items[Math.floor(this.next() * items.length)];
  }

  /** n distinct items in a random order (all of them when there are fewer). */
  some<T>(items: readonly T[], n: number): T[] {
    return this.shuffle(items).slice(0, n);
  }

  shuffle<T>(items: readonly T[]): T[] {
    const out = [...items];
    for (let i = out.length - 1; i > 0; i--) {
      const j = Math.floor(this.next() * (i + 1));
      [out[i], out[j]] = [out[j], out[i]];
    }
    return out;
  }

  /** A price-like or rate-like number with the given decimals. */
  amount(min: number, max: number, decimals: number): number {
    const scale = 10 ** decimals;
    return Math.round((min + this.next() * (max - min)) * scale) / scale;
  }
}
