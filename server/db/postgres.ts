import { execFileSync, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { loadConfig } from '../config';

/**
 * Life cycle of the project-local PostgreSQL cluster: find (or install) Debian's server, create a
 * cluster under .data/postgres that listens on 127.0.0.1 only, start it, create databases, stop it.
 * When DATABASE_URL is set none of this runs: that server is used as it is.
 */

const DEBIAN_ROOT = '/usr/lib/postgresql';

/** Directory holding initdb and pg_ctl of the newest installed Debian PostgreSQL, or undefined. */
export function findPostgresBinaries(): string | undefined {
  if (!fs.existsSync(DEBIAN_ROOT)) return undefined;
  const versions = fs
    .readdirSync(DEBIAN_ROOT)
    .filter((v) => fs.existsSync(path.join(DEBIAN_ROOT, v, 'bin', 'pg_ctl')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(DEBIAN_ROOT, versions[0], 'bin') : undefined;
}

const isRoot = () => typeof process.getuid === 'function' && process.getuid() === 0;

/** Returns the binaries directory, installing Debian's `postgresql` when missing and running as root. */
export function ensurePostgresInstalled(): string {
  const found = findPostgresBinaries();
  if (found) return found;
  if (!isRoot()) {
    throw new Error(
      'PostgreSQL server binaries not found under /usr/lib/postgresql. Install them with ' +
        '`sudo apt-get install -y postgresql`, or set DATABASE_URL to use an existing server.',
    );
  }
  console.log('Installing PostgreSQL from Debian packages (apt-get install postgresql)…');
  execFileSync('apt-get', ['update'], { stdio: 'inherit' });
  execFileSync('apt-get', ['install', '-y', '--no-install-recommends', 'postgresql'], {
    stdio: 'inherit',
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
  const installed = findPostgresBinaries();
  if (!installed) throw new Error('apt-get finished but no PostgreSQL binaries appeared under /usr/lib/postgresql');
  return installed;
}

/** initdb and pg_ctl refuse to run as root, so as root they run as the `postgres` system user. */
function runPg(bin: string, args: string[]) {
  const command = isRoot() ? 'runuser' : bin;
  const fullArgs = isRoot() ? ['-u', 'postgres', '--', bin, ...args] : args;
  const result = spawnSync(command, fullArgs, { encoding: 'utf8' });
  return { ok: result.status === 0, output: `${result.stdout ?? ''}${result.stderr ?? ''}`.trim() };
}

function ensureCluster(binDir: string, dataDir: string) {
  if (fs.existsSync(path.join(dataDir, 'PG_VERSION'))) return;
  fs.mkdirSync(dataDir, { recursive: true });
  if (isRoot()) {
    // The postgres user must be able to walk down to the cluster and own it.
    execFileSync('chown', ['-R', 'postgres:postgres', dataDir]);
    for (let dir = path.dirname(dataDir); dir !== '/'; dir = path.dirname(dir)) {
      const mode = fs.statSync(dir).mode;
      if ((mode & 0o001) === 0) fs.chmodSync(dir, mode | 0o001);
    }
  }
  fs.chmodSync(dataDir, 0o700);
  const init = runPg(path.join(binDir, 'initdb'), [
    '-D', dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8',
  ]);
  if (!init.ok) throw new Error(`initdb failed for ${dataDir}:\n${init.output}`);
}

function isRunning(binDir: string, dataDir: string): boolean {
  return runPg(path.join(binDir, 'pg_ctl'), ['-D', dataDir, 'status']).ok;
}

/** Admin connection URL of the local cluster for a database name. */
export function localDatabaseUrl(database: string): string {
  const { pgPort } = loadConfig();
  return `postgres://postgres@127.0.0.1:${pgPort}/${database}`;
}

/**
 * Makes sure a PostgreSQL server is reachable and returns the URL of the configured database,
 * starting the local cluster (and creating it, and the database) when needed.
 */
export async function ensureDatabaseServer(databaseName = loadConfig().databaseName): Promise<string> {
  const config = loadConfig();
  if (config.externalDatabaseUrl) return config.externalDatabaseUrl;
  const binDir = ensurePostgresInstalled();
  ensureCluster(binDir, config.pgDataDir);
  if (!isRunning(binDir, config.pgDataDir)) {
    const start = runPg(path.join(binDir, 'pg_ctl'), [
      '-D', config.pgDataDir, '-l', path.join(config.pgDataDir, 'server.log'), '-w', '-t', '60',
      // Sized for the prefix index on a development machine: a 1M-set index (~2 GB of prefix rows and
      // their index) keeps its hot pages in shared buffers; no parallel workers or JIT for the many
      // short index-lookup queries; WAL roomy enough that a bulk load does not force checkpoints.
      '-o', [
        `-h 127.0.0.1 -p ${config.pgPort} -k ${config.pgDataDir}`,
        '-c shared_buffers=1GB -c work_mem=32MB -c jit=off -c max_parallel_workers_per_gather=0',
        '-c max_wal_size=4GB -c checkpoint_timeout=15min',
      ].join(' '), 'start',
    ]);
    if (!start.ok && !isRunning(binDir, config.pgDataDir)) {
      throw new Error(
        `PostgreSQL did not start on 127.0.0.1:${config.pgPort} (is the port taken? set DOUBLET_PG_PORT):\n${start.output}`,
      );
    }
  }
  await createDatabaseIfMissing(databaseName);
  return localDatabaseUrl(databaseName);
}

/** Creates a database on the local cluster when it does not exist yet. */
export async function createDatabaseIfMissing(name: string): Promise<void> {
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`invalid database name "${name}"`);
  const client = new pg.Client({ connectionString: localDatabaseUrl('postgres') });
  await client.connect();
  try {
    const exists = await client.query('select 1 from pg_database where datname = $1', [name]);
    if (exists.rowCount === 0) await client.query(`create database ${name}`);
  } finally {
    await client.end();
  }
}

/** Drops a database on the local cluster (used by the test run to clean up after itself). */
export async function dropDatabase(name: string): Promise<void> {
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`invalid database name "${name}"`);
  const client = new pg.Client({ connectionString: localDatabaseUrl('postgres') });
  await client.connect();
  try {
    await client.query(`drop database if exists ${name} with (force)`);
  } finally {
    await client.end();
  }
}

/** Stops the local cluster when it runs; a no-op with DATABASE_URL. */
export function stopDatabaseServer(): void {
  const config = loadConfig();
  if (config.externalDatabaseUrl) return;
  const binDir = findPostgresBinaries();
  if (!binDir || !fs.existsSync(path.join(config.pgDataDir, 'PG_VERSION'))) return;
  if (!isRunning(binDir, config.pgDataDir)) return;
  const stop = runPg(path.join(binDir, 'pg_ctl'), ['-D', config.pgDataDir, '-m', 'fast', '-w', 'stop']);
  if (!stop.ok) throw new Error(`pg_ctl stop failed:\n${stop.output}`);
}
