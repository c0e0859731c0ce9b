import { execFile } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';
import { findPostgresBinaries } from './postgres';

/**
 * Backup and restore of a Doublet database with Debian's pg_dump and pg_restore, in pg_dump's
 * custom format (compressed, restorable table by table). The tools come from the same
 * /usr/lib/postgresql/<major>/bin as the server's major version when that is installed, else the
 * newest one installed (pg_dump reads servers older than itself, not newer).
 */

const run = promisify(execFile);
const DEBIAN_ROOT = '/usr/lib/postgresql';

/** A connection URL split into what the tools take on the command line and the password they take from the environment. */
function toolConnection(url: string): { dbname: string; env: NodeJS.ProcessEnv; database: string } {
  const parsed = new URL(url);
  const password = decodeURIComponent(parsed.password);
  parsed.password = '';
  const env: NodeJS.ProcessEnv = { ...process.env };
  // Passed through the environment, so the password never shows in the process list.
  if (password) env.PGPASSWORD = password;
  return { dbname: parsed.toString(), env, database: decodeURIComponent(parsed.pathname.slice(1)) };
}

async function withClient<T>(url: string, work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

/** Directory of pg_dump/pg_restore that match the server behind `url`. */
export async function toolsFor(url: string): Promise<string> {
  const versionNum = await withClient(url, async (client) => Number((await client.query('show server_version_num')).rows[0].server_version_num));
  const major = Math.floor(versionNum / 10000);
  const same = path.join(DEBIAN_ROOT, String(major), 'bin');
  if (fs.existsSync(path.join(same, 'pg_dump'))) return same;
  const newest = findPostgresBinaries();
  if (newest && fs.existsSync(path.join(newest, 'pg_dump')) && Number(path.basename(path.dirname(newest))) >= major) return newest;
  throw new Error(
    `No pg_dump for PostgreSQL ${major} under ${DEBIAN_ROOT}: install Debian's postgresql-client-${major} (or a newer one).`,
  );
}

/** Tables, views and sequences outside the system schemas: what makes a database "not empty". */
export async function countRelations(url: string): Promise<number> {
  return withClient(url, async (client) => {
    const { rows } = await client.query(
      `select count(*)::int as n from pg_class c join pg_namespace n on n.oid = c.relnamespace
        where c.relkind in ('r', 'p', 'v', 'm', 'S', 'f')
          and n.nspname not in ('pg_catalog', 'information_schema') and n.nspname not like 'pg\\_toast%' and n.nspname not like 'pg\\_temp%'`,
    );
    return rows[0].n as number;
  });
}

/** What backupDatabase wrote. */
export interface BackupResult {
  file: string;
  bytes: number;
}

/**
 * Dumps the database behind `url` into `out` (custom format). The dump is written beside `out`
 * first and renamed when complete, so a failed dump never leaves a file that looks like a backup;
 * an existing `out` is never overwritten.
 *
 * @example
 * await backupDatabase('postgres://postgres@127.0.0.1:55433/doublet', '.data/backups/doublet.dump');
 */
export async function backupDatabase(url: string, out: string): Promise<BackupResult> {
  const file = path.resolve(out);
  if (fs.existsSync(file)) throw new Error(`${file} already exists: choose another --out or delete it first.`);
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const partial = `${file}.partial`;
  const tools = await toolsFor(url);
  const { dbname, env } = toolConnection(url);
  try {
    await run(path.join(tools, 'pg_dump'), ['--format=custom', '--no-password', '--file', partial, '--dbname', dbname], { env, maxBuffer: 16 * 1024 * 1024 });
    fs.renameSync(partial, file);
  } catch (error) {
    fs.rmSync(partial, { force: true });
    throw new Error(`pg_dump failed: ${toolMessage(error)}`);
  }
  return { file, bytes: fs.statSync(file).size };
}

/** Options of restoreDatabase. */
export interface RestoreOptions {
  /** replace whatever the target database holds (it is dropped and created anew first) */
  force?: boolean;
}

/**
 * Restores a custom-format dump into the database behind `url`. The target must be empty (no
 * tables, views or sequences outside the system schemas) unless `force`, which drops and creates
 * that database anew first (its open connections are ended). The archive is checked before
 * anything is touched, and the restore runs in one transaction, so a failure leaves the target
 * empty rather than half restored.
 *
 * @example
 * await restoreDatabase('postgres://postgres@127.0.0.1:55433/doublet', 'doublet.dump');
 */
export async function restoreDatabase(url: string, file: string, options: RestoreOptions = {}): Promise<void> {
  const archive = path.resolve(file);
  if (!fs.existsSync(archive)) throw new Error(`${archive} does not exist.`);
  const tools = await toolsFor(url);
  const { dbname, env, database } = toolConnection(url);
  try {
    await run(path.join(tools, 'pg_restore'), ['--list', archive], { env, maxBuffer: 64 * 1024 * 1024 });
  } catch (error) {
    throw new Error(`${archive} is not a pg_dump custom-format archive: ${toolMessage(error)}`);
  }
  const relations = await countRelations(url);
  if (relations > 0) {
    if (!options.force) {
      throw new Error(
        `The database "${database}" is not empty (${relations} tables, views or sequences): restore into an empty database, ` +
          'or pass --force to drop everything in it and replace it with the backup.',
      );
    }
    await recreateDatabase(url, database);
  }
  try {
    await run(
      path.join(tools, 'pg_restore'),
      ['--no-owner', '--no-privileges', '--exit-on-error', '--single-transaction', '--no-password', '--dbname', dbname, archive],
      { env, maxBuffer: 16 * 1024 * 1024 },
    );
  } catch (error) {
    throw new Error(`pg_restore failed (nothing was restored): ${toolMessage(error)}`);
  }
}

/** Drops and creates the database, from the server's maintenance database `postgres`. */
async function recreateDatabase(url: string, database: string): Promise<void> {
  const admin = new URL(url);
  admin.pathname = '/postgres';
  const quoted = `"${database.replace(/"/g, '""')}"`;
  await withClient(admin.toString(), async (client) => {
    await client.query(`drop database if exists ${quoted} with (force)`);
    await client.query(`create database ${quoted}`);
  });
}

/** The tool's own stderr (pg_dump/pg_restore say what went wrong there), bounded. */
function toolMessage(error: unknown): string {
  const stderr = (error as { stderr?: string }).stderr?.trim();
  const message = stderr || (error instanceof Error ? error.message : String(error));
  return message.slice(0, 2000);
}
