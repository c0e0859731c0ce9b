/**
 * `npm run bench:analyze`: analyser throughput on real published JavaScript and TypeScript
 * already under node_modules (named in the output with their versions). Prints MB/s per core
 * (one thread, no pool), the pool's MB/s and fragments/s over all cores, and peak memory.
 * Target: ≥ 1 MB/s of source per core for JS/TS.
 */
import fs from 'node:fs';
import { createRequire } from 'node:module';
import os from 'node:os';
import path from 'node:path';
import { analyzeFile, analyzeFiles } from '../../analyzers';
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

  // One core, no pool: the analyser itself.
  const decoder = new TextDecoder();
  const texts = files.map((f) => ({ path: f.path, text: decoder.decode(f.content) }));
  for (const t of texts.slice(0, 3)) await analyzeFile(t.path, t.text); // warm the JIT and the parsers
  let fragments = 0;
  let started = performance.now();
  const cpuBefore = process.cpuUsage();
  for (const t of texts) fragments += (await analyzeFile(t.path, t.text)).fragments.length;
  let seconds = (performance.now() - started) / 1000;
  const cpu = process.cpuUsage(cpuBefore);
  const cpuSeconds = (cpu.user + cpu.system) / 1e6;
  // CPU seconds as well as wall time: on a shared machine the wall clock also counts other
  // processes' turns, the CPU time counts only ours (GC threads included, so it errs low).
  console.log(
    `one core:  ${(mb(totalBytes) / seconds).toFixed(2)} MB/s wall, ${(mb(totalBytes) / cpuSeconds).toFixed(2)} MB per CPU-second, ` +
      `${Math.round(fragments / seconds)} fragments/s (${fragments} fragments in ${seconds.toFixed(2)} s wall, ${cpuSeconds.toFixed(2)} s CPU)`,
  );
  console.log(`load average at start: ${os.loadavg()[0]!.toFixed(2)} on ${cores} cores`);

  // The pool over every core, start-up (threads, loader, grammars) included.
  started = performance.now();
  const result = await analyzeFiles(files, { maxFileBytes: 16 * 1024 * 1024 });
  seconds = (performance.now() - started) / 1000;
  const poolFragments = result.files.reduce((sum, f) => sum + f.fragments.length, 0);
  const errors = result.files.filter((f) => f.error).length;
  const analysedBytes = totalBytes - result.skipped.reduce((sum, s) => sum + (files.find((f) => f.path === s.path)?.content.byteLength ?? 0), 0);
  console.log(
    `pool:      ${(mb(analysedBytes) / seconds).toFixed(2)} MB/s over ${cores} threads = ${(mb(analysedBytes) / seconds / cores).toFixed(2)} MB/s per core, ` +
      `${Math.round(poolFragments / seconds)} fragments/s (${seconds.toFixed(2)} s with pool start-up; ${result.skipped.length} skipped, ${errors} errors)`,
  );
  for (const s of result.skipped.slice(0, 5)) console.log(`  skipped ${s.path}: ${s.reason}`);
  console.log(`peak memory (max RSS, all threads): ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`);
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
