import { POSITION, SET, SIZE } from './entry-layout';
import { bySize, lap } from './join-helpers';
import { minOverlap, overlapAtLeast, prefixLength, reaches, sizeBounds, type Threshold } from './threshold';
import type { JoinProfile, JoinStats, SimilarPair } from './types';

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
 * Probe sets against an index of the other collection. The indexed sets arrive in any size
 * order relative to the probes, so they are indexed with the full probing prefix (the short
 * self-join prefix would need the probe to be the larger set).
 */
export function joinAgainstByPrefix(
  probe: readonly Int32Array[],
  indexed: readonly Int32Array[],
  t: Threshold,
  usePosition: boolean,
  stats?: JoinStats,
  profile?: JoinProfile,
): SimilarPair[] {
  let clock = profile ? performance.now() : 0;
  const order = bySize(indexed);
  let vocabulary = 0;
  for (const set of indexed) if (set.length > 0 && set[set.length - 1] + 1 > vocabulary) vocabulary = set[set.length - 1] + 1;
  const { listStart, entries } = buildPrefixIndex(indexed, order, (size) => prefixLength(t, size), vocabulary);
  const { count, lastX, lastY, touched } = newCandidates(order.length);
  if (profile) clock = lap(profile, 'indexMs', clock);
  const pairs: SimilarPair[] = [];
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
