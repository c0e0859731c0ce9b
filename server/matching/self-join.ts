import { overlapBound, SIGNATURE_WORDS, writeSignature } from './bitmap';
import { ENTRY, POSITION, SET, SIGNATURE, SIZE, START } from './entry-layout';
import { lap, selfPair } from './join-helpers';
import { overlapFrom, packBySize } from './packed';
import { minOverlap, prefixLength, reaches, sizeBounds, type Threshold } from './threshold';
import type { JoinProfile, JoinStats, SimilarPair } from './types';

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
 * - position filter (DEVELOPERS.md): on a shared id at positions i in x and j in y, with c shared ids
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
export function selfJoinByPrefix(
  sets: readonly Int32Array[],
  t: Threshold,
  usePosition: boolean,
  useBitmap: boolean,
  stats?: JoinStats,
  profile?: JoinProfile,
): SimilarPair[] {
  let clock = profile ? performance.now() : 0;
  const { data, start, order } = packBySize(sets);
  const count = order.length;
  let vocabulary = 0;
  for (let m = 0; m < count; m++) if (data[start[m + 1] - 1] + 1 > vocabulary) vocabulary = data[start[m + 1] - 1] + 1;
  const listStart = listCapacities(data, start, t, vocabulary);
  // Entries are 4 ids wide, 8 with the signature (aligned either way).
  const stride = useBitmap ? ENTRY : SIGNATURE;
  const entries = new Int32Array(stride * listStart[vocabulary]);
  // Lists hold processed sets only: entries [bounds[2w], bounds[2w + 1]) (head and end side by
  // side, so a probe pays one cache miss per id for both). Each set is appended after its
  // probe, at the tails of lists the probe has just read (its short prefix lies within its
  // probing prefix), so the writes mostly hit the cache; a list with nothing live is passed
  // over without reading its entries.
  const bounds = new Int32Array(2 * vocabulary);
  for (let w = 0; w < vocabulary; w++) bounds[2 * w] = bounds[2 * w + 1] = listStart[w];
  // Per-candidate state interleaved, one 32-byte slot per set (count, last x position, last y
  // position, start and size of y), so a list entry costs one cache miss, not three, and the
  // verification finds y without reading `start`; reset through the touched list.
  const state = new Int32Array(8 * count);
  const signatureX = new Int32Array(SIGNATURE_WORDS);
  const touched = new Int32Array(count);
  // α(x, y) for the sizes of y in x's length window, indexed by |y| − lower; refilled per x.
  let required = new Int32Array(64);
  if (profile) clock = lap(profile, 'indexMs', clock);
  const pairs: SimilarPair[] = [];
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
      const last = bounds[2 * w + 1];
      let head = bounds[2 * w];
      if (head === last) continue;
      while (head < last && entries[stride * head + SIZE] < lower) head++;
      bounds[2 * w] = head;
      const end = stride * last;
      let e = stride * head;
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
      const e = stride * bounds[2 * data[x0 + i] + 1]++;
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
