import { minOverlap, overlapAtLeast, prefixLength, reaches, sizeBounds, type Threshold } from '../matching/threshold';

/** One row of a probe: a prefix entry of an indexed set that shares a rank with a probe set's prefix. */
export interface ProbeHit {
  /** index of the probe set in the batch */
  probe: number;
  /** position of the shared rank in the probe set */
  probePosition: number;
  setId: number;
  /** position of the shared rank in the indexed set */
  position: number;
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
 * The prefix entries a probe of set `ranks` at threshold t looks up: its first prefixLength(t, |x|)
 * ranks, each with the range of partner sizes the length filter allows.
 */
export function probeKeys(ranks: Int32Array, t: Threshold) {
  const length = prefixLength(t, ranks.length);
  const [lo, hi] = sizeBounds(t, ranks.length);
  return { ranks: ranks.subarray(0, length), lo, hi };
}

/**
 * Applies the position filter to the hits of a probe batch and returns the candidate set ids that
 * survive, per probe. Hits must come grouped by probe and ascending by probePosition.
 *
 * Invariant: for a hit at positions i (probe) and j (indexed) with c shared ranks seen before it,
 * c is exactly |x[0..i) ∩ y[0..j)| (both prefixes are in the same global order), so
 * c + 1 + min(|x|−i−1, |y|−j−1) bounds the overlap; a candidate whose bound falls below the
 * required overlap can never reach the threshold and is dropped for good.
 */
export function positionFilter(
  hits: ProbeHit[],
  probeSizes: ArrayLike<number>,
  t: Threshold,
  skip: (probe: number, setId: number) => boolean,
): Map<number, number[]> {
  const survivors = new Map<number, number[]>();
  let current = -1;
  // per probe: setId → shared count so far, or −1 once pruned
  let seen = new Map<number, number>();
  const flush = () => {
    if (current < 0) return;
    const ids: number[] = [];
    for (const [setId, count] of seen) if (count > 0) ids.push(setId);
    if (ids.length) survivors.set(current, ids);
  };
  for (const hit of hits) {
    if (hit.probe !== current) {
      flush();
      current = hit.probe;
      seen = new Map();
    }
    if (skip(hit.probe, hit.setId)) continue;
    const c = seen.get(hit.setId) ?? 0;
    if (c < 0) continue;
    const xSize = probeSizes[hit.probe];
    const required = minOverlap(t, xSize, hit.size);
    const bound = c + 1 + Math.min(xSize - hit.probePosition - 1, hit.size - hit.position - 1);
    seen.set(hit.setId, bound >= required ? c + 1 : -1);
  }
  flush();
  return survivors;
}

/**
 * Verifies the surviving candidates by merging the sorted rank arrays, with early exit.
 * Returns only the pairs that reach the threshold, with their exact overlap.
 */
export function verifyCandidates(
  survivors: Map<number, number[]>,
  probes: Int32Array[],
  stored: Map<number, Int32Array>,
  t: Threshold,
): SetMatch[] {
  const matches: SetMatch[] = [];
  for (const [probe, setIds] of survivors) {
    const x = probes[probe];
    for (const setId of setIds) {
      const y = stored.get(setId);
      if (!y) throw new Error(`candidate set ${setId} was not loaded for verification`);
      const overlap = overlapAtLeast(x, y, minOverlap(t, x.length, y.length));
      if (overlap > 0 && reaches(t, x.length, y.length, overlap)) {
        matches.push({ probe, setId, size: y.length, overlap, similarity: overlap / (x.length + y.length - overlap) });
      }
    }
  }
  return matches;
}
