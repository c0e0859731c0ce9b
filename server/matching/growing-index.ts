/**
 * A prefix index that grows by appended batches, for probing new sets against everything stored
 * before them: the in-memory side of the index in PostgreSQL (server/clone-index/mirror.ts). Pure,
 * no I/O.
 *
 * Sets get numbers 0, 1, 2… in the order they are appended; their ids live in one packed
 * Int32Array. The inverted prefix lists are kept in segments, each covering a range of set
 * numbers and built once (its lists sorted by set size, so the length filter is a binary search).
 * An appended batch becomes a segment of its own, and two neighbouring segments are merged when
 * the older is not more than twice the size of the newer: there are about log₂(sets / batch)
 * segments, and each set is rebuilt about as many times over the life of the index.
 */
import { overlapBound, SIGNATURE_WORDS, writeSignature } from './bitmap';
import { minOverlap, prefixLength, reaches, sizeBounds, type Threshold } from './threshold';

/** One segment: the prefix lists of sets [from, to). */
interface Segment {
  from: number;
  to: number;
  /** Dense lists: list k holds rank base + k. Sparse lists: list k holds rank keys[k]. */
  base: number;
  keys: Int32Array | undefined;
  listStart: Int32Array;
  /** (size, set number, position of the list's rank in the set) per entry, each list sorted by size */
  entries: Int32Array;
}

const SIZE = 0;
const SET = 1;
const POSITION = 2;

/** A pair a probe found: the stored set's number and the exact overlap. */
export interface GrowingIndexMatch {
  set: number;
  overlap: number;
}

export class GrowingIndex {
  private data = new Int32Array(1 << 12);
  private starts = new Int32Array(1 << 8);
  /** each set's bitmap signature (bitmap.ts): a candidate whose bound misses α is dropped at its first hit */
  private signatures = new Int32Array(this.starts.length * SIGNATURE_WORDS);
  private readonly probeSignature = new Int32Array(SIGNATURE_WORDS);
  /** α(|x|, size) for the partner sizes of the current probe, so the inner loop does no division */
  private alphas = new Int32Array(256);
  private used = 0;
  private sets = 0;
  private segments: Segment[] = [];
  // per-candidate state of a probe, by set number, reset through `touched` after each probe
  private count = new Int32Array(this.starts.length);
  private lastX = new Int32Array(this.starts.length);
  private lastY = new Int32Array(this.starts.length);
  private touched = new Int32Array(this.starts.length);

  /** @param prefixThreshold the lowest threshold a probe may use: each set's prefix is written for it */
  constructor(readonly prefixThreshold: Threshold) {}

  /** How many sets the index holds. */
  get size(): number {
    return this.sets;
  }

  /** Ids (ranks) the index holds, over every set. */
  get totalIds(): number {
    return this.used;
  }

  /** How many segments the prefix lists are kept in. */
  get segmentCount(): number {
    return this.segments.length;
  }

  /** Prefix entries over every segment. */
  get totalEntries(): number {
    let total = 0;
    for (const s of this.segments) total += s.entries.length / 3;
    return total;
  }

  /** Set number n, as a view (valid until the next append). */
  set(n: number): Int32Array {
    return this.data.subarray(this.starts[n], this.starts[n + 1]);
  }

  /**
   * Appends sets (each sorted ascending) and returns the number of the first. With `merge` false
   * their segment stays apart until compact(): sets that may yet be truncated (a transaction not
   * committed yet) then never cause a merge with older segments, nor a rebuild when truncated.
   */
  append(sets: readonly Int32Array[], merge = true): number {
    const first = this.sets;
    let ids = 0;
    for (const s of sets) ids += s.length;
    this.reserve(this.used + ids, this.sets + sets.length);
    for (const s of sets) {
      this.data.set(s, this.used);
      writeSignature(this.data, this.used, this.used + s.length, this.signatures, this.sets * SIGNATURE_WORDS);
      this.used += s.length;
      this.starts[++this.sets] = this.used;
    }
    const segment = this.buildSegment(first, this.sets);
    if (segment) this.segments.push(segment);
    if (merge) this.compact();
    return first;
  }

  /** Drops every set from number `size` on (the sets of a transaction that did not commit). */
  truncate(size: number): void {
    if (size >= this.sets) return;
    const kept: Segment[] = [];
    for (const s of this.segments) {
      if (s.to <= size) kept.push(s);
      else if (s.from < size) {
        const rebuilt = this.buildSegment(s.from, size);
        if (rebuilt) kept.push(rebuilt);
      }
    }
    this.segments = kept;
    this.sets = size;
    this.used = this.starts[size];
  }

  /**
   * Every set numbered below `limit` whose similarity to x reaches t (t at or above the prefix
   * threshold), with the exact overlap. The filters are the in-memory join's: length, prefix,
   * the bitmap bound at a candidate's first hit, and position on every hit; then a merge that resumes after the last hit and stops as soon as
   * the overlap can no longer reach α.
   */
  probe(x: Int32Array, t: Threshold, limit: number, matches: GrowingIndexMatch[]): number {
    const sizeX = x.length;
    if (sizeX === 0) return 0;
    const [lower, upper] = sizeBounds(t, sizeX);
    const keys = Math.min(prefixLength(t, sizeX), sizeX - minOverlap(t, sizeX, lower) + 1);
    const { count, lastX, lastY, touched, segments, signatures, probeSignature } = this;
    writeSignature(x, 0, sizeX, probeSignature, 0);
    if (upper - lower + 1 > this.alphas.length) this.alphas = new Int32Array(2 * (upper - lower + 1));
    const alphas = this.alphas;
    for (let size = lower; size <= upper; size++) alphas[size - lower] = minOverlap(t, sizeX, size);
    let touchedCount = 0;
    for (let i = 0; i < keys; i++) {
      // On a first shared rank at position i the overlap is at most sizeX − i, which reaches
      // α(sizeX, sizeY) only for sizeY ≤ (q·sizeX − (p+q)·i) / p (see probeSizeBounds): the bound
      // shrinks as i grows, so a partner past it at i is past it at every later position too.
      const keyUpper = Math.min(upper, Math.floor((t.q * sizeX - (t.p + t.q) * i) / t.p));
      if (keyUpper < lower) break;
      const w = x[i];
      for (const seg of segments) {
        if (seg.from >= limit) break;
        const list = listOf(seg, w);
        if (list < 0) continue;
        const end = seg.listStart[list + 1];
        const entries = seg.entries;
        for (let e = firstAtLeast(entries, seg.listStart[list], end, lower); e < end; e++) {
          const sizeY = entries[3 * e + SIZE];
          if (sizeY > keyUpper) break;
          const y = entries[3 * e + SET];
          if (y >= limit) continue;
          const c = count[y];
          if (c < 0) continue;
          if (c === 0) {
            touched[touchedCount++] = y;
            if (overlapBound(probeSignature, 0, sizeX, signatures, y * SIGNATURE_WORDS, sizeY) < alphas[sizeY - lower]) {
              count[y] = -1;
              continue;
            }
          }
          const j = entries[3 * e + POSITION];
          const restX = sizeX - i - 1;
          const restY = sizeY - j - 1;
          if (c + 1 + (restX < restY ? restX : restY) < alphas[sizeY - lower]) {
            count[y] = -1;
            continue;
          }
          count[y] = c + 1;
          lastX[y] = i;
          lastY[y] = j;
        }
      }
    }
    const { data, starts } = this;
    for (let n = 0; n < touchedCount; n++) {
      const y = touched[n];
      const c = count[y];
      count[y] = 0;
      if (c < 0) continue;
      const start = starts[y];
      const sizeY = starts[y + 1] - start;
      const overlap = overlapFrom(x, data, start + sizeY, minOverlap(t, sizeX, sizeY), lastX[y] + 1, start + lastY[y] + 1, c);
      if (overlap >= 0 && reaches(t, sizeX, sizeY, overlap)) matches.push({ set: y, overlap });
    }
    return touchedCount;
  }

  private reserve(ids: number, sets: number) {
    if (ids > this.data.length) {
      const grown = new Int32Array(Math.max(ids, this.data.length * 2));
      grown.set(this.data.subarray(0, this.used));
      this.data = grown;
    }
    if (sets + 1 > this.starts.length) {
      const capacity = Math.max(sets + 1, this.starts.length * 2);
      const grown = new Int32Array(capacity);
      grown.set(this.starts.subarray(0, this.sets + 1));
      this.starts = grown;
      const signatures = new Int32Array(capacity * SIGNATURE_WORDS);
      signatures.set(this.signatures.subarray(0, this.sets * SIGNATURE_WORDS));
      this.signatures = signatures;
      this.count = new Int32Array(capacity);
      this.lastX = new Int32Array(capacity);
      this.lastY = new Int32Array(capacity);
      this.touched = new Int32Array(capacity);
    }
  }

  /** Merges the newest segments while the older of the last two is at most twice the newer. */
  compact(): void {
    const segs = this.segments;
    while (segs.length >= 2) {
      const newer = segs[segs.length - 1];
      const older = segs[segs.length - 2];
      if (older.to - older.from > 2 * (newer.to - newer.from)) break;
      segs.splice(segs.length - 2, 2, this.buildSegment(older.from, newer.to)!);
    }
  }

  /** The prefix lists of sets [from, to), or undefined when they have no prefix entry. */
  private buildSegment(from: number, to: number): Segment | undefined {
    const { data, starts } = this;
    const T = this.prefixThreshold;
    let total = 0;
    let maxSize = 0;
    let minRank = Infinity;
    let maxRank = -Infinity;
    for (let n = from; n < to; n++) {
      const size = starts[n + 1] - starts[n];
      const prefix = prefixLength(T, size);
      total += prefix;
      if (size > maxSize) maxSize = size;
      for (let i = starts[n], end = starts[n] + prefix; i < end; i++) {
        if (data[i] < minRank) minRank = data[i];
        if (data[i] > maxRank) maxRank = data[i];
      }
    }
    if (total === 0) return undefined;
    // size order by counting sort: filled in this order, every list comes out sorted by size
    const bySize = new Int32Array(maxSize + 2);
    for (let n = from; n < to; n++) bySize[starts[n + 1] - starts[n] + 1]++;
    for (let s = 1; s < bySize.length; s++) bySize[s] += bySize[s - 1];
    const order = new Int32Array(to - from);
    for (let n = from; n < to; n++) order[bySize[starts[n + 1] - starts[n]]++] = n;

    // dense lists when the rank range is not much wider than the entries, sorted keys otherwise
    const range = maxRank - minRank + 1;
    let keys: Int32Array | undefined;
    if (range > 2 * total + 1024) {
      const all = new Int32Array(total);
      let k = 0;
      for (let n = from; n < to; n++) {
        const prefix = prefixLength(T, starts[n + 1] - starts[n]);
        all.set(data.subarray(starts[n], starts[n] + prefix), k);
        k += prefix;
      }
      all.sort();
      let distinct = 0;
      for (let i = 0; i < all.length; i++) if (i === 0 || all[i] !== all[i - 1]) all[distinct++] = all[i];
      keys = all.slice(0, distinct);
    }
    const segment: Segment = { from, to, base: minRank, keys, listStart: new Int32Array((keys ? keys.length : range) + 1), entries: new Int32Array(3 * total) };
    const { listStart, entries } = segment;
    for (let n = from; n < to; n++) {
      for (let i = starts[n], end = starts[n] + prefixLength(T, starts[n + 1] - starts[n]); i < end; i++) listStart[listOf(segment, data[i]) + 1]++;
    }
    for (let k = 1; k < listStart.length; k++) listStart[k] += listStart[k - 1];
    const fill = listStart.slice(0, listStart.length - 1);
    for (const n of order) {
      const size = starts[n + 1] - starts[n];
      const prefix = prefixLength(T, size);
      for (let i = 0; i < prefix; i++) {
        const e = 3 * fill[listOf(segment, data[starts[n] + i])]++;
        entries[e + SIZE] = size;
        entries[e + SET] = n;
        entries[e + POSITION] = i;
      }
    }
    return segment;
  }
}

/** The list of rank w in a segment, or −1 when the segment has none. */
function listOf(seg: Segment, w: number): number {
  const keys = seg.keys;
  if (!keys) {
    const k = w - seg.base;
    return k >= 0 && k < seg.listStart.length - 1 ? k : -1;
  }
  let lo = 0;
  let hi = keys.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >>> 1;
    const v = keys[mid];
    if (v < w) lo = mid + 1;
    else if (v > w) hi = mid - 1;
    else return mid;
  }
  return -1;
}

/** First entry number in [from, to) of a size-sorted list whose size is ≥ lower. */
function firstAtLeast(entries: Int32Array, from: number, to: number, lower: number): number {
  let lo = from;
  let hi = to;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (entries[3 * mid + SIZE] < lower) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * overlapAtLeast (threshold.ts) with y given as data[…, yEnd): the merge resumes at x[i] and
 * data[j] with `found` shared ids counted before them; −1 once `required` is out of reach.
 */
function overlapFrom(x: Int32Array, data: Int32Array, yEnd: number, required: number, i: number, j: number, found: number): number {
  let overlap = found;
  const sizeX = x.length;
  while (i < sizeX && j < yEnd) {
    const restX = sizeX - i;
    const restY = yEnd - j;
    if (overlap + (restX < restY ? restX : restY) < required) return -1;
    const a = x[i];
    const b = data[j];
    if (a === b) {
      overlap++;
      i++;
      j++;
    } else if (a < b) i++;
    else j++;
  }
  return overlap >= required ? overlap : -1;
}
