/**
 * The write path of the index: adding shingle sets (content-addressed), their prefix entries, and
 * the set pairs their probes find. The read path (probing, loading sets) is probe.ts.
 */
import { createHash } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { prefixLength, type Threshold } from '../matching/threshold';
import { resolveShingles, toRankArray } from './dictionary';
import type { GrowingIndexMatch } from '../matching/growing-index';
import { jaccard } from '../matching/similarity';
import { useMirror, type MirrorSession, type MirrorUse } from './mirror';
import { indexThreshold } from './options';
import { probeSets, type ProbeTimings } from './probe';
import { chunks, copyRows, execute, lockIndex, select } from './sql';

/** Content address of a shingle set: sha-1 of its sorted shingles (unambiguous: JSON). */
export function setHash(shingles: string[]): string {
  const sorted = [...shingles].sort();
  return createHash('sha1').update(JSON.stringify(sorted)).digest('hex');
}

/** What addSets reports. */
export interface AddSetsResult {
  /** the stored set id of each input, in input order */
  setIds: number[];
  newSetCount: number;
  newPairCount: number;
  candidates: number;
  /**
   * Milliseconds. store = dictionary + sets + prefix entries; probe = the probe + pair writes: in
   * memory (mirror: bringing the mirror up to date, memory: probing and verifying there), or
   * through PostgreSQL (hits: the hit queries, load: reading candidate sets, verify).
   */
  timings: { store: number; probe: number; mirror: number; memory: number; hits: number; load: number; verify: number; dictionary: number; prefixes: number };
  /** where the new sets were probed, and why not in memory when they were not */
  probedIn: 'memory' | 'database';
  probeReason?: string;
}

/** Options of addSets. */
export interface AddSetsOptions {
  /** how many new sets one probe query carries (through PostgreSQL); results do not depend on it */
  batchSize?: number;
  /**
   * Where new sets are probed: 'auto' (default) in the process's mirror of the index when it is up
   * to date or cheap to bring up to date, else through PostgreSQL; 'memory' always in the mirror
   * (unless it is off or over its memory limit); 'database' always through PostgreSQL. Results do
   * not depend on it.
   */
  probe?: 'auto' | 'memory' | 'database';
  /**
   * Called after each probe batch with the new sets probed so far and their number (a load's
   * progress); may throw to stop the load, which rolls the transaction back.
   */
  onProgress?: (done: number, total: number) => void;
}

const WRITE_CHUNK = 20_000;

/**
 * Adds shingle sets to the index. Only sets never seen before (by hash) are stored, written to the
 * prefix table and probed; the probe finds every stored set (old or new) within the index threshold
 * and records the pair once. Invariant kept: set_pairs holds every pair of distinct stored sets
 * whose Jaccard similarity reaches the index threshold. Runs under the index write lock in `tx`.
 */
export async function addSets(
  tx: Transaction,
  sets: { hash: string; shingles: string[] }[],
  options: AddSetsOptions = {},
): Promise<AddSetsResult> {
  const started = performance.now();
  await lockIndex(tx);
  const idByHash = await existingSetIds(tx, [...new Set(sets.map((s) => s.hash))]);
  const fresh = new Map<string, string[]>();
  for (const s of sets) if (!idByHash.has(s.hash) && s.shingles.length > 0) fresh.set(s.hash, s.shingles);

  const mark = performance.now();
  const use: MirrorUse =
    options.probe === 'database' || fresh.size === 0 ? { mirror: undefined, reason: options.probe === 'database' ? 'asked' : 'nothing new' } : await useMirror(tx, fresh.size, options.probe ?? 'auto');
  const mirrorMs = performance.now() - mark;

  const storeTimings = { dictionary: 0, prefixes: 0 };
  const newSets = await storeNewSets(tx, fresh, idByHash, storeTimings);
  const stored = performance.now();
  options.onProgress?.(0, newSets.length);
  const batchSize = options.batchSize ?? 1000;
  const probed = use.mirror ? probeInMemory(use.mirror, newSets, batchSize, options.onProgress) : await probeNewSets(tx, newSets, batchSize, options.onProgress);
  const { pairs, candidates, timings } = probed;
  await writePairs(tx, pairs);
  const emptyIds = await storeEmptySets(tx, sets, idByHash);
  return {
    setIds: sets.map((s) => idByHash.get(s.hash) ?? emptyIds.get(s.hash)!),
    newSetCount: newSets.length,
    newPairCount: pairs.length,
    candidates,
    timings: { store: stored - started - mirrorMs, probe: performance.now() - stored + mirrorMs, mirror: mirrorMs, ...timings, ...storeTimings },
    probedIn: use.mirror ? 'memory' : 'database',
    probeReason: use.mirror ? undefined : use.reason,
  };
}

async function existingSetIds(tx: Transaction, hashes: string[]) {
  const ids = new Map<string, number>();
  for (const [start, end] of chunks(hashes.length, WRITE_CHUNK)) {
    const rows = await select<{ id: number; hash: string }>(
      tx,
      'select id, hash from shingle_sets where hash = any($1::text[])',
      [hashes.slice(start, end)],
    );
    for (const row of rows) ids.set(row.hash, row.id);
  }
  return ids;
}

/** An empty set (a fragment shorter than one shingle) is stored but never indexed: it pairs with nothing. */
async function storeEmptySets(tx: Transaction, sets: { hash: string; shingles: string[] }[], known: Map<string, number>) {
  const ids = new Map<string, number>();
  const empty = [...new Set(sets.filter((s) => s.shingles.length === 0 && !known.has(s.hash)).map((s) => s.hash))];
  if (empty.length === 0) return ids;
  const rows = await select<{ id: number; hash: string }>(
    tx,
    `insert into shingle_sets (hash, size, ranks) select h, 0, '{}' from unnest($1::text[]) as h
     returning id, hash`,
    [empty],
  );
  for (const row of rows) ids.set(row.hash, row.id);
  return ids;
}

interface NewSet {
  id: number;
  ranks: Int32Array;
}

async function storeNewSets(
  tx: Transaction,
  fresh: Map<string, string[]>,
  idByHash: Map<string, number>,
  timings: { dictionary: number; prefixes: number },
): Promise<NewSet[]> {
  if (fresh.size === 0) return [];
  let mark = performance.now();
  const documentFrequency = new Map<string, number>();
  for (const shingles of fresh.values()) {
    for (const s of shingles) documentFrequency.set(s, (documentFrequency.get(s) ?? 0) + 1);
  }
  const ranks = await resolveShingles(tx, documentFrequency);
  timings.dictionary += performance.now() - mark;
  const hashes = [...fresh.keys()];
  const rankArrays = hashes.map((h) => toRankArray(fresh.get(h)!, ranks));
  // Ids drawn as one block, then the rows go in by COPY (which cannot return them). Only loads
  // holding the index write lock insert sets, so nothing else draws from the sequence meanwhile.
  const [{ first }] = await select<{ first: number }>(
    tx,
    `select (setval(pg_get_serial_sequence('shingle_sets', 'id'), nextval(pg_get_serial_sequence('shingle_sets', 'id')) + $1 - 1) - $1 + 1)::int as first`,
    [hashes.length],
  );
  const newSets: NewSet[] = hashes.map((hash, i) => ({ id: first + i, ranks: rankArrays[i] }));
  hashes.forEach((hash, i) => idByHash.set(hash, first + i));
  await copyRows(tx, 'shingle_sets', ['id', 'hash', 'size', 'ranks'], [
    { type: 'int4', values: newSets.map((s) => s.id) },
    { type: 'text', values: hashes },
    { type: 'int4', values: rankArrays.map((r) => r.length) },
    { type: 'int4[]', values: rankArrays },
  ]);
  mark = performance.now();
  await writePrefixEntries(tx, newSets, indexThreshold);
  timings.prefixes += performance.now() - mark;
  return newSets;
}

/** Writes the probing prefix of each set at threshold t (the shorter indexing prefix would be wrong: sets arrive in any size order). */
async function writePrefixEntries(tx: Transaction, sets: NewSet[], t: Threshold) {
  let total = 0;
  for (const s of sets) total += prefixLength(t, s.ranks.length);
  // Rows go in by rank, so the probe index (rank, size) takes them leaf after leaf instead of at
  // random: a third less time for 170k entries into an empty table, and fewer pages touched in a full one.
  const order = rankOrder(sets, t, total);
  const rank = new Int32Array(total);
  const setId = new Int32Array(total);
  const position = new Int32Array(total);
  const size = new Int32Array(total);
  let k = 0;
  for (const s of sets) {
    const length = prefixLength(t, s.ranks.length);
    for (let i = 0; i < length; i++, k++) {
      const at = order[k];
      rank[at] = s.ranks[i];
      setId[at] = s.id;
      position[at] = i;
      size[at] = s.ranks.length;
    }
  }
  await copyRows(tx, 'prefix_entries', ['rank', 'set_id', 'position', 'size'], [
    { type: 'int4', values: rank },
    { type: 'int4', values: setId },
    { type: 'int4', values: position },
    { type: 'int4', values: size },
  ]);
}

/** Entries a sort key can number: an unsigned rank (32 bits) and the entry's number fill a double's 53. */
const ENTRIES_PER_SORT = 2 ** 21;

/**
 * Where each prefix entry (numbered in set order) goes when the rows are written by rank: sorted
 * in groups of ENTRIES_PER_SORT, each group's keys packing the rank above the entry's number.
 */
export function rankOrder(sets: { ranks: Int32Array }[], t: Threshold, total: number, groupSize = ENTRIES_PER_SORT): Uint32Array {
  if (groupSize > ENTRIES_PER_SORT) throw new Error(`groups of at most ${ENTRIES_PER_SORT} entries`);
  const order = new Uint32Array(total);
  const keys = new Float64Array(Math.min(total, groupSize));
  let k = 0;
  let groupStart = 0;
  const flush = (end: number) => {
    const group = keys.subarray(0, end - groupStart);
    group.sort();
    for (let j = 0; j < group.length; j++) order[groupStart + (group[j] % ENTRIES_PER_SORT)] = groupStart + j;
    groupStart = end;
  };
  for (const s of sets) {
    const length = prefixLength(t, s.ranks.length);
    for (let i = 0; i < length; i++, k++) {
      if (k - groupStart === groupSize) flush(k);
      keys[k - groupStart] = (s.ranks[i] + 2 ** 31) * ENTRIES_PER_SORT + (k - groupStart);
    }
  }
  if (total > groupStart) flush(total);
  return order;
}

interface StoredPair {
  a: number;
  b: number;
  overlap: number;
  similarity: number;
}

async function writePairs(tx: Transaction, pairs: StoredPair[]) {
  for (const [start, end] of chunks(pairs.length, WRITE_CHUNK)) {
    const slice = pairs.slice(start, end);
    await execute(
      tx,
      `insert into set_pairs (set_a, set_b, overlap, similarity)
       select * from unnest($1::int[], $2::int[], $3::int[], $4::float8[]) on conflict do nothing`,
      [slice.map((p) => p.a), slice.map((p) => p.b), slice.map((p) => p.overlap), slice.map((p) => p.similarity)],
    );
  }
}

/**
 * Probes the new sets in the mirror: appended in id order, each is probed against every set with
 * a smaller id (old ones, and new ones before it), so each pair is found once.
 */
function probeInMemory(mirror: MirrorSession, newSets: NewSet[], batchSize: number, onProgress?: (done: number, total: number) => void) {
  const started = performance.now();
  const sets = [...newSets].sort((a, b) => a.id - b.id);
  const first = mirror.appendPending(sets);
  const pairs: StoredPair[] = [];
  const matches: GrowingIndexMatch[] = [];
  let candidates = 0;
  sets.forEach((x, k) => {
    matches.length = 0;
    candidates += mirror.index.probe(x.ranks, indexThreshold, first + k, matches);
    for (const m of matches) {
      const size = mirror.index.set(m.set).length;
      pairs.push({ a: mirror.setId(m.set), b: x.id, overlap: m.overlap, similarity: jaccard(m.overlap, x.ranks.length, size) });
    }
    if ((k + 1) % batchSize === 0 || k === sets.length - 1) onProgress?.(k + 1, sets.length);
  });
  return { pairs, candidates, timings: { memory: performance.now() - started, hits: 0, load: 0, verify: 0 } };
}

async function probeNewSets(tx: Transaction, newSets: NewSet[], batchSize: number, onProgress?: (done: number, total: number) => void) {
  const pairs = new Map<string, StoredPair>();
  let candidates = 0;
  const timings: ProbeTimings & { memory: number } = { memory: 0, hits: 0, load: 0, verify: 0 };
  // The filter is symmetric, so a pair of two new sets is found by both: only the probe with the
  // larger id keeps it, which halves the verification work among new sets.
  const isNew = new Set(newSets.map((s) => s.id));
  // New sets are known here already; stored sets loaded for one batch are often candidates of the next.
  const cache = new Map<number, Int32Array>(newSets.map((s) => [s.id, s.ranks]));
  // The probe queries are large but simple index lookups: compiling them (JIT) costs more than it saves.
  await execute(tx, 'set local jit = off');
  for (const [start, end] of chunks(newSets.length, Math.max(1, batchSize))) {
    const batch = newSets.slice(start, end);
    const result = await probeSets(
      tx,
      batch.map((s) => s.ranks),
      indexThreshold,
      (probe, setId) => setId >= batch[probe].id && isNew.has(setId),
      cache,
    );
    candidates += result.candidates;
    timings.hits += result.timings.hits;
    timings.load += result.timings.load;
    timings.verify += result.timings.verify;
    for (const m of result.matches) {
      const x = batch[m.probe];
      const a = Math.min(x.id, m.setId);
      const b = Math.max(x.id, m.setId);
      pairs.set(`${a}:${b}`, { a, b, overlap: m.overlap, similarity: m.similarity });
    }
    onProgress?.(end, newSets.length);
  }
  return { pairs: [...pairs.values()], candidates, timings };
}
