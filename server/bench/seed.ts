import os from 'node:os';
import { parseArgs } from 'node:util';
import { seedDemo } from '../commands/seedDemo';
import { connect, disconnect } from '../db/connection';
import { migrateUp } from '../db/migrate';
import { createDatabaseIfMissing, dropDatabase, ensureDatabaseServer } from '../db/postgres';
import { generateDemo } from '../demo/generator/story';
import { startJobs, stopJobs } from '../jobs';
import { initModels, Snapshot } from '../models';

/**
 * `npm run bench:seed [-- --keep]`: how long `npm start` takes to seed the demo organisation into
 * an empty database. Not a test: it measures, it does not judge (the target is under a minute).
 *
 * It generates the demo (server/demo/generator), then seeds it as `npm start` does, in process,
 * into a database of its own (`doublet_bench_seed`, on the local cluster or DATABASE_URL's server;
 * created fresh, migrated, dropped at the end unless `--keep`), and prints the wall time, the
 * process's CPU time and the load average before and after.
 */

const BENCH_DATABASE = 'doublet_bench_seed';

const seconds = (ms: number) => `${(ms / 1000).toFixed(1)} s`;
const loads = () => os.loadavg().map((x) => x.toFixed(2)).join(' / ');

async function main() {
  const { values } = parseArgs({ options: { keep: { type: 'boolean', default: false } } });
  const configured = new URL(await ensureDatabaseServer());
  configured.pathname = '/postgres';
  const admin = configured.toString();
  configured.pathname = `/${BENCH_DATABASE}`;
  await dropDatabase(BENCH_DATABASE, admin);
  await createDatabaseIfMissing(BENCH_DATABASE, admin);
  const sequelize = connect(configured.toString());
  await migrateUp(sequelize);
  initModels(sequelize);
  // loads queue their notices (over budget, drifted) as `npm start` does; nobody works them here
  await startJobs({ connectionString: configured.toString() });

  const loadBefore = loads();
  const cpuBefore = process.cpuUsage();
  let mark = performance.now();
  const demo = generateDemo();
  const generated = performance.now() - mark;
  const files = demo.repositories.flatMap((r) => r.releases.flatMap((x) => x.files));
  const bytes = files.reduce((n, f) => n + Buffer.byteLength(f.text), 0);
  mark = performance.now();
  const organisation = await seedDemo({ log: (line) => console.error(line) });
  if (!organisation) throw new Error(`${BENCH_DATABASE} was not empty`);
  const seeded = performance.now() - mark;
  const cpu = process.cpuUsage(cpuBefore);
  const snapshots = await Snapshot.count();
  console.log(`| load average (1/5/15 min) before → after | generate | seed | CPU (user + system) | snapshots | files (all releases) | source text |`);
  console.log(`| --- | ---: | ---: | ---: | ---: | ---: | ---: |`);
  console.log(
    `| ${loadBefore} → ${loads()} | ${seconds(generated)} | ${seconds(seeded)} | ${seconds((cpu.user + cpu.system) / 1000)} | ${snapshots} | ${files.length} | ${(bytes / 1e6).toFixed(1)} MB |`,
  );
  await stopJobs();
  await disconnect();
  if (!values.keep) await dropDatabase(BENCH_DATABASE, admin);
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.stack : error);
  process.exit(1);
});
