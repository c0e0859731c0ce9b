/**
 * The read path of the index: probing the prefix table for the stored sets similar to probe sets
 * (hit query, candidate loading, verification), and loading stored sets. Writes are sets.ts.
 */
import type { Transaction } from 'sequelize';
import type { Threshold } from '../matching/threshold';
import { probeHitFilter, probeKeys, probeSizeBounds, verifyCandidates, type ProbeCandidate, type SetMatch } from './candidates';
import { chunks, intArrayLiteral, parseIntArray, select } from './sql';

/** Ids a load query carries at most. */
const LOAD_CHUNK = 20_000;
/** Most sets a probe cache keeps (at ~50 ranks a set, about 100 MB). */
const CACHE_LIMIT = 500_000;

/**
 * Probes the prefix table with probe sets: one SQL round trip per batch for the candidates (the
 * position filter runs in the database, so only hits that can matter travel, once per pair), one
 * for the candidates' sets, then verification here. `skip` drops a candidate before it is loaded.
 * `cache`, when given, keeps loaded sets for later calls in the same transaction under the index
 * write lock (no rank array can change there: a rebuild takes the same lock); sets found in it are
 * not loaded again.
 */
export async function probeSets(
  tx: Transaction | undefined,
  probes: Int32Array[],
  t: Threshold,
  skip: (probe: number, setId: number) => boolean,
  cache?: Map<number, Int32Array>,
): Promise<{ matches: SetMatch[]; candidates: number; timings: ProbeTimings }> {
  const timings: ProbeTimings = { hits: 0, load: 0, verify: 0 };
  let mark = performance.now();
  const query = probeHitQuery(probes, t);
  if (!query) return { matches: [], candidates: 0, timings };
  const [row] = await select<{ probe: string | null; setId: string | null; size: string | null }>(tx, query.sql, query.bind);
  const candidates: ProbeCandidate[] = [];
  if (row.probe !== null) {
    const probeOf = parseIntArray(row.probe);
    const setOf = parseIntArray(row.setId!);
    const sizeOf = parseIntArray(row.size!);
    for (let i = 0; i < probeOf.length; i++) {
      if (!skip(probeOf[i], setOf[i])) candidates.push({ probe: probeOf[i], setId: setOf[i], size: sizeOf[i] });
    }
  }
  timings.hits = performance.now() - mark;
  mark = performance.now();
  const wanted = [...new Set(candidates.map((c) => c.setId))];
  const stored = await loadSets(tx, cache ? wanted.filter((id) => !cache.has(id)) : wanted);
  if (cache) {
    // bounded: past CACHE_LIMIT sets (~4 bytes a rank) new loads are used once and not kept
    for (const [id, ranks] of stored) if (cache.size < CACHE_LIMIT) cache.set(id, ranks);
    for (const id of wanted) if (!stored.has(id)) stored.set(id, cache.get(id)!);
  }
  timings.load = performance.now() - mark;
  mark = performance.now();
  const matches = verifyCandidates(candidates, probes, stored, t);
  timings.verify = performance.now() - mark;
  return { matches, candidates: candidates.length, timings };
}

/**
 * The hit query of a probe batch, or undefined when no probe has a key. Its one row holds three
 * integer arrays as text (probe, setId, size: one element per candidate pair, position filter
 * applied): one row parsed by parseIntArray costs far less than a driver object per candidate.
 * Exported for profiling (EXPLAIN) in bench scripts.
 */
export function probeHitQuery(probes: Int32Array[], t: Threshold): { sql: string; bind: string[] } | undefined {
  // One (rank, probe, position, size) row per key, sent in rank order: consecutive index lookups
  // then land on the same or neighbouring pages of prefix_entries_probe (in bench:index this cut
  // the query's execution about threefold against probe order).
  let count = 0;
  const keyRanks = probes.map((x) => probeKeys(x, t).ranks);
  for (const r of keyRanks) count += r.length;
  if (count === 0) return undefined;
  const order = new Uint32Array(count);
  const rankOf = new Int32Array(count);
  const probeOf = new Int32Array(count);
  const positionOf = new Int32Array(count);
  let k = 0;
  keyRanks.forEach((ranks, p) => {
    for (let i = 0; i < ranks.length; i++, k++) {
      order[k] = k;
      rankOf[k] = ranks[i];
      probeOf[k] = p;
      positionOf[k] = i;
    }
  });
  order.sort((u, v) => rankOf[u] - rankOf[v] || u - v);
  const pick = (from: Int32Array) => Int32Array.from(order, (i) => from[i]);
  const probeColumn = pick(probeOf);
  const [lo, hi] = probeSizeBounds(t);
  return {
    sql: `select array_agg(probe)::text as probe, array_agg(set_id)::text as "setId", array_agg(size)::text as size
       from (select distinct p.probe, e.set_id, e.size
               from unnest($1::int[], $2::int[], $3::int[], $4::int[]) as p(rank, probe, pos, sz)
               join prefix_entries e
                 on e.rank = p.rank and e.size between ${lo} and ${hi}
              where ${probeHitFilter(t)}) as hits`,
    bind: [
      intArrayLiteral(pick(rankOf)),
      intArrayLiteral(probeColumn),
      intArrayLiteral(pick(positionOf)),
      intArrayLiteral(Int32Array.from(probeColumn, (i) => probes[i].length)),
    ],
  };
}

/** Where a probe's time went, in milliseconds: the hit query, loading candidate sets, verification. */
export interface ProbeTimings {
  hits: number;
  load: number;
  verify: number;
}

/** Rank arrays of stored sets by id. */
export async function loadSets(tx: Transaction | undefined, ids: number[]): Promise<Map<number, Int32Array>> {
  const sets = new Map<number, Int32Array>();
  for (const [start, end] of chunks(ids.length, LOAD_CHUNK)) {
    // One row per chunk: ids, sizes and every rank concatenated, all as text, parsed into typed
    // arrays and cut into views. A row per set cost a driver object and a parse call per set.
    // The three aggregates read the same ordered rows, so the k-th id, size and run of ranks agree
    // (string_agg skips the nulls of empty sets, whose run has length 0).
    const [row] = await select<{ ids: string | null; sizes: string | null; ranks: string | null }>(
      tx,
      `select array_agg(id)::text as ids, array_agg(size)::text as sizes,
              '{' || coalesce(string_agg(nullif(array_to_string(ranks, ','), ''), ','), '') || '}' as ranks
         from (select id, size, ranks from shingle_sets where id = any($1::int[]) order by id) as s`,
      [intArrayLiteral(ids.slice(start, end))],
    );
    if (row.ids === null) continue;
    const idOf = parseIntArray(row.ids);
    const sizeOf = parseIntArray(row.sizes!);
    const ranks = parseIntArray(row.ranks!);
    let offset = 0;
    for (let i = 0; i < idOf.length; i++) {
      sets.set(idOf[i], ranks.subarray(offset, offset + sizeOf[i]));
      offset += sizeOf[i];
    }
    if (offset !== ranks.length) throw new Error(`loaded ${ranks.length} ranks for sets totalling ${offset}`);
  }
  return sets;
}
