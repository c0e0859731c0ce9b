import { execFileSync, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { DEFAULT_REPOSITORY_SETTINGS } from '../../shared/constants';
import { formatCount, formatMs } from './format';
import { generateCollection } from './synthetic';

/**
 * `npm run bench:cli [-- --runs 20 --big-runs 5 --sets 20000 --seed 7]`: `doublet join` as a user
 * runs it, a whole process each time, from the compiled command line (server/doublet.mjs, built
 * first when stale). Prints a Markdown table: a bare `node -e 0`; `doublet join` on 10 sets; on
 * the 20k sets of bench:join's collection (same generator and seed); and the floor it is held
 * against, the size-sorted, length-bounded brute force (`--method length`: every pair within
 * the length bound, verified by a merge) on the same sets. Not a test: it measures, it judges
 * nothing.
 *
 * Wall time is the median of the runs; CPU is the mean of user + system time of the child
 * processes (read from /proc/self/stat's cutime and cstime after each run, so Linux only), the
 * steadier figure on a shared machine. "Net of start-up" subtracts `node -e 0`.
 */

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const bin = path.join(root, 'server', 'doublet.mjs');
const TICKS = Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim()) || 100;

/** User + system CPU of this process's waited-for children so far, in ms. */
function childCpuMs(): number {
  const stat = fs.readFileSync('/proc/self/stat', 'utf8');
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  // fields[0] is field 3 (state); cutime and cstime are fields 16 and 17
  return ((Number(fields[13]) + Number(fields[14])) * 1000) / TICKS;
}

interface Timing {
  wallMs: number[];
  cpuMs: number[];
  stderr: string[];
}

function measure(args: string[], runs: number): Timing {
  const timing: Timing = { wallMs: [], cpuMs: [], stderr: [] };
  for (let r = 0; r < runs; r++) {
    const cpu = childCpuMs();
    const start = performance.now();
    const child = spawnSync(process.execPath, args, { encoding: 'utf8', stdio: ['ignore', 'ignore', 'pipe'], maxBuffer: 1 << 20 });
    const wall = performance.now() - start;
    if (child.status !== 0) throw new Error(`node ${args.join(' ')} failed (exit ${child.status}): ${child.stderr}`);
    timing.wallMs.push(wall);
    timing.cpuMs.push(childCpuMs() - cpu);
    timing.stderr.push(child.stderr);
  }
  return timing;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

const mean = (values: number[]) => values.reduce((sum, v) => sum + v, 0) / values.length;

/** A phase time the command printed on stderr ("times: read 12 ms, rank 3 ms, …"), median over runs. */
function phase(timing: Timing, name: string): number {
  return median(timing.stderr.map((text) => Number(new RegExp(`${name} (\\d+) ms`).exec(text)?.[1] ?? NaN)));
}

const loadAverage = () => os.loadavg().map((l) => l.toFixed(2)).join(', ');

async function main(): Promise<void> {
  const { values } = parseArgs({
    args: process.argv.slice(2),
    options: {
      runs: { type: 'string', default: '20' },
      'big-runs': { type: 'string', default: '5' },
      sets: { type: 'string', default: '20000' },
      seed: { type: 'string', default: '7' },
      threshold: { type: 'string', default: String(DEFAULT_REPOSITORY_SETTINGS.threshold) },
    },
  });
  const runs = Number(values.runs);
  const bigRuns = Number(values['big-runs']);
  const count = Number(values.sets);
  const threshold = values.threshold!;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-bench-cli-'));
  try {
    const sets = generateCollection(count, Number(values.seed));
    const lines = sets.map((set) => set.join(' '));
    const big = path.join(dir, 'sets.txt');
    const small = path.join(dir, 'ten.txt');
    fs.writeFileSync(big, `${lines.join('\n')}\n`);
    fs.writeFileSync(small, `${lines.slice(0, 10).join('\n')}\n`);
    const tokens = sets.reduce((sum, set) => sum + set.length, 0);
    process.stderr.write(`${formatCount(count)} sets, ${formatCount(tokens)} tokens, ${(fs.statSync(big).size / 2 ** 20).toFixed(1)} MB; load average ${loadAverage()}\n`);

    // one run first: builds dist/server when it is stale, and warms the file cache
    measure([bin, 'join', '--input', small], 1);
    const loadBefore = loadAverage();
    process.stderr.write('node -e 0…\n');
    const bare = measure(['-e', '0'], runs);
    process.stderr.write('doublet join, 10 sets…\n');
    const ten = measure([bin, 'join', '--input', small, '--threshold', threshold], runs);
    process.stderr.write(`doublet join, ${formatCount(count)} sets…\n`);
    const whole = measure([bin, 'join', '--input', big, '--threshold', threshold], bigRuns);
    process.stderr.write(`brute force (--method length), ${formatCount(count)} sets, one run…\n`);
    const brute = measure([bin, 'join', '--input', big, '--threshold', threshold, '--method', 'length'], 1);
    const loadAfter = loadAverage();

    const bareWall = median(bare.wallMs);
    const bareCpu = mean(bare.cpuMs);
    const netWall = median(whole.wallMs) - bareWall;
    const netCpu = mean(whole.cpuMs) - bareCpu;
    const bruteJoin = phase(brute, 'join');
    const bruteNetCpu = brute.cpuMs[0] - bareCpu;
    const out: string[] = [];
    out.push(`doublet join from the compiled command line, ${process.version}, t = ${threshold}, ${formatCount(count)} sets of bench:join's collection (seed ${values.seed}). Load average ${loadBefore} before, ${loadAfter} after, on ${os.availableParallelism()} cores.`);
    out.push('');
    out.push('| process | runs | wall (median) | wall (min) | CPU (mean) |');
    out.push('| --- | ---: | ---: | ---: | ---: |');
    const row = (name: string, t: Timing) =>
      out.push(`| ${name} | ${t.wallMs.length} | ${formatMs(median(t.wallMs))} | ${formatMs(Math.min(...t.wallMs))} | ${formatMs(mean(t.cpuMs))} |`);
    row('`node -e 0`', bare);
    row('`doublet join`, 10 sets', ten);
    row(`\`doublet join\`, ${formatCount(count)} sets`, whole);
    row(`brute force (\`--method length\`), ${formatCount(count)} sets`, brute);
    out.push('');
    out.push(
      `- 10 sets against \`node -e 0\`: ${(median(ten.wallMs) / bareWall).toFixed(2)}× wall, ${(mean(ten.cpuMs) / bareCpu).toFixed(2)}× CPU.`,
    );
    out.push(
      `- ${formatCount(count)} sets, whole process net of start-up: ${formatMs(netWall)} wall, ${formatMs(netCpu)} CPU ` +
        `(read ${formatMs(phase(whole, 'read'))}, rank ${formatMs(phase(whole, 'rank'))}, join ${formatMs(phase(whole, 'join'))}, write ${formatMs(phase(whole, 'write'))}).`,
    );
    out.push(
      `- The brute force's join alone: ${formatMs(bruteJoin)} wall (${formatMs(bruteNetCpu)} CPU, whole process net of start-up); ` +
        `\`doublet join\` is ${(bruteJoin / netWall).toFixed(0)}× faster by wall time, ${(bruteNetCpu / netCpu).toFixed(0)}× by CPU.`,
    );
    process.stdout.write(`${out.join('\n')}\n`);
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
  process.exitCode = 1;
});
