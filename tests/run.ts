import { execFileSync, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { build } from 'vite';
import { projectRoot } from '../server/config';
import { connect, disconnect } from '../server/db/connection';
import { migrateUp } from '../server/db/migrate';
import { createDatabaseIfMissing, dropDatabase, ensureDatabaseServer } from '../server/db/postgres';

/**
 * `npm test`: everything the suites need on a fresh machine, then every suite.
 * The type check and the lint first (on a full run), then Chromium from Debian (installed when
 * missing and root), the local PostgreSQL with a database of its own for this run (dropped
 * afterwards), the built client for the browser tests, then vitest.
 */
const CHROMIUM = '/usr/bin/chromium';

function ensureChromium() {
  if (fs.existsSync(CHROMIUM)) return;
  if (process.getuid?.() !== 0) {
    throw new Error(`${CHROMIUM} is missing: install Debian's chromium package (apt-get install chromium).`);
  }
  console.log('Installing Chromium from Debian packages for the browser tests…');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  execFileSync('apt-get', ['update'], { stdio: 'inherit', env });
  execFileSync('apt-get', ['install', '-y', '--no-install-recommends', 'chromium'], { stdio: 'inherit', env });
}

/**
 * The static checks, each named when it fails. A filtered run (`npm test -- tests/x`) skips them so
 * one test file can be run while another part of the tree is half-way through a change.
 */
function staticChecks(args: string[]): boolean {
  if (args.some((arg) => !arg.startsWith('-'))) {
    console.log('Filtered run: type check and lint skipped (`npm run typecheck`, `npm run lint`).');
    return true;
  }
  const checks = [
    { name: 'type check', command: 'tsc', args: ['-p', '.'] },
    { name: 'lint', command: 'eslint', args: ['.'] },
  ];
  for (const check of checks) {
    console.log(`Running the ${check.name}: ${check.command} ${check.args.join(' ')}`);
    const run = spawnSync(`${projectRoot}/node_modules/.bin/${check.command}`, check.args, { stdio: 'inherit', cwd: projectRoot });
    if (run.status !== 0) {
      console.error(`npm test stopped: the ${check.name} failed (${check.command} ${check.args.join(' ')}); see above.`);
      return false;
    }
  }
  return true;
}

async function main(): Promise<number> {
  const args = process.argv.slice(2);
  if (!staticChecks(args)) return 1;
  ensureChromium();
  const external = process.env.DATABASE_URL;
  const testDatabase = `doublet_test_${Date.now()}`;
  let url: string;
  if (external) {
    url = external;
  } else {
    await ensureDatabaseServer();
    await createDatabaseIfMissing(testDatabase);
    url = (await ensureDatabaseServer(testDatabase));
  }
  const sequelize = connect(url);
  await migrateUp(sequelize);
  await disconnect();

  await build({ configFile: `${projectRoot}/vite.config.ts`, logLevel: 'warn' });

  const summaryFile = path.join(os.tmpdir(), `doublet-test-summary-${process.pid}.json`);
  const vitest = spawnSync(
    `${projectRoot}/node_modules/.bin/vitest`,
    ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${summaryFile}`, ...args],
    // vite's build() set NODE_ENV=production in this process; the suites run as tests (React's act() needs it)
    { stdio: 'inherit', cwd: projectRoot, env: { ...process.env, NODE_ENV: 'test', DATABASE_URL: url, DOUBLET_TEST: '1' } },
  );
  if (!external) await dropDatabase(testDatabase);
  printSummary(summaryFile);
  return vitest.status ?? 1;
}

/** One plain closing line, `N passed, N failed`, that any CI reader understands. */
function printSummary(file: string) {
  if (!fs.existsSync(file)) return;
  const summary = JSON.parse(fs.readFileSync(file, 'utf8')) as { numPassedTests: number; numFailedTests: number };
  fs.rmSync(file);
  console.log(`${summary.numPassedTests} passed, ${summary.numFailedTests} failed`);
}

main().then(
  (code) => process.exit(code),
  (error: unknown) => {
    console.error(error instanceof Error ? error.stack : error);
    process.exit(1);
  },
);
