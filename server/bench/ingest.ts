import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { createRepository } from '../commands/createRepository';
import { uploadSnapshot } from '../commands/uploadSnapshot';
import { loadConfig, projectRoot } from '../config';
import { connect, disconnect } from '../db/connection';
import { migrateUp } from '../db/migrate';
import { createDatabaseIfMissing, dropDatabase, ensureDatabaseServer } from '../db/postgres';
import { packFolder } from '../ingest/pack';
import { startJobs, stopJobs } from '../jobs';
import { Organisation } from '../models/Organisation';
import { initModels } from '../models';
import { select } from '../clone-index/sql';
import { JS_PACKAGES, loadPackages } from './quality/corpus';

/**
 * `npm run bench:ingest [-- --loads 12 --files 60 --workers 1,2 --keep]`: loads per minute with 1
 * and 2 worker processes (`npm run worker`) on this machine, printed as a Markdown table with the
 * load average beside each figure. Not a test: it measures, it does not judge.
 *
 * For each worker count, in a database of its own (`doublet_bench_ingest`, on the local cluster or
 * DATABASE_URL's server; created fresh, dropped at the end unless `--keep`): it packs `--loads`
 * releases of real published JavaScript (the first `--files` files of sequelize and express from
 * the quality benchmark's corpus, each release with a different first line, so every file of every release is analysed
 * and none is reused from another), queues each as an upload of a repository of its own (the
 * same command the upload route calls: the archive is read and checked, a `snapshot.load` job
 * queued), then starts the worker processes and times from the first load taken to the last
 * load ended. The shingle sets repeat from the second release on, so the index grows little:
 * this measures reading, analysis and storing, which is most of a load.
 */

const BENCH_DATABASE = 'doublet_bench_ingest';

interface Row {
  workers: number;
  loads: number;
  failed: number;
  seconds: number;
  loadBefore: number;
  loadAfter: number;
  startSeconds: number;
}

/** Writes the releases' folders: the same files, each with a first line naming its release. */
function writeReleases(root: string, count: number, fileCount: number): { bytes: number; files: number } {
  const { files } = loadPackages(JS_PACKAGES);
  // Application-style modules (an ORM and a web framework), not the corpus's multi-megabyte bundles.
  const chosen = files.filter((f) => /^(sequelize|express)@/.test(f.source) && f.path.endsWith('.js')).slice(0, fileCount);
  let bytes = 0;
  for (let i = 0; i < count; i++) {
    for (const file of chosen) {
      const target = path.join(root, `release-${i}`, file.path);
      fs.mkdirSync(path.dirname(target), { recursive: true });
      const text = `// Brackenfold bench release ${i}\n${file.text}`;
      fs.writeFileSync(target, text);
      if (i === 0) bytes += Buffer.byteLength(text);
    }
  }
  return { bytes, files: chosen.length };
}

async function prepareDatabase(): Promise<{ url: string; admin: string }> {
  const configured = new URL(await ensureDatabaseServer());
  configured.pathname = '/postgres';
  const admin = configured.toString();
  configured.pathname = `/${BENCH_DATABASE}`;
  const url = configured.toString();
  await dropDatabase(BENCH_DATABASE, admin);
  await createDatabaseIfMissing(BENCH_DATABASE, admin);
  const sequelize = connect(url);
  await migrateUp(sequelize);
  initModels(sequelize);
  return { url, admin };
}

/** Queues one upload a release, each to a repository of its own. */
async function queueUploads(releases: string, archives: string, count: number): Promise<void> {
  const organisation = await Organisation.create({ name: 'Brackenfold Rail Freight (ingest bench)' });
  for (let i = 0; i < count; i++) {
    const repository = await createRepository(organisation.id, { name: `bench-release-${i}` });
    const tempFile = path.join(archives, `release-${i}.tar.gz`);
    await packFolder(path.join(releases, `release-${i}`), tempFile);
    await uploadSnapshot({ repository, label: `r${i}`, tempFile, startedBy: null });
  }
}

function startWorker(url: string, uploadDir: string, output: string[]): ChildProcess {
  const child = spawn(process.execPath, ['--import', 'tsx', path.join(projectRoot, 'server', 'worker.ts')], {
    cwd: projectRoot,
    env: { ...process.env, DATABASE_URL: url, DOUBLET_UPLOAD_DIR: uploadDir, DOUBLET_TEST: '' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (d: Buffer) => output.push(d.toString()));
  child.stderr!.on('data', (d: Buffer) => output.push(d.toString()));
  return child;
}

async function stopWorker(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null) return;
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  child.kill('SIGTERM');
  await Promise.race([exited, new Promise((resolve) => setTimeout(resolve, 20_000))]);
  if (child.exitCode === null) child.kill('SIGKILL');
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

async function measure(workers: number, count: number, releases: string, work: string): Promise<Row> {
  const { url, admin } = await prepareDatabase();
  const uploadDir = path.join(work, `uploads-${workers}`);
  process.env.DOUBLET_UPLOAD_DIR = uploadDir;
  const archives = path.join(uploadDir, 'incoming');
  fs.mkdirSync(archives, { recursive: true, mode: 0o700 });
  const children: ChildProcess[] = [];
  const output: string[] = [];
  try {
    await startJobs({ connectionString: url });
    await queueUploads(releases, archives, count);
    console.error(`${workers} worker(s): ${count} loads queued; starting the workers…`);
    const loadBefore = os.loadavg()[0]!;
    const spawned = performance.now();
    for (let i = 0; i < workers; i++) children.push(startWorker(url, uploadDir, output));
    let firstTaken: number | undefined;
    type Counts = { active: number; ended: number; failed: number };
    for (;;) {
      const [counts] = await select<Counts>(
        undefined,
        `select count(*) filter (where status <> 'queued')::int as active,
                count(*) filter (where status in ('ready', 'failed', 'cancelled'))::int as ended,
                count(*) filter (where status in ('failed', 'cancelled'))::int as failed
           from snapshots`,
      );
      if (firstTaken === undefined && counts!.active > 0) firstTaken = performance.now();
      if (counts!.ended === count) {
        const ended = performance.now();
        return {
          workers,
          loads: count,
          failed: counts!.failed,
          seconds: (ended - firstTaken!) / 1000,
          loadBefore,
          loadAfter: os.loadavg()[0]!,
          startSeconds: (firstTaken! - spawned) / 1000,
        };
      }
      if (children.some((c) => c.exitCode !== null)) throw new Error(`a worker exited early:\n${output.join('')}`);
      if (performance.now() - spawned > 60 * 60 * 1000) throw new Error('the loads took over an hour');
      await sleep(200);
    }
  } finally {
    for (const child of children) await stopWorker(child);
    await stopJobs({ timeoutMs: 1000 });
    await disconnect();
    if (process.argv.includes('--keep')) console.error(`kept ${BENCH_DATABASE} (${workers} workers)`);
    else await dropDatabase(BENCH_DATABASE, admin);
  }
}

async function main() {
  const { values } = parseArgs({
    options: {
      loads: { type: 'string', default: '12' },
      files: { type: 'string', default: '60' },
      workers: { type: 'string', default: '1,2' },
      keep: { type: 'boolean' },
    },
  });
  const count = Number(values.loads);
  const fileCount = Number(values.files);
  const workerCounts = values.workers.split(',').map(Number);
  if (!Number.isInteger(count) || count < 1 || count > 100) throw new Error('--loads is 1..100');
  if (!Number.isInteger(fileCount) || fileCount < 1 || fileCount > 2000) throw new Error('--files is 1..2000');
  if (workerCounts.some((n) => !Number.isInteger(n) || n < 1 || n > 16)) throw new Error('--workers is a list of 1..16');

  const work = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-bench-ingest-'));
  try {
    const releases = path.join(work, 'releases');
    const size = writeReleases(releases, count, fileCount);
    const rows: Row[] = [];
    for (const workers of workerCounts) {
      const row = await measure(workers, count, releases, work);
      console.error(`  ${workers} worker(s): ${((row.loads / row.seconds) * 60).toFixed(1)} loads/min`);
      rows.push(row);
    }
    print(rows, size);
  } finally {
    fs.rmSync(work, { recursive: true, force: true });
  }
}

function print(rows: Row[], size: { bytes: number; files: number }) {
  const { loads } = loadConfig();
  console.log(
    `\n${os.availableParallelism()} cores, Node ${process.version}; a load: ${size.files} JavaScript files, ${(size.bytes / 1e6).toFixed(2)} MB; ` +
      `each worker runs ${loads.perWorker} loads at once on ${loads.analyzerThreads} analyzer threads (DOUBLET_LOADS_PER_WORKER, DOUBLET_ANALYZER_THREADS)\n`,
  );
  console.log('| worker processes | loads | minutes, first taken → last ended | loads per minute | load average (1 min) before → after |');
  console.log('| ---: | ---: | ---: | ---: | --- |');
  for (const r of rows) {
    const failed = r.failed > 0 ? ` (${r.failed} failed)` : '';
    console.log(
      `| ${r.workers} | ${r.loads}${failed} | ${(r.seconds / 60).toFixed(2)} | ${((r.loads / r.seconds) * 60).toFixed(1)} | ${r.loadBefore.toFixed(2)} → ${r.loadAfter.toFixed(2)} |`,
    );
  }
  console.log(`\nworker start-up (spawn → first load taken): ${rows.map((r) => `${r.workers}: ${r.startSeconds.toFixed(1)} s`).join(', ')}`);
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.stack : error);
  process.exit(1);
});
