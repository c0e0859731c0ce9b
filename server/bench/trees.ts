/**
 * Part of `npm run bench:index`: loading a release through PostgreSQL (`doublet import` into an
 * empty, migrated database) against the in-memory `doublet scan` of the same tree, both as whole
 * processes of the compiled command line, start-up included, and checked to give the same pairs.
 *
 * Two trees, built in a temporary folder:
 * - published: whole published packages (rxjs 7.8.1, lodash 4.17.21, lodash-es 4.17.21,
 *   moment 2.30.1, axios 1.7.9) installed with npm, minified files and source maps removed;
 * - duplicated: packages from this project's node_modules that ship the same code several times
 *   (es-toolkit, zod, recharts, react-dom, @tanstack/query-core, @tanstack/react-query: CommonJS
 *   and ESM builds, development and production bundles), minified files and source maps removed.
 */
import { execFileSync, spawn } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, readdirSync, rmSync, statSync, unlinkSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { projectRoot } from '../config';
import { connect, disconnect } from '../db/connection';
import { migrateUp } from '../db/migrate';
import { createDatabaseIfMissing, dropDatabase, ensureDatabaseServer } from '../db/postgres';
import { formatBytes, formatMs } from './format';

const PUBLISHED = ['rxjs@7.8.1', 'lodash@4.17.21', 'lodash-es@4.17.21', 'moment@2.30.1', 'axios@1.7.9'];
const DUPLICATED = ['es-toolkit', 'zod', 'recharts', 'react-dom', '@tanstack/query-core', '@tanstack/react-query'];
const IMPORT_DATABASE = 'doublet_bench_import';
const THRESHOLD = '0.7';
const CLI = path.join(projectRoot, 'server', 'doublet.mjs');

/** Deletes minified files and source maps under a folder; returns its remaining size in bytes. */
function prune(folder: string): number {
  let bytes = 0;
  for (const entry of readdirSync(folder, { withFileTypes: true })) {
    const full = path.join(folder, entry.name);
    if (entry.isDirectory()) bytes += prune(full);
    else if (entry.isFile() && (/\.min\.[a-z]+$/.test(entry.name) || entry.name.endsWith('.map'))) unlinkSync(full);
    else if (entry.isFile()) bytes += statSync(full).size;
  }
  return bytes;
}

interface Tree {
  name: string;
  folder: string;
  bytes: number;
  packages: string;
}

/** Builds both trees under `work`. */
export function buildTrees(work: string): Tree[] {
  writeFileSync(path.join(work, 'package.json'), '{"private":true}');
  execFileSync('npm', ['install', '--prefix', work, '--ignore-scripts', '--no-audit', '--no-fund', '--no-package-lock', ...PUBLISHED], { stdio: 'ignore' });
  const published = path.join(work, 'published');
  for (const spec of PUBLISHED) {
    const name = spec.slice(0, spec.lastIndexOf('@'));
    cpSync(path.join(work, 'node_modules', name), path.join(published, name), { recursive: true });
  }
  const duplicated = path.join(work, 'duplicated');
  const versions: string[] = [];
  for (const name of DUPLICATED) {
    const from = path.join(projectRoot, 'node_modules', name);
    cpSync(from, path.join(duplicated, path.basename(name)), { recursive: true });
    versions.push(`${name} ${(JSON.parse(readFileSync(path.join(from, 'package.json'), 'utf8')) as { version: string }).version}`);
  }
  return [
    { name: 'published', folder: published, bytes: prune(published), packages: PUBLISHED.join(', ') },
    { name: 'duplicated', folder: duplicated, bytes: prune(duplicated), packages: versions.join(', ') },
  ];
}

/** Runs the command line as its own process; resolves with the wall time and stdout. */
function runCli(args: string[], env: NodeJS.ProcessEnv = {}): Promise<{ ms: number; out: string }> {
  return new Promise((resolve, reject) => {
    const started = performance.now();
    const child = spawn(process.execPath, [CLI, ...args], { env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    let err = '';
    child.stdout.on('data', (chunk: Buffer) => (out += chunk.toString()));
    child.stderr.on('data', (chunk: Buffer) => (err += chunk.toString()));
    child.on('error', reject);
    child.on('close', (code) => {
      const ms = performance.now() - started;
      if (code === 0) resolve({ ms, out });
      else reject(new Error(`doublet ${args[0]} exited with ${code}: ${err.slice(-2000)}`));
    });
  });
}

interface Report {
  fragments: { id: number; file: string; name: string; startLine: number }[];
  pairs: { a: number; b: number; similarity: number; type: number }[];
}

/** A report's pairs in a form that does not depend on fragment ids (as tests/server/cli/classes.test.ts). */
function pairKeys(report: Report): string[] {
  const byId = new Map(report.fragments.map((f) => [f.id, `${f.file}:${f.name}:${f.startLine}`]));
  return report.pairs.map((p) => `${[byId.get(p.a), byId.get(p.b)].sort().join(' ~ ')} ${p.similarity.toFixed(9)} ${p.type}`).sort();
}

async function emptyImportDatabase() {
  await ensureDatabaseServer(IMPORT_DATABASE); // starts the local cluster when it is not running
  await dropDatabase(IMPORT_DATABASE);
  await createDatabaseIfMissing(IMPORT_DATABASE);
  const sequelize = connect(await ensureDatabaseServer(IMPORT_DATABASE));
  try {
    await migrateUp(sequelize);
  } finally {
    await disconnect();
  }
}

const load = () => os.loadavg()[0].toFixed(1);
const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];

/** One row per tree: scan and import wall times (median of `runs` alternating runs), their ratio, the import's phases, the load average. */
export async function compareTrees(runs: number): Promise<string> {
  const work = mkdtempSync(path.join(os.tmpdir(), 'doublet-trees-'));
  const out: string[] = [];
  try {
    process.stderr.write('scan vs import: building the trees…\n');
    const trees = buildTrees(work);
    await runCli(['--help']).catch(() => undefined); // builds dist/server when stale, outside the timings
    out.push('| tree | size | scan (median) | import (median) | import / scan | pairs (scan = import) | import phases (ms, last run) | load (1 min) during the runs |');
    out.push('| --- | ---: | ---: | ---: | ---: | --- | --- | --- |');
    for (const tree of trees) {
      const scans: number[] = [];
      const imports: number[] = [];
      const loads: string[] = [];
      let phases = '';
      let same = '';
      for (let run = 0; run < runs; run++) {
        loads.push(load());
        const reportFile = path.join(work, `${tree.name}.scan.json`);
        const scan = await runCli(['scan', tree.folder, '--threshold', THRESHOLD, '--format', 'json', '--out', reportFile]);
        scans.push(scan.ms);
        await emptyImportDatabase();
        loads.push(load());
        const env = { DOUBLET_DB_NAME: IMPORT_DATABASE };
        const imported = await runCli(['import', '--repository', 'bench', '--label', 'v1', '--threshold', THRESHOLD, tree.folder], env);
        imports.push(imported.ms);
        phases = /timings \(ms\): (.*)/.exec(imported.out)?.[1] ?? '';
        process.stderr.write(`  ${tree.name} run ${run + 1}: scan ${formatMs(scan.ms)}, import ${formatMs(imported.ms)}\n`);
        if (run === runs - 1) {
          const classesFile = path.join(work, `${tree.name}.classes.json`);
          await runCli(['classes', '--repository', 'bench', '--label', 'v1', '--format', 'json', '--out', classesFile], env);
          const fromScan = pairKeys(JSON.parse(readFileSync(reportFile, 'utf8')) as Report);
          const fromImport = pairKeys(JSON.parse(readFileSync(classesFile, 'utf8')) as Report);
          const equal = fromScan.length === fromImport.length && fromScan.every((k, i) => k === fromImport[i]);
          same = `${fromScan.length.toLocaleString('en-US')} ${equal ? '(same)' : `≠ ${fromImport.length.toLocaleString('en-US')} (DIFFERENT)`}`;
        }
      }
      loads.push(load());
      const ratio = median(imports) / median(scans);
      out.push(
        `| ${tree.name} | ${formatBytes(tree.bytes)} | ${formatMs(median(scans))} | ${formatMs(median(imports))} | ${ratio.toFixed(2)}× | ${same} | ${phases} | ${loads.join(' → ')} |`,
      );
    }
    out.push('');
    for (const tree of trees) out.push(`- ${tree.name}: ${tree.packages}.`);
    out.push(
      `- Scan: \`doublet scan TREE --threshold ${THRESHOLD} --format json --out FILE\`; import: \`doublet import\` into an empty, migrated database ` +
        `(\`${IMPORT_DATABASE}\`, created anew for each run); both whole processes of the compiled command line, start-up included, ${runs} runs each, alternating.`,
    );
  } finally {
    await dropDatabase(IMPORT_DATABASE).catch(() => undefined);
    rmSync(work, { recursive: true, force: true });
  }
  return out.join('\n');
}
