import { spawnSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { projectRoot } from '../../../server/config';
import { connect, disconnect } from '../../../server/db/connection';
import { migrateUp } from '../../../server/db/migrate';
import { startJobs, stopJobs } from '../../../server/jobs';
import { createDatabaseIfMissing, dropDatabase } from '../../../server/db/postgres';
import { initModels } from '../../../server/models';
import { buildRepository, buildTeam, loadFolder, RELEASES } from '../../support';

/**
 * `npm run db:backup` and `npm run db:restore` round trip, through the command line as an operator
 * runs them. The suite's shared database changes under parallel files, so this file seeds a
 * database of its own on the same server and restores into another new one.
 */

const suffix = crypto.randomBytes(4).toString('hex');
const SOURCE = `doublet_backup_source_${suffix}`;
const TARGET = `doublet_backup_target_${suffix}`;

function onServer(database: string): string {
  const url = new URL(process.env.DATABASE_URL!);
  url.pathname = `/${database}`;
  return url.toString();
}

const ADMIN = () => onServer('postgres');
let tmp: string;

function dbCli(database: string, ...args: string[]) {
  const result = spawnSync(process.execPath, ['--import', 'tsx', 'server/db/cli.ts', ...args], {
    cwd: projectRoot,
    env: { ...process.env, DATABASE_URL: onServer(database) },
    encoding: 'utf8',
    timeout: 120_000,
  });
  return { status: result.status, output: `${result.stdout}${result.stderr}` };
}

/** Row count of every table outside the system schemas, by schema-qualified name. */
async function rowCounts(database: string): Promise<Record<string, number>> {
  const client = new pg.Client({ connectionString: onServer(database) });
  await client.connect();
  try {
    const tables = await client.query<{ name: string }>(
      `select format('%I.%I', table_schema, table_name) as name from information_schema.tables
        where table_type = 'BASE TABLE' and table_schema not in ('pg_catalog', 'information_schema') order by 1`,
    );
    const counts: Record<string, number> = {};
    for (const { name } of tables.rows) {
      counts[name] = Number((await client.query(`select count(*) as n from ${name}`)).rows[0].n);
    }
    return counts;
  } finally {
    await client.end();
  }
}

beforeAll(async () => {
  if (!process.env.DATABASE_URL) throw new Error('DATABASE_URL is not set: run the tests with `npm test`');
  tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-backup-'));
  await createDatabaseIfMissing(SOURCE, ADMIN());
  await createDatabaseIfMissing(TARGET, ADMIN());
  const sequelize = connect(onServer(SOURCE));
  await migrateUp(sequelize);
  initModels(sequelize);
  // As in a running installation, the job queue lives in the same database (a load queues its
  // notices there), and its tables are backed up with the rest. Stopped before the backup: no
  // worker or maintenance changes them while rows are counted.
  await startJobs({ connectionString: onServer(SOURCE) });
  const team = await buildTeam();
  const repository = await buildRepository({ organisationId: team.organisation.id, name: 'freight-platform' });
  await loadFolder(repository, path.join(RELEASES, 'v1'), '2026.09');
  await loadFolder(repository, path.join(RELEASES, 'v2'), '2026.10');
  await stopJobs({ timeoutMs: 1000 });
  await disconnect();
}, 120_000);

afterAll(async () => {
  await disconnect();
  await dropDatabase(SOURCE, ADMIN());
  await dropDatabase(TARGET, ADMIN());
  if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
});

describe('db:backup and db:restore', () => {
  it('round-trips every table with the same row counts, refuses a non-empty target, and replaces it with --force', async () => {
    const file = path.join(tmp, 'freight.dump');
    const backup = dbCli(SOURCE, 'backup', '--out', file);
    expect(backup.output).toContain('Backup written');
    expect(backup.status).toBe(0);
    expect(fs.readFileSync(file).subarray(0, 5).toString()).toBe('PGDMP'); // custom-format magic
    expect(dbCli(SOURCE, 'backup', '--out', file).status).not.toBe(0); // never overwrites

    const restore = dbCli(TARGET, 'restore', file);
    expect(restore.output).toContain('Restored');
    expect(restore.status).toBe(0);

    const source = await rowCounts(SOURCE);
    const restored = await rowCounts(TARGET);
    expect(Object.keys(restored)).toEqual(Object.keys(source));
    expect(restored).toEqual(source);
    // The comparison is not of empty tables: the seeded team, the loaded snapshots and their index are there.
    expect(source['public.users']).toBe(4);
    expect(source['public.snapshots']).toBe(2);
    expect(source['public.fragments']).toBeGreaterThan(0);
    expect(source['public.set_pairs']).toBeGreaterThan(0);
    // 2026.10 has a drifted class: its notices' job is queued, and restored with the rest.
    expect(source['pgboss.job']).toBeGreaterThan(0);

    const refused = dbCli(TARGET, 'restore', file);
    expect(refused.status).toBe(1);
    expect(refused.output).toMatch(/is not empty .* pass --force/);
    expect(await rowCounts(TARGET)).toEqual(source);

    const forced = dbCli(TARGET, 'restore', file, '--force');
    expect(forced.status).toBe(0);
    expect(await rowCounts(TARGET)).toEqual(source);
  }, 180_000);

  it('refuses a file that is not a backup, before touching the target', async () => {
    const before = await rowCounts(TARGET);
    expect(before['public.users']).toBe(4);
    const notADump = path.join(tmp, 'notes.dump');
    fs.writeFileSync(notADump, 'not an archive');
    const result = dbCli(TARGET, 'restore', notADump, '--force');
    expect(result.status).toBe(1);
    expect(result.output).toContain('is not a pg_dump custom-format archive');
    expect(await rowCounts(TARGET)).toEqual(before);
  }, 60_000);
});
