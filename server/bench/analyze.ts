/**
 * `npm run bench:analyze`: analyser throughput on real published JavaScript and TypeScript
 * already under node_modules (named in the output with their versions). Prints MB/s per core
 * (one thread with a pool thread's heap limits, no pool: a cold first pass over the corpus and a
 * warm second one), the pool's start-up time, the pool's MB/s and fragments/s over all cores, and peak memory.
 * Run it on a quiet machine: it prints the load average before and after.
 * Target: ≥ 1 MB/s of source per core for JS/TS.
 */
import fs from 'node:fs';
import { createRequire } from 'node:module';
import os from 'node:os';
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import { analyzeFiles } from '../../analyzers';
import { POOL_RESOURCE_LIMITS } from '../../analyzers/pool';
import type { SourceFile } from '../../analyzers/types';

const require = createRequire(import.meta.url);

interface Corpus {
  pkg: string;
  /** Folders (relative to the package root) walked for sources. */
  dirs: string[];
  /** File suffixes taken; declaration files have no bodies and are left out. */
  suffixes: string[];
}

const CORPORA: Corpus[] = [
  { pkg: 'react-dom', dirs: ['cjs'], suffixes: ['.development.js'] },
  { pkg: '@babel/parser', dirs: ['lib'], suffixes: ['index.js'] },
  { pkg: 'sequelize', dirs: ['lib'], suffixes: ['.js'] },
  { pkg: 'express', dirs: ['lib'], suffixes: ['.js'] },
  { pkg: 'zod', dirs: ['src'], suffixes: ['.ts'] },
];

function walk(dir: string, out: string[]): void {
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) walk(full, out);
    else if (entry.isFile()) out.push(full);
  }
}

function load(): { files: SourceFile[]; names: string[] } {
  const files: SourceFile[] = [];
  const names: string[] = [];
  for (const corpus of CORPORA) {
    const manifest = require.resolve(`${corpus.pkg}/package.json`);
    const root = path.dirname(manifest);
    const version = (JSON.parse(fs.readFileSync(manifest, 'utf8')) as { version: string }).version;
    const found: string[] = [];
    for (const dir of corpus.dirs) walk(path.join(root, dir), found);
    const picked = found.filter((f) => corpus.suffixes.some((s) => f.endsWith(s)) && !/\.d\.[cm]?ts$/.test(f) && !f.includes('/tests/'));
    let bytes = 0;
    for (const file of picked) {
      const content = new Uint8Array(fs.readFileSync(file));
      bytes += content.byteLength;
      files.push({ path: `${corpus.pkg}/${path.relative(root, file)}`, content });
    }
    names.push(`${corpus.pkg}@${version} (${picked.length} files, ${(bytes / 1e6).toFixed(2)} MB)`);
  }
  return { files, names };
}

const mb = (bytes: number) => bytes / 1e6;

async function main() {
  const { files, names } = load();
  const totalBytes = files.reduce((sum, f) => sum + f.content.byteLength, 0);
  const cores = os.availableParallelism();
  console.log(`corpus: ${names.join(', ')}`);
  console.log(`total ${mb(totalBytes).toFixed(2)} MB in ${files.length} files; ${cores} cores; options: defaults (k=3, minTokens=50, normalised)`);

  const decoder = new TextDecoder();
  const texts = files.map((f) => ({ path: f.path, text: decoder.decode(f.content) }));
  // CPU seconds as well as wall time: on a shared machine the wall clock also counts other
  // processes' turns, the CPU time counts only ours (GC helper threads included, so it errs low).
  const line = (label: string, r: { seconds: number; cpuSeconds: number; fragments: number }) =>
    console.log(
      `${label} ${(mb(totalBytes) / r.seconds).toFixed(2)} MB/s wall, ${(mb(totalBytes) / r.cpuSeconds).toFixed(2)} MB per CPU-second, ` +
        `${Math.round(r.fragments / r.seconds)} fragments/s (${r.fragments} fragments in ${r.seconds.toFixed(2)} s wall, ${r.cpuSeconds.toFixed(2)} s CPU)`,
    );

  // One core: one thread with a pool thread's heap limits, no pool around it (no start-up).
  console.log(`load average before: ${os.loadavg().map((l) => l.toFixed(2)).join(', ')} on ${cores} cores`);
  const worker = new Worker(new URL('./analyze-thread.mjs', import.meta.url), {
    workerData: { texts, passes: 2 },
    resourceLimits: POOL_RESOURCE_LIMITS,
  });
  const passes = await new Promise<Array<{ seconds: number; cpuSeconds: number; fragments: number }>>((resolve, reject) => {
    worker.once('message', resolve);
    worker.once('error', reject);
  });
  await worker.terminate();
  line('one core, first pass (cold: JIT, heap growth):', passes[0]!);
  line('one core, second pass (warm):', passes[1]!);

  // Pool start-up alone: threads, TypeScript loader, parsers, on one small file per thread.
  let started = performance.now();
  await analyzeFiles(
    Array.from({ length: cores }, (_, i) => ({ path: `warm${i}.js`, content: new TextEncoder().encode('function f() { return 1; }') })),
  );
  const startup = (performance.now() - started) / 1000;
  console.log(`pool start-up and shut-down: ${startup.toFixed(2)} s (${cores} threads, one tiny file each)`);

  // The pool over every core, start-up (threads, loader, grammars) included.
  started = performance.now();
  const result = await analyzeFiles(files, { maxFileBytes: 16 * 1024 * 1024 });
  const seconds = (performance.now() - started) / 1000;
  const poolFragments = result.files.reduce((sum, f) => sum + f.fragments.length, 0);
  const errors = result.files.filter((f) => f.error).length;
  const analyzedBytes = totalBytes - result.skipped.reduce((sum, s) => sum + (files.find((f) => f.path === s.path)?.content.byteLength ?? 0), 0);
  console.log(
    `pool:      ${(mb(analyzedBytes) / seconds).toFixed(2)} MB/s over ${cores} threads = ${(mb(analyzedBytes) / seconds / cores).toFixed(2)} MB/s per core, ` +
      `${Math.round(poolFragments / seconds)} fragments/s (${seconds.toFixed(2)} s with pool start-up; ${result.skipped.length} skipped, ${errors} errors); ` +
      `start-up excluded: ${(mb(analyzedBytes) / Math.max(0.001, seconds - startup) / cores).toFixed(2)} MB/s per core`,
  );
  console.log(`load average after: ${os.loadavg().map((l) => l.toFixed(2)).join(', ')}`);
  for (const s of result.skipped.slice(0, 5)) console.log(`  skipped ${s.path}: ${s.reason}`);
  console.log(`peak memory (max RSS, all threads): ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`);
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
