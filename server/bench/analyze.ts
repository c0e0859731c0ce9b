/**
 * `npm run bench:analyze`: analyser throughput on real published JavaScript and TypeScript
 * already under node_modules (named in the output with their versions). Prints MB/s per core
 * (one thread with a pool thread's heap limits, no pool: a cold first pass over the corpus and a
 * warm second one), the pool's start-up time, the pool's MB/s and fragments/s over all cores, and peak memory.
 * Run it on a quiet machine: it prints the load average before and after.
 * Target: ≥ 1 MB/s of source per core for JS/TS.
 */
import os from 'node:os';
import { Worker } from 'node:worker_threads';
import { analyzeFiles } from '../../analyzers';
import { POOL_RESOURCE_LIMITS } from '../../analyzers/pool';
import type { SourceFile } from '../../analyzers/types';
import { JS_PACKAGES, loadPackages } from './quality/corpus';

/** The published packages of `npm run bench:quality` (one list for both benchmarks), as bytes. */
function load(): { files: SourceFile[]; names: string[] } {
  const { files, sources } = loadPackages(JS_PACKAGES);
  const encoder = new TextEncoder();
  return {
    files: files.map((f) => ({ path: f.path, content: encoder.encode(f.text) })),
    names: sources.map((s) => `${s.name}@${s.version} (${s.files} files, ${(s.bytes / 1e6).toFixed(2)} MB)`),
  };
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
