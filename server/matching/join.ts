import { bruteJoinAgainst, bruteSelfJoin } from './brute';
import { overlapBound, SIGNATURE_WORDS, writeSignature } from './bitmap';
import { overlapFrom, packBySize } from './packed';
import { minOverlap, overlapAtLeast, prefixLength, reaches, sizeBounds, type Threshold } from './threshold';
import type { JoinOptions, JoinProfile, JoinStats, SetPair } from './types';

export type { Algorithm, JoinOptions, JoinProfile, JoinStats, SetPair } from './types';
export { ALGORITHMS, newJoinStats } from './types';

/**
 * The exact similarity join over sets of ranks (ascending in the global rarest-first order).
 *
 * Invariant: for every method the result equals the brute-force pairs exactly; every bound comes
 * from threshold.ts (integer p/q arithmetic), never from a floating point comparison with t.
 *
 * Methods (each adds one filter to the one before):
 * - length:   every pair whose sizes pass the length filter t·|x| ≤ |y| ≤ |x|/t;
 * - prefix:   only pairs that share an id in their prefixes, found through an inverted index
 *             of prefixes (one counter per indexed set, reused, with a touched list);
 * - position: drops a candidate as soon as the ids left after a shared one cannot bring the
 *             overlap up to the required α;
 * - bitmap:   position plus the bitmap filter (bitmap.ts), which drops most pairs that share a
 *             rare id by chance before their state is touched (on the benchmark's million sets,
 *             28.4M verified pairs → 6.7M). Self-join only; joinAgainst runs position for it;
 * - auto:     the fastest exact one for the collection: bitmap from BITMAP_MIN_IDS ids on,
 *             position below (see server/bench/join.ts).
 * Survivors are verified by merging the two arrays from just after the last shared prefix id,
 * stopping as soon as α is out of reach. The self-join works on the sets packed into one
 * Int32Array (packed.ts).
 */

/** Jaccard similarity from an overlap and the two sizes, as a double (display only). 0 for two empty sets. */
export function jaccard(overlap: number, sizeA: number, sizeB: number): number {
  const union = sizeA + sizeB - overlap;
  return union === 0 ? 0 : overlap / union;
}

/**
 * Every pair a < b of `sets` with Jaccard similarity ≥ t, sorted by (a, b). Empty sets pair
 * with nothing.
 *
 * @example
 * selfJoin([Int32Array.of(0, 1, 2, 3, 4), Int32Array.of(0, 1, 2, 3, 4, 5), Int32Array.of(6)], parseThreshold('0.8'))
 * // [{ a: 0, b: 1, overlap: 5 }]  (5/6 ≥ 0.8)
 * @throws when a set is not ascending and duplicate-free, or holds a negative id
 */
export function selfJoin(sets: readonly Int32Array[], t: Threshold, options: JoinOptions = {}): SetPair[] {
  checkSets(sets, 'set');
  const stats = options.stats;
  const algorithm = options.algorithm ?? 'auto';
  let pairs: SetPair[];
  switch (algorithm) {
    case 'brute':
      return bruteSelfJoin(sets, t, stats);
    case 'length':
      pairs = selfJoinByLength(sets, t, stats);
      break;
    case 'prefix':
      pairs = selfJoinByPrefix(sets, t, false, false, stats, options.profile);
      break;
    case 'position':
    case 'bitmap':
    case 'auto': {
      const bitmap = algorithm === 'bitmap' || (algorithm === 'auto' && totalIds(sets) >= BITMAP_MIN_IDS);
      pairs = selfJoinByPrefix(sets, t, true, bitmap, stats, options.profile);
      break;
    }
      break;
    default:
      throw new Error(`unknown algorithm "${String(algorithm)}"`);
  }
  if (stats) stats.results += pairs.length;
  return sortPairs(pairs);
}

/**
 * Every pair (a in probe, b in indexed) with Jaccard similarity ≥ t, sorted by (a, b): what
 * incremental loading needs (new sets against the collection already indexed). Both sides must
 * be ranked in the same global order.
 *
 * @example
 * joinAgainst([Int32Array.of(0, 1, 2, 3)], [Int32Array.of(5), Int32Array.of(0, 1, 2, 3, 4)], parseThreshold('0.8'))
 * // [{ a: 0, b: 1, overlap: 4 }]
 * @throws when a set is not ascending and duplicate-free, or holds a negative id
 */
export function joinAgainst(
  probe: readonly Int32Array[],
  indexed: readonly Int32Array[],
  t: Threshold,
  options: JoinOptions = {},
): SetPair[] {
  checkSets(probe, 'probe set');
  checkSets(indexed, 'indexed set');
  const stats = options.stats;
  const algorithm = options.algorithm ?? 'auto';
  let pairs: SetPair[];
  switch (algorithm) {
    case 'brute':
      return bruteJoinAgainst(probe, indexed, t, stats);
    case 'length':
      pairs = joinAgainstByLength(probe, indexed, t, stats);
      break;
    case 'prefix':
      pairs = joinAgainstByPrefix(probe, indexed, t, false, stats, options.profile);
      break;
    case 'position':
    case 'bitmap':
    case 'auto':
      pairs = joinAgainstByPrefix(probe, indexed, t, true, stats, options.profile);
      break;
    default:
      throw new Error(`unknown algorithm "${String(algorithm)}"`);
  }
  if (stats) stats.results += pairs.length;
  return sortPairs(pairs);
}

/**
 * From how many ids in all (the sum of the set sizes) 'auto' uses the bitmap filter. Below it
 * the candidates' ids mostly sit in the cache, a merge that fails is cheap, and the filter's
 * per-entry cost does not pay back. Measured on the benchmark's collections (server/bench/join.ts)
 * on this 2-core machine, CPU time of bitmap against position: 10M ids (100k sets) +25%, 30M ids
 * (300k sets) from −8% to +30% over four runs, 100M ids (1M sets) −25%.
 */
export const BITMAP_MIN_IDS = 50_000_000;

function totalIds(sets: readonly Int32Array[]): number {
  let total = 0;
  for (const set of sets) total += set.length;
  return total;
}

/** Largest id over all sets (−1 when there is none), after checking each set's shape. */
function checkSets(sets: readonly Int32Array[], what: string): number {
  let max = -1;
  for (let s = 0; s < sets.length; s++) {
    const set = sets[s];
    if (!(set instanceof Int32Array)) throw new Error(`${what} ${s} is not an Int32Array`);
    if (set.length > 0 && set[0] < 0) throw new Error(`${what} ${s} holds a negative id (${set[0]})`);
    for (let i = 1; i < set.length; i++) {
      if (set[i] <= set[i - 1]) {
        throw new Error(`${what} ${s} is not ascending and duplicate-free at position ${i} (${set[i - 1]}, ${set[i]})`);
      }
    }
    if (set.length > 0 && set[set.length - 1] > max) max = set[set.length - 1];
  }
  return max;
}

function sortPairs(pairs: SetPair[]): SetPair[] {
  return pairs.sort((x, y) => x.a - y.a || x.b - y.b);
}

/**
 * Indexes of the non-empty sets, ordered by size (counting sort, so equal sizes keep index
 * order). Empty sets are dropped: they pair with nothing.
 */
function bySize(sets: readonly Int32Array[]): Int32Array {
  let maxSize = 0;
  let nonEmpty = 0;
  for (const set of sets) {
    if (set.length > maxSize) maxSize = set.length;
    if (set.length > 0) nonEmpty++;
  }
  const start = new Int32Array(maxSize + 2);
  for (const set of sets) if (set.length > 0) start[set.length + 1]++;
  for (let s = 1; s < start.length; s++) start[s] += start[s - 1];
  const order = new Int32Array(nonEmpty);
  for (let i = 0; i < sets.length; i++) if (sets[i].length > 0) order[start[sets[i].length]++] = i;
  return order;
}

/** A pair in input numbering, a < b. */
function selfPair(u: number, v: number, overlap: number): SetPair {
  return u < v ? { a: u, b: v, overlap } : { a: v, b: u, overlap };
}

function selfJoinByLength(sets: readonly Int32Array[], t: Threshold, stats?: JoinStats): SetPair[] {
  const order = bySize(sets);
  const pairs: SetPair[] = [];
  let candidates = 0;
  let first = 0; // first processed set whose size reaches the current lower bound (monotone)
  for (let k = 0; k < order.length; k++) {
    const x = sets[order[k]];
    const lower = sizeBounds(t, x.length)[0];
    while (sets[order[first]].length < lower) first++;
    for (let m = first; m < k; m++) {
      const y = sets[order[m]];
      candidates++;
      const overlap = overlapAtLeast(x, y, minOverlap(t, x.length, y.length));
      if (overlap >= 0 && reaches(t, x.length, y.length, overlap)) pairs.push(selfPair(order[k], order[m], overlap));
    }
  }
  if (stats) {
    stats.candidates += candidates;
    stats.verified += candidates;
  }
  return pairs;
}

/**
 * The inverted index of prefixes in compressed rows: entries of id w are
 * [listStart[w], listStart[w+1]). Entry e is stored interleaved at entries[3e..3e+2] as (size of
 * the set, the set's number in size order, position of w in the set), so walking a list reads
 * one cache line instead of three arrays. Entries are appended in size order, so each list is
 * sorted by size.
 */
interface PrefixIndex {
  listStart: Int32Array;
  entries: Int32Array;
}

const SIZE = 0;
const SET = 1;
const POSITION = 2;
/** Packed index only (entries are ENTRY wide there): where the set starts in the packed data, and its bitmap signature. */
const START = 3;
const SIGNATURE = 4;
const ENTRY = 4 + SIGNATURE_WORDS;

function buildPrefixIndex(
  sets: readonly Int32Array[],
  order: Int32Array,
  prefixOf: (size: number) => number,
  vocabulary: number,
): PrefixIndex {
  const listStart = new Int32Array(vocabulary + 1);
  let total = 0;
  for (let k = 0; k < order.length; k++) {
    const set = sets[order[k]];
    const prefix = prefixOf(set.length);
    total += prefix;
    for (let i = 0; i < prefix; i++) listStart[set[i] + 1]++;
  }
  for (let w = 1; w <= vocabulary; w++) listStart[w] += listStart[w - 1];
  const fill = listStart.slice(0, vocabulary);
  const entries = new Int32Array(total * 3);
  for (let k = 0; k < order.length; k++) {
    const set = sets[order[k]];
    const prefix = prefixOf(set.length);
    for (let i = 0; i < prefix; i++) {
      const e = 3 * fill[set[i]]++;
      entries[e + SIZE] = set.length;
      entries[e + SET] = k;
      entries[e + POSITION] = i;
    }
  }
  return { listStart, entries };
}

/**
 * Per-candidate state in typed arrays indexed by the indexed set's number, reset through the
 * touched list after each probe: no object per candidate. count −1 marks a candidate the
 * position filter dropped (it must not come back when a later prefix id matches).
 */
interface Candidates {
  count: Int32Array;
  lastX: Int32Array;
  lastY: Int32Array;
  touched: Int32Array;
}

function newCandidates(size: number): Candidates {
  return {
    count: new Int32Array(size),
    lastX: new Int32Array(size),
    lastY: new Int32Array(size),
    touched: new Int32Array(size),
  };
}

/**
 * Self-join in size order (AllPairs/PPJoin style) over the packed sets.
 *
 * Indexing prefix. Set y is indexed with the short prefix |y| − α(y, y) + 1 (α(y, y) =
 * ⌈2t/(1+t)·|y|⌉), not the probing prefix |y| − ⌈t·|y|⌉ + 1. Why that is enough: sets are
 * processed in non-decreasing size and each set x probes only the sets before it, so every
 * partner y of x has |y| ≤ |x| and the pair needs α(x, y) ≥ α(y, y) shared ids (α grows with
 * either size). If x and y reach t they share ≥ α(x, y) ids; the ids of y after its first
 * |y| − α(x, y) + 1 ≤ |y| − α(y, y) + 1 positions number at most α(x, y) − 1, so at least one
 * shared id lies in y's short prefix, and (by the same count with |x| − ⌈t|x|⌉ + 1 ≥
 * |x| − α(x, y) + 1, since α(x, y) ≥ ⌈t·|x|⌉ for |y| ≥ ⌈t·|x|⌉) the first shared id of the pair
 * lies in both prefixes. Only valid for this order: a set indexed before a larger partner
 * probes it would be missed, hence joinAgainst indexes the full probing prefix.
 *
 * Each set is appended to the index right after its own probe, so x only ever meets sets
 * processed before it, and each list holds its sets in processing order (ascending size).
 *
 * Probe of x, at each prefix position i:
 * - length filter: sizes only grow along the processing order, so each list's too-small head
 *   (|y| < ⌈t·|x|⌉) is skipped once and for all by moving its start;
 * - position filter (DESIGN.md): on a shared id at positions i in x and j in y, with c shared ids
 *   counted before it, the overlap is at most c + 1 + min(|x| − i − 1, |y| − j − 1); below
 *   α(x, y) the pair is dropped for good (count −1). c counts every id x and y share before
 *   positions i and j: those of x precede i in x's probe prefix and those of y precede j, inside
 *   y's indexed prefix, so the probe met them all;
 * - size cut: a pair first met at position i has c = 0, so it survives only if |x| − i ≥ α(x, y);
 *   α grows with |y| and the list ascends in size, so the walk stops at the first size past
 *   that bound. Entries cut off this way that belong to pairs already counted are not updated;
 *   their verification then resumes from the last update, which is still exact (overlapFrom);
 * - entry check: the position bound with c = 0 on the y side, |y| − j ≥ α(x, y), read from the
 *   entry alone. A pair first met at an entry failing it cannot reach α (this is its first
 *   shared id, so the position bound is exact); an entry of a pair already counted is skipped
 *   like a size-cut one. Later shared ids sit further right in y, so such a pair never becomes
 *   a candidate through a later entry either;
 * - bitmap filter (auto only): ⌊(|x| + |y| − h)/2⌋ < α(x, y), h = differing signature bits.
 * Verification (every surviving pair) resumes the merge just after the last shared id the probe
 * saw, with the overlap counted so far.
 */
function selfJoinByPrefix(
  sets: readonly Int32Array[],
  t: Threshold,
  usePosition: boolean,
  useBitmap: boolean,
  stats?: JoinStats,
  profile?: JoinProfile,
): SetPair[] {
  let clock = profile ? performance.now() : 0;
  const { data, start, order } = packBySize(sets);
  const count = order.length;
  let vocabulary = 0;
  for (let m = 0; m < count; m++) if (data[start[m + 1] - 1] + 1 > vocabulary) vocabulary = data[start[m + 1] - 1] + 1;
  const listStart = listCapacities(data, start, t, vocabulary);
  // Entries are 4 ids wide, 8 with the signature (aligned either way).
  const stride = useBitmap ? ENTRY : SIGNATURE;
  const entries = new Int32Array(stride * listStart[vocabulary]);
  // Lists hold processed sets only: [listHead[w], listEnd[w]). Each set is appended after its
  // probe, at the tails of lists the probe has just read (its short prefix lies within its
  // probing prefix), so the writes mostly hit the cache; a list with nothing live is passed
  // over without reading its entries.
  const listEnd = listStart.slice(0, vocabulary);
  const listHead = listStart.slice(0, vocabulary);
  // Per-candidate state interleaved, one 32-byte slot per set (count, last x position, last y
  // position, start and size of y), so a list entry costs one cache miss, not three, and the
  // verification finds y without reading `start`; reset through the touched list.
  const state = new Int32Array(8 * count);
  const signatureX = new Int32Array(SIGNATURE_WORDS);
  const touched = new Int32Array(count);
  // α(x, y) for the sizes of y in x's length window, indexed by |y| − lower; refilled per x.
  let required = new Int32Array(64);
  if (profile) clock = lap(profile, 'indexMs', clock);
  const pairs: SetPair[] = [];
  let candidates = 0;
  let verified = 0;

  for (let k = 0; k < count; k++) {
    const x0 = start[k];
    const sizeX = start[k + 1] - x0;
    const lower = sizeBounds(t, sizeX)[0];
    if (sizeX - lower + 1 > required.length) required = new Int32Array(2 * (sizeX - lower + 1));
    for (let size = lower; size <= sizeX; size++) required[size - lower] = minOverlap(t, sizeX, size);
    const probe = prefixLength(t, sizeX);
    if (useBitmap) writeSignature(data, x0, x0 + sizeX, signatureX, 0);
    // Largest |y| a pair first met at the current position may have (size cut, see above).
    let newUpTo = sizeX;
    let touchedCount = 0;
    for (let i = 0; i < probe; i++) {
      const w = data[x0 + i];
      if (usePosition) while (newUpTo >= lower && required[newUpTo - lower] > sizeX - i) newUpTo--;
      const end = stride * listEnd[w];
      let e = stride * listHead[w];
      if (e === end) continue;
      while (e < end && entries[e + SIZE] < lower) e += stride;
      listHead[w] = e / stride;
      for (; e < end; e += stride) {
        const y = entries[e + SET];
        const sizeY = entries[e + SIZE];
        const j = entries[e + POSITION];
        if (usePosition) {
          if (sizeY > newUpTo) break;
          // Entry check: with nothing counted before, y's ids from j on cannot bring the pair
          // up to α. Skipped without reading y's state (no cache miss): a pair first met here
          // is no candidate, and a pair already counted keeps its last update (see above).
          if (sizeY - j < required[sizeY - lower]) continue;
        }
        // Bitmap filter: the same bound at every entry of the pair, so a pair it drops is
        // never touched at all.
        if (useBitmap && overlapBound(signatureX, 0, sizeX, entries, e + SIGNATURE, sizeY) < required[sizeY - lower]) continue;
        const slot = 8 * y;
        const c = state[slot];
        if (c < 0) continue;
        if (c === 0) {
          touched[touchedCount++] = y;
          state[slot + 3] = entries[e + START];
          state[slot + 4] = sizeY;
        }
        if (usePosition) {
          const restX = sizeX - i - 1;
          const restY = sizeY - j - 1;
          if (c + 1 + (restX < restY ? restX : restY) < required[sizeY - lower]) {
            state[slot] = -1;
            continue;
          }
        }
        state[slot] = c + 1;
        state[slot + 1] = i;
        state[slot + 2] = j;
      }
    }
    candidates += touchedCount;
    if (profile) clock = lap(profile, 'probeMs', clock);
    for (let n = 0; n < touchedCount; n++) {
      const m = touched[n];
      const slot = 8 * m;
      const c = state[slot];
      state[slot] = 0;
      if (c < 0) continue;
      verified++;
      const y0 = state[slot + 3];
      const sizeY = state[slot + 4];
      const overlap = overlapFrom(data, x0, x0 + sizeX, y0, y0 + sizeY, x0 + state[slot + 1] + 1, y0 + state[slot + 2] + 1, c, required[sizeY - lower]);
      if (overlap >= 0 && reaches(t, sizeX, sizeY, overlap)) pairs.push(selfPair(order[k], order[m], overlap));
    }
    if (profile) clock = lap(profile, 'verifyMs', clock);
    // Index x with its short prefix |x| − α(x, x) + 1 (α(x, x) is required[|x| − lower]).
    const indexPrefix = sizeX - required[sizeX - lower] + 1;
    for (let i = 0; i < indexPrefix; i++) {
      const e = stride * listEnd[data[x0 + i]]++;
      entries[e + SIZE] = sizeX;
      entries[e + SET] = k;
      entries[e + POSITION] = i;
      entries[e + START] = x0;
      if (useBitmap) for (let b = 0; b < SIGNATURE_WORDS; b++) entries[e + SIGNATURE + b] = signatureX[b];
    }
    if (profile) clock = lap(profile, 'indexMs', clock);
  }
  if (stats) {
    stats.candidates += candidates;
    stats.verified += verified;
  }
  return pairs;
}

/**
 * Offsets of the self-join's inverted lists (compressed rows): list w gets one slot per set
 * whose short prefix |y| − α(y, y) + 1 holds w; listStart[vocabulary] is the total.
 */
function listCapacities(data: Int32Array, start: Int32Array, t: Threshold, vocabulary: number): Int32Array {
  const listStart = new Int32Array(vocabulary + 1);
  for (let m = 0; m + 1 < start.length; m++) {
    const size = start[m + 1] - start[m];
    const prefix = size - minOverlap(t, size, size) + 1;
    for (let i = 0; i < prefix; i++) listStart[data[start[m] + i] + 1]++;
  }
  for (let w = 1; w <= vocabulary; w++) listStart[w] += listStart[w - 1];
  return listStart;
}

/** Adds the time since `since` to one phase and returns the new clock. */
function lap(profile: JoinProfile, phase: keyof JoinProfile, since: number): number {
  const now = performance.now();
  profile[phase] += now - since;
  return now;
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

function joinAgainstByLength(
  probe: readonly Int32Array[],
  indexed: readonly Int32Array[],
  t: Threshold,
  stats?: JoinStats,
): SetPair[] {
  const order = bySize(indexed);
  const sizes = new Int32Array(order.length);
  for (let m = 0; m < order.length; m++) sizes[m] = indexed[order[m]].length;
  const pairs: SetPair[] = [];
  let candidates = 0;
  for (let a = 0; a < probe.length; a++) {
    const x = probe[a];
    if (x.length === 0) continue;
    const [lower, upper] = sizeBounds(t, x.length);
    let m = 0;
    for (let hi = sizes.length; m < hi; ) {
      const mid = (m + hi) >>> 1;
      if (sizes[mid] < lower) m = mid + 1;
      else hi = mid;
    }
    for (; m < sizes.length && sizes[m] <= upper; m++) {
      const y = indexed[order[m]];
      candidates++;
      const overlap = overlapAtLeast(x, y, minOverlap(t, x.length, y.length));
      if (overlap >= 0 && reaches(t, x.length, y.length, overlap)) pairs.push({ a, b: order[m], overlap });
    }
  }
  if (stats) {
    stats.candidates += candidates;
    stats.verified += candidates;
  }
  return pairs;
}

/**
 * Probe sets against an index of the other collection. The indexed sets arrive in any size
 * order relative to the probes, so they are indexed with the full probing prefix (the short
 * self-join prefix would need the probe to be the larger set).
 */
function joinAgainstByPrefix(
  probe: readonly Int32Array[],
  indexed: readonly Int32Array[],
  t: Threshold,
  usePosition: boolean,
  stats?: JoinStats,
  profile?: JoinProfile,
): SetPair[] {
  let clock = profile ? performance.now() : 0;
  const order = bySize(indexed);
  let vocabulary = 0;
  for (const set of indexed) if (set.length > 0 && set[set.length - 1] + 1 > vocabulary) vocabulary = set[set.length - 1] + 1;
  const { listStart, entries } = buildPrefixIndex(indexed, order, (size) => prefixLength(t, size), vocabulary);
  const { count, lastX, lastY, touched } = newCandidates(order.length);
  if (profile) clock = lap(profile, 'indexMs', clock);
  const pairs: SetPair[] = [];
  let candidates = 0;
  let verified = 0;

  for (let a = 0; a < probe.length; a++) {
    const x = probe[a];
    const sizeX = x.length;
    if (sizeX === 0) continue;
    const [lower, upper] = sizeBounds(t, sizeX);
    const prefix = prefixLength(t, sizeX);
    let touchedCount = 0;
    for (let i = 0; i < prefix; i++) {
      const w = x[i];
      if (w >= vocabulary) continue;
      const end = 3 * listStart[w + 1];
      for (let e = 3 * firstAtLeast(entries, listStart[w], listStart[w + 1], lower); e < end; e += 3) {
        const sizeY = entries[e + SIZE];
        if (sizeY > upper) break;
        const y = entries[e + SET];
        const c = count[y];
        if (c < 0) continue;
        if (c === 0) touched[touchedCount++] = y;
        const j = entries[e + POSITION];
        if (usePosition) {
          const restX = sizeX - i - 1;
          const restY = sizeY - j - 1;
          if (c + 1 + (restX < restY ? restX : restY) < minOverlap(t, sizeX, sizeY)) {
            count[y] = -1;
            continue;
          }
        }
        count[y] = c + 1;
        lastX[y] = i;
        lastY[y] = j;
      }
    }
    candidates += touchedCount;
    if (profile) clock = lap(profile, 'probeMs', clock);
    for (let n = 0; n < touchedCount; n++) {
      const m = touched[n];
      const c = count[m];
      count[m] = 0;
      if (c < 0) continue;
      verified++;
      const y = indexed[order[m]];
      const overlap = overlapAtLeast(x, y, minOverlap(t, sizeX, y.length), lastX[m] + 1, lastY[m] + 1, c);
      if (overlap >= 0 && reaches(t, sizeX, y.length, overlap)) pairs.push({ a, b: order[m], overlap });
    }
    if (profile) clock = lap(profile, 'verifyMs', clock);
  }
  if (stats) {
    stats.candidates += candidates;
    stats.verified += verified;
  }
  return pairs;
}
