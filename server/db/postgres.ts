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

/** Where a cluster lives and how it listens: the project's own (from the configuration) or a test's throwaway one. */
export interface ClusterOptions {
  /** the cluster's data directory (created by initdb when missing) */
  dataDir: string;
  /** TCP port on 127.0.0.1 */
  port: number;
  /** server settings passed as `-c` flags at start; default: the development sizing below */
  settings?: string[];
}

// Sized for the prefix index on a development machine: a 1M-set index (~2 GB of prefix rows and
// their index) keeps its hot pages in shared buffers; no parallel workers or JIT for the many
// short index-lookup queries; WAL roomy enough that a bulk load does not force checkpoints.
const DEVELOPMENT_SETTINGS = [
  'shared_buffers=1GB', 'work_mem=32MB', 'jit=off', 'max_parallel_workers_per_gather=0',
  'max_wal_size=4GB', 'checkpoint_timeout=15min',
];

/** The project-local cluster: .data/postgres (DOUBLET_DATA_DIR) on DOUBLET_PG_PORT. */
export function localCluster(): ClusterOptions {
  const config = loadConfig();
  return { dataDir: config.pgDataDir, port: config.pgPort };
}

/**
 * Creates a cluster in `dataDir` with initdb (trust authentication, user postgres) unless one is
 * there already. As root the directory is handed to the postgres system user first.
 */
export function initCluster(binDir: string, dataDir: string): void {
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

/** True when a postmaster runs on the cluster's data directory. */
export function isClusterRunning(binDir: string, dataDir: string): boolean {
  return runPg(path.join(binDir, 'pg_ctl'), ['-D', dataDir, 'status']).ok;
}

/**
 * Starts the cluster (creating it first when needed) on 127.0.0.1 only, its Unix socket inside the
 * data directory; waits until it accepts connections. A no-op when it already runs.
 *
 * @example
 * startCluster({ dataDir: '/tmp/pg-test/data', port: 55999, settings: ['shared_buffers=16MB'] });
 */
export function startCluster(cluster: ClusterOptions): void {
  const binDir = ensurePostgresInstalled();
  initCluster(binDir, cluster.dataDir);
  if (isClusterRunning(binDir, cluster.dataDir)) return;
  const settings = (cluster.settings ?? DEVELOPMENT_SETTINGS).map((s) => `-c ${s}`);
  const start = runPg(path.join(binDir, 'pg_ctl'), [
    '-D', cluster.dataDir, '-l', path.join(cluster.dataDir, 'server.log'), '-w', '-t', '60',
    '-o', [`-h 127.0.0.1 -p ${cluster.port} -k ${cluster.dataDir}`, ...settings].join(' '), 'start',
  ]);
  if (!start.ok && !isClusterRunning(binDir, cluster.dataDir)) {
    throw new Error(
      `PostgreSQL did not start on 127.0.0.1:${cluster.port} (is the port taken? set DOUBLET_PG_PORT):\n${start.output}`,
    );
  }
}

/** Stops the cluster with pg_ctl's fast mode (open transactions roll back); a no-op when it is not running. */
export function stopCluster(cluster: ClusterOptions): void {
  const binDir = findPostgresBinaries();
  if (!binDir || !fs.existsSync(path.join(cluster.dataDir, 'PG_VERSION'))) return;
  if (!isClusterRunning(binDir, cluster.dataDir)) return;
  const stop = runPg(path.join(binDir, 'pg_ctl'), ['-D', cluster.dataDir, '-m', 'fast', '-w', 'stop']);
  if (!stop.ok) throw new Error(`pg_ctl stop failed:\n${stop.output}`);
}

/** Admin connection URL of a database on a local cluster listening on `port`. */
export function clusterDatabaseUrl(port: number, database: string): string {
  return `postgres://postgres@127.0.0.1:${port}/${database}`;
}

/** Admin connection URL of the local cluster for a database name. */
export function localDatabaseUrl(database: string): string {
  return clusterDatabaseUrl(loadConfig().pgPort, database);
}

/**
 * Makes sure a PostgreSQL server is reachable and returns the URL of the configured database,
 * starting the local cluster (and creating it, and the database) when needed.
 */
export async function ensureDatabaseServer(databaseName = loadConfig().databaseName): Promise<string> {
  const config = loadConfig();
  if (config.externalDatabaseUrl) return config.externalDatabaseUrl;
  startCluster(localCluster());
  await createDatabaseIfMissing(databaseName);
  return localDatabaseUrl(databaseName);
}

/**
 * Creates a database when it does not exist yet, on the local cluster or on the server of
 * `adminUrl` (a URL of any database there that the user may create databases from).
 */
export async function createDatabaseIfMissing(name: string, adminUrl = localDatabaseUrl('postgres')): Promise<void> {
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`invalid database name "${name}"`);
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    const exists = await client.query('select 1 from pg_database where datname = $1', [name]);
    if (exists.rowCount === 0) await client.query(`create database ${name}`);
  } finally {
    await client.end();
  }
}

/**
 * Drops a database, closing its connections first: on the local cluster, or on the server of
 * `adminUrl` (used by the test run and benchmarks to clean up after themselves).
 */
export async function dropDatabase(name: string, adminUrl = localDatabaseUrl('postgres')): Promise<void> {
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`invalid database name "${name}"`);
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    await client.query(`drop database if exists ${name} with (force)`);
  } finally {
    await client.end();
  }
}

/** Stops the local cluster when it runs; a no-op with DATABASE_URL. */
export function stopDatabaseServer(): void {
  if (loadConfig().externalDatabaseUrl) return;
  stopCluster(localCluster());
}
