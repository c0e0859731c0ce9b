import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { QueryTypes } from 'sequelize';
import { findSimilarSets } from '../clone-index/find-copies';
import { addSets, setHash } from '../clone-index/sets';
import { connect, db, disconnect } from '../db/connection';
import { migrateUp } from '../db/migrate';
import { createDatabaseIfMissing, dropDatabase, ensureDatabaseServer } from '../db/postgres';
import { loadConfig } from '../config';
import { DEFAULT_REPOSITORY_SETTINGS } from '../../shared/constants';
import { parseThreshold } from '../matching/threshold';
import { formatBytes, formatCount, formatMs } from './format';
import { Collection, mix, random } from './synthetic';
import { compareTrees } from './trees';

/**
 * `npm run bench:index [-- --sizes 200000,1000000 --keep --seed 7 --queries 300 --time-limit 1140 --runs 3 --trees-only --skip-trees]`:
 * first loading a release through PostgreSQL against the in-memory scan of the same tree, on two
 * real trees (trees.ts; `--trees-only` stops there, `--skip-trees` leaves it out), then the prefix
 * index in PostgreSQL on synthetic shingle sets, printed as Markdown. Not a test: it measures, it does not judge.
 *
 * It works in a database of its own (`doublet_bench` on the local cluster, created fresh and dropped
 * at the end unless `--keep`), never in the development database. Stages are cumulative: the index
 * is loaded up to each size in turn, and at each size it measures
 * - the load of that stage (sets per second, store vs probe time, as addSets reports them);
 * - the probe of one batch of 10k new sets (a release's worth), in a transaction rolled back
 *   afterwards so the index keeps its size;
 * - single find-copies probes (findSimilarSets at 0.8) of near-copies of indexed sets and of fresh sets;
 * - the size of the index tables and their indexes.
 *
 * The synthetic sets imitate shingle sets of real functions:
 * - shingles `s<id>` drawn from a Zipf-like law (exponent 1 over 2^20 ids): a few shingles, think
 *   `) { return`, sit in most sets, most are rare; a repeated draw becomes `s<id>#2` as in real sets;
 * - sizes log-normal (median 48, σ 0.55, clamped to 8..800): most functions have 30–80 shingles, a
 *   long tail reaches a few hundred;
 * - 10% planted near-copies of an earlier set (0–20% of shingles dropped or replaced) and 2% exact
 *   copies (which addSets stores once).
 * Set i depends only on (seed, i), so a stage generates its sets on the fly and never holds the
 * whole collection in memory.
 */

const BENCH_DATABASE = 'doublet_bench';
const DEFAULT_SIZES = [200_000, 1_000_000];
/** Sets per addSets call (one transaction each), as a large snapshot would bring. */
const LOAD_CHUNK = 25_000;
/** New sets in the probe-rate measurement, and the probe batch size used everywhere. */
const PROBE_BATCH = 10_000;
const FIND_THRESHOLD = parseThreshold(String(DEFAULT_REPOSITORY_SETTINGS.threshold));
/** Time kept for the measurements after the last load (the 10k batch and the find-copies queries). */
const MEASURE_RESERVE_MS = 150_000;

const withHash = (shingles: string[]) => ({ hash: setHash(shingles), shingles });

interface LoadFigures {
  sets: number;
  newSets: number;
  pairs: number;
  candidates: number;
  wallMs: number;
  storeMs: number;
  probeMs: number;
  generateMs: number;
}

/** Loads sets [from, to) in chunks of LOAD_CHUNK, one transaction each; stops after the chunk that passes `deadline`. */
async function loadRange(collection: Collection, from: number, to: number, deadline: number): Promise<LoadFigures> {
  const figures: LoadFigures = { sets: 0, newSets: 0, pairs: 0, candidates: 0, wallMs: 0, storeMs: 0, probeMs: 0, generateMs: 0 };
  for (let start = from; start < to && performance.now() < deadline; start += LOAD_CHUNK) {
    const end = Math.min(to, start + LOAD_CHUNK);
    let t0 = performance.now();
    const sets: { hash: string; shingles: string[] }[] = [];
    for (let i = start; i < end; i++) sets.push(withHash(collection.set(i)));
    figures.generateMs += performance.now() - t0;
    t0 = performance.now();
    const result = await db().transaction((tx) => addSets(tx, sets, { batchSize: PROBE_BATCH }));
    figures.wallMs += performance.now() - t0;
    figures.storeMs += result.timings.store;
    figures.probeMs += result.timings.probe;
    figures.sets += end - start;
    figures.newSets += result.newSetCount;
    figures.pairs += result.newPairCount;
    figures.candidates += result.candidates;
    process.stderr.write(
      `\r  loaded ${formatCount(end)} sets (${formatCount(Math.round((end - from) / (figures.wallMs / 1000)))} sets/s)   `,
    );
  }
  process.stderr.write('\n');
  return figures;
}

interface ProbeFigures {
  newSets: number;
  /** addSets' breakdown: dictionary, prefixes (store side), mirror, memory or hits, load, verify (probe side) */
  parts: Record<string, number>;
  storeMs: number;
  probeMs: number;
  pairs: number;
  candidates: number;
}

/** Adds one batch of PROBE_BATCH new sets in a transaction that is rolled back: the index keeps its size. */
async function probeBatch(collection: Collection, indexed: number, salt: number): Promise<ProbeFigures> {
  const sets = Array.from({ length: PROBE_BATCH }, (_, q) => withHash(collection.releaseSet(salt * PROBE_BATCH + q, indexed)));
  const tx = await db().transaction();
  try {
    const result = await addSets(tx, sets, { batchSize: PROBE_BATCH });
    return {
      newSets: result.newSetCount,
      parts: {
        dictionary: result.timings.dictionary,
        prefixes: result.timings.prefixes,
        mirror: result.timings.mirror,
        memory: result.timings.memory,
        hits: result.timings.hits,
        load: result.timings.load,
        verify: result.timings.verify,
      },
      storeMs: result.timings.store,
      probeMs: result.timings.probe,
      pairs: result.newPairCount,
      candidates: result.candidates,
    };
  } finally {
    await tx.rollback();
  }
}

interface Latencies {
  p50: number;
  p95: number;
  max: number;
  found: number;
}

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

async function timeQueries(queries: string[][]): Promise<Latencies> {
  const times: number[] = [];
  let found = 0;
  for (const shingles of queries) {
    const t0 = performance.now();
    const similar = await findSimilarSets(undefined, shingles, FIND_THRESHOLD);
    times.push(performance.now() - t0);
    found += similar.length;
  }
  times.sort((a, b) => a - b);
  return { p50: percentile(times, 50), p95: percentile(times, 95), max: times[times.length - 1], found };
}

/** Single find-copies probes: near-copies of indexed sets and fresh sets, interleaved in one timed run each. */
async function findCopiesLatency(collection: Collection, indexed: number, count: number, seed: number) {
  const next = random(mix(seed, 9, indexed));
  const near = Array.from({ length: count }, (_, q) => collection.nearQuery(Math.floor(next() * indexed), indexed + q));
  const fresh = Array.from({ length: count }, (_, q) => collection.freshQuery(indexed + q));
  // warm-up: the first queries pay for connections and plan caches, not for the index
  await timeQueries([...near.slice(0, 5), ...fresh.slice(0, 5)]);
  const nearTimes = await timeQueries(near);
  const freshTimes = await timeQueries(fresh);
  return { near: nearTimes, fresh: freshTimes };
}

interface RelationSize {
  table: string;
  rows: number;
  total: number;
  heap: number;
  indexes: number;
}

const INDEX_TABLES = ['shingles', 'shingle_sets', 'prefix_entries', 'set_pairs'];

async function relationSizes(): Promise<RelationSize[]> {
  return db().query<RelationSize>(
    `select t as "table", (select reltuples::bigint from pg_class where oid = t::regclass) as rows,
            pg_total_relation_size(t) as total, pg_relation_size(t) as heap, pg_indexes_size(t) as indexes
       from unnest($1::text[]) as t`,
    { bind: [INDEX_TABLES], type: QueryTypes.SELECT },
  );
}

async function settings(): Promise<string> {
  const rows = await db().query<{ name: string; setting: string; unit: string | null }>(
    `select name, setting, unit from pg_settings where name in ('shared_buffers', 'work_mem', 'effective_cache_size', 'synchronous_commit', 'max_wal_size') order by name`,
    { type: QueryTypes.SELECT },
  );
  return rows.map((r) => `${r.name} ${r.setting}${r.unit ?? ''}`).join(', ');
}

interface Stage {
  indexed: number;
  load: LoadFigures;
  probe: ProbeFigures;
  find: { near: Latencies; fresh: Latencies };
  sizes: RelationSize[];
  storedSets: number;
  storedPairs: number;
}

const rate = (count: number, ms: number) => formatCount(count / (ms / 1000));

function report(stages: Stage[], meta: { seed: number; queries: number; peakRssMb: number; pgSettings: string; unfinished?: string }) {
  const out: string[] = [];
  const cpu = os.cpus()[0]?.model.trim() ?? 'unknown CPU';
  out.push(
    `Prefix index in PostgreSQL, synthetic shingle sets (seed ${meta.seed}): ${os.cpus().length} cores (${cpu}), ` +
      `${(os.totalmem() / 2 ** 30).toFixed(0)} GB RAM, ${process.version}, local cluster: ${meta.pgSettings}.`,
  );
  out.push('');
  out.push(
    '| indexed sets | stage load | load rate | store / probe | probe 10k new sets | find copies p50 / p95 (near-copy) | find copies p50 / p95 (fresh) | set pairs | prefix entries |',
  );
  out.push('| ---: | ---: | ---: | --- | ---: | --- | --- | ---: | ---: |');
  for (const s of stages) {
    const entries = s.sizes.find((r) => r.table === 'prefix_entries')?.rows ?? 0;
    out.push(
      `| ${formatCount(s.indexed)} | ${formatCount(s.load.sets)} sets in ${formatMs(s.load.wallMs)} | ${rate(s.load.sets, s.load.wallMs)} sets/s | ` +
        `${formatMs(s.load.storeMs)} / ${formatMs(s.load.probeMs)} | ${rate(s.probe.newSets, s.probe.probeMs)} sets/s | ` +
        `${formatMs(s.find.near.p50)} / ${formatMs(s.find.near.p95)} | ${formatMs(s.find.fresh.p50)} / ${formatMs(s.find.fresh.p95)} | ` +
        `${formatCount(s.storedPairs)} | ${formatCount(entries)} |`,
    );
  }
  out.push('');
  out.push('| indexed sets | table | rows | total | table alone | indexes |');
  out.push('| ---: | --- | ---: | ---: | ---: | ---: |');
  for (const s of stages) {
    for (const r of s.sizes) {
      out.push(`| ${formatCount(s.indexed)} | ${r.table} | ${formatCount(Number(r.rows))} | ${formatBytes(Number(r.total))} | ${formatBytes(Number(r.heap))} | ${formatBytes(Number(r.indexes))} |`);
    }
  }
  out.push('');
  out.push(`Peak RSS of the Node process: ${meta.peakRssMb.toFixed(0)} MB.`);
  for (const s of stages) {
    out.push(
      `At ${formatCount(s.indexed)}: stage stored ${formatCount(s.load.newSets)} new sets (the rest were exact copies), ` +
        `${formatCount(s.load.candidates)} candidates verified, ${formatCount(s.load.pairs)} pairs found; ` +
        `the 10k batch: store ${formatMs(s.probe.storeMs)}, probe ${formatMs(s.probe.probeMs)} (${Object.entries(s.probe.parts).map(([k, v]) => `${k} ${formatMs(v)}`).join(', ')}), ${formatCount(s.probe.candidates)} candidates, ${formatCount(s.probe.pairs)} pairs; ` +
        `find copies: ${meta.queries} near-copy queries found ${formatCount(s.find.near.found)} sets (max ${formatMs(s.find.near.max)}), ` +
        `${meta.queries} fresh found ${formatCount(s.find.fresh.found)} (max ${formatMs(s.find.fresh.max)}).`,
    );
  }
  if (meta.unfinished) out.push(meta.unfinished);
  out.push('');
  out.push(
    'Load rate counts every input set (exact copies included) over the addSets transactions; store = dictionary, set rows and ' +
      'prefix entries, probe = prefix lookups, position filter, verification and set pairs. The 10k batch runs in a transaction ' +
      `that is rolled back. Find copies is findSimilarSets at t = ${DEFAULT_REPOSITORY_SETTINGS.threshold}, one query at a time, over the pool.`,
  );
  return out.join('\n');
}

async function main() {
  const { values } = parseArgs({
    args: process.argv.slice(2),
    options: {
      sizes: { type: 'string' },
      keep: { type: 'boolean', default: false },
      seed: { type: 'string', default: '7' },
      queries: { type: 'string', default: '300' },
      'time-limit': { type: 'string', default: '1140' },
      'trees-only': { type: 'boolean', default: false },
      'skip-trees': { type: 'boolean', default: false },
      runs: { type: 'string', default: '3' },
    },
  });
  if (!values['skip-trees']) {
    const runs = Number(values.runs);
    if (!Number.isInteger(runs) || runs < 1) throw new Error(`--runs must be a positive integer, got "${values.runs}"`);
    process.stdout.write(`${await compareTrees(runs)}\n\n`);
    if (values['trees-only']) return;
  }
  const sizes = values.sizes ? values.sizes.split(',').map((s) => Number(s.trim())) : DEFAULT_SIZES;
  if (sizes.some((s, i) => !Number.isInteger(s) || s <= 0 || (i > 0 && s <= sizes[i - 1]))) {
    throw new Error(`--sizes must be increasing positive integers, got "${values.sizes}"`);
  }
  const seed = Number(values.seed);
  const queries = Number(values.queries);
  const timeLimitMs = Number(values['time-limit']) * 1000;
  if (loadConfig().externalDatabaseUrl) {
    throw new Error('DATABASE_URL is set: bench:index runs only on the local cluster, in a database of its own. Unset it.');
  }
  const started = performance.now();
  await ensureDatabaseServer(BENCH_DATABASE);
  await dropDatabase(BENCH_DATABASE);
  await createDatabaseIfMissing(BENCH_DATABASE);
  const url = await ensureDatabaseServer(BENCH_DATABASE);
  const sequelize = connect(url);
  const stages: Stage[] = [];
  let unfinished: string | undefined;
  try {
    await migrateUp(sequelize);
    const pgSettings = await settings();
    const collection = new Collection(seed);
    process.stderr.write(`index benchmark: sizes ${sizes.map(formatCount).join(', ')}, seed ${seed}, database ${BENCH_DATABASE}\n`);
    let indexed = 0;
    // loading stops in time to leave room for the last stage's measurements
    const deadline = started + timeLimitMs - MEASURE_RESERVE_MS;
    for (const [stageIndex, size] of sizes.entries()) {
      const load = await loadRange(collection, indexed, size, deadline);
      indexed += load.sets;
      if (indexed < size) {
        unfinished =
          `Stopped loading at ${formatCount(indexed)} of ${formatCount(size)} sets: the run reached its time limit ` +
          `(${formatMs(timeLimitMs)}, --time-limit in seconds); the last row is measured where loading stopped.`;
      }
      // what autovacuum would do soon after a large load; the planner needs the new statistics
      await sequelize.query('vacuum analyze shingles, shingle_sets, prefix_entries, set_pairs');
      process.stderr.write('  probing a batch of 10k new sets… ');
      const probe = await probeBatch(collection, indexed, stageIndex);
      process.stderr.write(`${rate(probe.newSets, probe.probeMs)} sets/s\n  find copies… `);
      const find = await findCopiesLatency(collection, indexed, queries, seed);
      process.stderr.write(`p95 ${formatMs(find.near.p95)} (near), ${formatMs(find.fresh.p95)} (fresh)\n`);
      const [counts] = await sequelize.query<{ sets: number; pairs: number }>(
        'select (select count(*) from shingle_sets)::int as sets, (select count(*) from set_pairs)::int as pairs',
        { type: QueryTypes.SELECT },
      );
      stages.push({ indexed, load, probe, find, sizes: await relationSizes(), storedSets: counts.sets, storedPairs: counts.pairs });
      if (unfinished) break;
    }
    process.stdout.write(
      `${report(stages, { seed, queries, peakRssMb: process.resourceUsage().maxRSS / 1024, pgSettings, unfinished })}\n`,
    );
    process.stderr.write(`total ${formatMs(performance.now() - started)}\n`);
  } finally {
    await disconnect();
    if (!values.keep) await dropDatabase(BENCH_DATABASE);
    else process.stderr.write(`kept database ${BENCH_DATABASE} (${url})\n`);
  }
}

// Run only as a script, so that profiling scripts can import the collection.
if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main().catch((error: unknown) => {
    console.error(error instanceof Error ? error.stack ?? error.message : error);
    process.exit(1);
  });
}
