import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { analyzeFiles } from '../../analyzers';
import { readFolder } from '../ingest/folder';
import { DEFAULT_REPOSITORY_SETTINGS } from '../../shared/constants';
import { JOIN_METHODS, newJoinStats, selfJoin, type JoinMethod, type JoinProfile } from '../matching/join';
import { rankIntegerSets, rankShingles } from '../matching/order';
import { parseThreshold } from '../matching/threshold';
import { formatCount, formatMs } from './format';
import { generateCollection } from './synthetic';

/**
 * `npm run bench:join [-- --sizes 10000,20000 --threshold 0.8 --seed 7 --methods prefix,auto]`: the
 * join's figures on synthetic collections, printed as a Markdown table. Not a test: it measures,
 * it does not judge. `--real DIR[,DIR]` measures real shingle sets instead: the functions of those
 * folders, analysed as `doublet scan` does.
 *
 * Each (size, method) cell runs in a child process of its own, so that its peak memory (the
 * process's maximum resident set) is its own and not left over from an earlier cell. The
 * collection is generated from the seed in the child, identically for every method.
 *
 * The collection imitates shingle sets of real functions:
 * - ids drawn from a Zipf-like law (exponent 1 over 2^20 ids), so a few shingles — think `( ) {`
 *   — sit in most sets and most are rare;
 * - sizes log-normal (median 80 shingles, long tail, 20..3000), like functions of ≥ 50 tokens;
 * - planted near-duplicates: 10% of the sets copy an earlier set and then drop or replace 0–15%
 *   of its ids, which puts many pairs just above and just below 0.8.
 * Where it is easier or harder than real code (checked against `--real` on typescript/lib,
 * react-dom/cjs, sequelize/lib and zod: 8,573 functions, 244 shingles a set on average, 47
 * candidates and 6 results a set): real sets are larger (a function of ≥ 50 tokens has ≥ 48
 * 3-shingles, where this allows 20) and real code has far more near copies; the table's
 * quantisation caps the vocabulary (at a million sets the rarest id is in ~50 sets), which makes
 * the prefix lists longer than a growing real vocabulary would. Left as it was, so that figures
 * stay comparable from one change to the next.
 */

const DEFAULT_SIZES = [10_000, 20_000, 100_000, 1_000_000];
/** Beyond these sizes a method takes minutes (it is quadratic in the sets of similar size). */
const QUADRATIC_LIMIT = 20_000;

interface CellResult {
  size: number;
  method: JoinMethod;
  generateMs: number;
  rankMs: number;
  joinMs: number;
  /** CPU time of the join (user + system): what the join costs when the machine is shared. */
  joinCpuMs: number;
  candidates: number;
  verified: number;
  results: number;
  shingles: number;
  peakRssMb: number;
  beforeJoinRssMb: number;
  profile: JoinProfile;
}

/** One cell, in this process: generate (or analyse real folders), rank, join; print one JSON line. */
async function runCell(size: number, method: JoinMethod, threshold: string, seed: number, real?: string[]): Promise<CellResult> {
  let start = performance.now();
  let ranked: Int32Array[];
  let generateMs: number;
  let rankMs: number;
  if (real) {
    const shingleSets = await analyzeFolders(real);
    generateMs = performance.now() - start;
    start = performance.now();
    ranked = rankShingles(shingleSets).ranked;
    rankMs = performance.now() - start;
    size = ranked.length;
  } else {
    const raw = generateCollection(size, seed);
    generateMs = performance.now() - start;
    start = performance.now();
    ranked = rankIntegerSets(raw).ranked;
    rankMs = performance.now() - start;
    raw.length = 0;
  }
  let shingles = 0;
  for (const set of ranked) shingles += set.length;
  const beforeJoinRssMb = process.resourceUsage().maxRSS / 1024;
  const stats = newJoinStats();
  const profile: JoinProfile = { indexMs: 0, probeMs: 0, verifyMs: 0 };
  start = performance.now();
  const cpu = process.cpuUsage();
  selfJoin(ranked, parseThreshold(threshold), { method, stats, profile: method === 'brute' ? undefined : profile });
  const joinMs = performance.now() - start;
  const { user, system } = process.cpuUsage(cpu);
  return {
    size,
    method,
    generateMs,
    rankMs,
    joinMs,
    joinCpuMs: (user + system) / 1000,
    ...stats,
    shingles,
    peakRssMb: process.resourceUsage().maxRSS / 1024,
    beforeJoinRssMb,
    profile,
  };
}

/**
 * Real shingle sets: the functions (≥ 50 tokens, 3-shingles) of the given folders, analysed by
 * the analyzers exactly as `doublet scan` does.
 */
async function analyzeFolders(folders: string[]): Promise<string[][]> {
  const sets: string[][] = [];
  for (const folder of folders) {
    const { files } = await readFolder(folder);
    const analyzed = await analyzeFiles(files, { minTokens: DEFAULT_REPOSITORY_SETTINGS.minTokens, shingleSize: DEFAULT_REPOSITORY_SETTINGS.shingleSize });
    for (const file of analyzed.files) for (const fragment of file.fragments) sets.push(fragment.shingles);
  }
  return sets;
}

async function main(): Promise<void> {
  const { values } = parseArgs({
    args: process.argv.slice(2),
    options: {
      sizes: { type: 'string' },
      threshold: { type: 'string', default: String(DEFAULT_REPOSITORY_SETTINGS.threshold) },
      seed: { type: 'string', default: '7' },
      methods: { type: 'string' },
      child: { type: 'boolean', default: false },
      'quadratic-limit': { type: 'string' },
      real: { type: 'string' },
    },
  });
  const real = values.real?.split(',');
  const seed = Number(values.seed);
  const threshold = values.threshold!;
  if (values.child) {
    const size = Number(values.sizes);
    const method = values.methods as JoinMethod;
    process.stdout.write(`${JSON.stringify(await runCell(size, method, threshold, seed, real))}\n`);
    return;
  }
  // With --real the collection is the analysed folders: one "size", whatever it turns out to be.
  const sizes = real ? [0] : values.sizes ? values.sizes.split(',').map(Number) : DEFAULT_SIZES;
  const methods = values.methods ? (values.methods.split(',') as JoinMethod[]) : JOIN_METHODS;
  const quadraticLimit = values['quadratic-limit'] ? Number(values['quadratic-limit']) : QUADRATIC_LIMIT;
  const self = fileURLToPath(import.meta.url);
  const rows: CellResult[] = [];
  const skipped: string[] = [];
  process.stderr.write(`join benchmark: threshold ${threshold}, seed ${seed}, sizes ${sizes.join(', ')}\n`);
  for (const size of sizes) {
    for (const method of methods) {
      if (!real && (method === 'brute' || method === 'length') && size > quadraticLimit) {
        skipped.push(`${method} at ${formatCount(size)}`);
        continue;
      }
      process.stderr.write(`  ${formatCount(size)} sets, ${method}… `);
      const child = spawnSync(
        process.execPath,
        [
          '--import',
          'tsx',
          '--max-old-space-size=6144',
          self,
          '--child',
          '--sizes',
          String(size),
          '--methods',
          method,
          '--threshold',
          threshold,
          '--seed',
          String(seed),
          ...(real ? ['--real', real.join(',')] : []),
        ],
        // cwd: the checkout, where `--import tsx` resolves
        { encoding: 'utf8', maxBuffer: 1 << 20, cwd: path.resolve(path.dirname(self), '../..') },
      );
      if (child.status !== 0) {
        process.stderr.write(`failed (exit ${child.status}):\n${child.stderr}\n`);
        continue;
      }
      const row = JSON.parse(child.stdout.trim().split('\n').pop()!) as CellResult;
      process.stderr.write(`${formatMs(row.joinMs)} (${formatCount(row.size)} sets)\n`);
      rows.push(row);
    }
  }

  const out: string[] = [];
  out.push(
    real
      ? `Join benchmark, t = ${threshold}, ${process.version}, real functions (≥ 50 tokens, 3-shingles) of: ${real.join(', ')}.`
      : `Join benchmark, t = ${threshold}, seed ${seed}, ${process.version}, Zipf-like ids, log-normal sizes (median 80), 10% planted near-duplicates.`,
  );
  out.push('');
  out.push('| sets | shingles | method | join time | join CPU | vs brute | candidates | verified | results | peak RSS | RSS before join | index / probe / verify |');
  out.push('| ---: | ---: | --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | --- |');
  for (const row of rows) {
    const brute = rows.find((r) => r.size === row.size && r.method === 'brute');
    const speedup = brute && row.method !== 'brute' ? `${(brute.joinMs / row.joinMs).toFixed(0)}×` : '';
    const { indexMs, probeMs, verifyMs } = row.profile;
    const phases = indexMs + probeMs + verifyMs > 0 ? `${formatMs(indexMs)} / ${formatMs(probeMs)} / ${formatMs(verifyMs)}` : '';
    out.push(
      `| ${formatCount(row.size)} | ${formatCount(row.shingles)} | ${row.method} | ${formatMs(row.joinMs)} | ${formatMs(row.joinCpuMs)} | ${speedup} | ${formatCount(row.candidates)} | ` +
        `${formatCount(row.verified)} | ${formatCount(row.results)} | ${row.peakRssMb.toFixed(0)} MB | ${row.beforeJoinRssMb.toFixed(0)} MB | ${phases} |`,
    );
  }
  out.push('');
  if (skipped.length > 0) out.push(`Not run (quadratic, minutes or more past ${formatCount(quadraticLimit)} sets): ${skipped.join(', ')}.`);
  const setup = rows.filter((r) => r.method === 'auto').map((r) => `${formatCount(r.size)}: generate ${formatMs(r.generateMs)}, rank ${formatMs(r.rankMs)}`);
  if (setup.length > 0) out.push(`Outside the join time: ${setup.join('; ')}${real ? ' (generate = read and analyse the folders)' : ''}.`);
  process.stdout.write(`${out.join('\n')}\n`);
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
  process.exitCode = 1;
});
