import { spawn, type ChildProcess } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { createRepository } from '../commands/createRepository';
import { uploadSnapshot } from '../commands/uploadSnapshot';
import { projectRoot } from '../config';
import { connect, disconnect } from '../db/connection';
import { migrateUp } from '../db/migrate';
import { createDatabaseIfMissing, dropDatabase, ensureDatabaseServer } from '../db/postgres';
import { packFolder, readFolder } from '../ingest';
import { startJobs, stopJobs } from '../jobs';
import { initModels } from '../models';
import { Organisation } from '../models/Organisation';
import { Snapshot } from '../models/Snapshot';

/**
 * `npm run bench:ingest [-- --loads 4 --workers 1,2 --keep]`: uploaded releases loaded per minute
 * with 1 and 2 worker processes (`server/worker.ts`) on this machine, printed as Markdown. Not a
 * test: it measures, it does not judge.
 *
 * Each load is sequelize 6.37.8's `lib` folder from node_modules (published code, 116 files,
 * 3.1 MB) as a tar.gz, each copy with a comment of its own at the end of every file so that no
 * load reuses another's analyses (the worst case: every file analysed, every set new). For each
 * worker count, a fresh database of its own (`doublet_bench_ingest`, dropped at the end unless
 * `--keep`), the workers are started, all uploads are queued at once, and the clock runs from the
 * first upload queued to the last snapshot ready.
 */

const BENCH_DATABASE = 'doublet_bench_ingest';
const SOURCE = path.join(projectRoot, 'node_modules', 'sequelize', 'lib');

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

/** A salted copy of the source folder, packed as a tar.gz into `dir`. */
async function saltedArchive(dir: string, salt: string): Promise<string> {
  const copy = path.join(dir, `src-${salt}`);
  const { files } = await readFolder(SOURCE);
  for (const f of files) {
    fs.mkdirSync(path.dirname(path.join(copy, f.path)), { recursive: true });
    fs.writeFileSync(path.join(copy, f.path), Buffer.concat([Buffer.from(f.content), Buffer.from(`\n// ${salt}\n`)]));
  }
  const out = path.join(dir, `release-${salt}.tgz`);
  await packFolder(copy, out);
  fs.rmSync(copy, { recursive: true, force: true });
  return out;
}

function startWorker(url: string, schema: string, uploadDir: string): ChildProcess {
  return spawn(process.execPath, ['--import', 'tsx', path.join(projectRoot, 'server', 'worker.ts')], {
    cwd: projectRoot,
    env: { ...process.env, DATABASE_URL: url, DOUBLET_JOBS_SCHEMA: schema, DOUBLET_UPLOAD_DIR: uploadDir, DOUBLET_EMBEDDED_WORKER: 'false' },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
}

async function run(workers: number, loads: number, keep: boolean) {
  const { url, admin } = await prepareDatabase();
  const schema = 'pgboss_bench';
  const work = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-bench-ingest-'));
  process.env.DOUBLET_UPLOAD_DIR = path.join(work, 'uploads');
  await startJobs({ connectionString: url, schema });
  const organisation = await Organisation.create({ name: 'Brackenfold Rail Freight (bench)' });
  const archives = [];
  for (let i = 0; i < loads; i++) archives.push(await saltedArchive(work, crypto.randomBytes(6).toString('hex')));
  const children = Array.from({ length: workers }, () => startWorker(url, schema, process.env.DOUBLET_UPLOAD_DIR!));
  const loadBefore = os.loadavg()[0]!;
  const started = performance.now();
  const ids: number[] = [];
  for (let i = 0; i < loads; i++) {
    const repository = await createRepository(organisation.id, { name: `sequelize-${i}` });
    const { snapshot } = await uploadSnapshot({ repository, label: '6.37.8', tempFile: archives[i]!, startedBy: null });
    ids.push(snapshot.id);
  }
  for (;;) {
    const snapshots = await Snapshot.findAll({ where: { id: ids } });
    const failed = snapshots.find((s) => s.status === 'failed' || s.status === 'cancelled');
    if (failed) throw new Error(`load ${failed.id} ended ${failed.status}: ${failed.error}`);
    if (snapshots.every((s) => s.status === 'ready')) break;
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
  const seconds = (performance.now() - started) / 1000;
  const loadAfter = os.loadavg()[0]!;
  for (const child of children) child.kill('SIGTERM');
  await Promise.all(children.map((c) => new Promise((resolve) => (c.exitCode === null ? c.once('exit', resolve) : resolve(null)))));
  await stopJobs();
  await disconnect();
  if (!keep) await dropDatabase(BENCH_DATABASE, admin);
  fs.rmSync(work, { recursive: true, force: true });
  return { workers, loads, seconds, perMinute: (loads / seconds) * 60, loadBefore, loadAfter };
}

async function main() {
  const { values } = parseArgs({ options: { loads: { type: 'string', default: '4' }, workers: { type: 'string', default: '1,2' }, keep: { type: 'boolean', default: false } } });
  const loads = Number(values.loads);
  const counts = values.workers.split(',').map(Number);
  console.log(`Each load: sequelize 6.37.8 lib (node_modules), salted, every file analysed. ${os.availableParallelism()} cores, node ${process.version}.\n`);
  console.log('| worker processes | loads | wall time | loads per minute | load average (1 min) before → after |');
  console.log('| ---: | ---: | ---: | ---: | --- |');
  for (const workers of counts) {
    const r = await run(workers, loads, values.keep);
    console.log(`| ${r.workers} | ${r.loads} | ${r.seconds.toFixed(1)} s | ${r.perMinute.toFixed(2)} | ${r.loadBefore.toFixed(2)} → ${r.loadAfter.toFixed(2)} |`);
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.stack : error);
  process.exit(1);
});
