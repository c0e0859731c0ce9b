import crypto from 'node:crypto';
import { QueryTypes, Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect, db, disconnect } from '../../../server/db/connection';
import { migrateUp } from '../../../server/db/migrate';
import { startJobs, stopJobs } from '../../../server/jobs';
import { up } from '../../../server/migrations/0040-class-lineages';
import { initModels } from '../../../server/models';
import { buildRepository, loadFolder, RELEASES } from '../../support';

/**
 * The lineage migration's backfill, on a database of this file's own: the test drops the lineage
 * column and table, which must not disturb the files that share the suite's database.
 */
const name = `doublet_lineage_${crypto.randomBytes(4).toString('hex')}`;
let admin: Sequelize;

beforeAll(async () => {
  const url = new URL(process.env.DATABASE_URL!);
  admin = new Sequelize(url.toString(), { dialect: 'postgres', logging: false });
  await admin.query(`create database ${name}`);
  url.pathname = `/${name}`;
  initModels(connect(url.toString()));
  await migrateUp(db());
  // A load queues its notices in its own transaction: the job queue must live in this database too.
  await startJobs({ connectionString: url.toString() });
}, 60_000);

afterAll(async () => {
  await stopJobs({ timeoutMs: 1000 });
  await disconnect();
  await admin.query(`drop database if exists ${name}`);
  await admin.close();
});

/** Every class with its lineage and that lineage's first snapshot, by class id. */
async function classLineages() {
  return db().query<{ id: number; lineageId: number; firstSnapshotId: number; repositoryId: number }>(
    `select c.id, c.lineage_id as "lineageId", l.first_snapshot_id as "firstSnapshotId", l.repository_id as "repositoryId"
       from clone_classes c join class_lineages l on l.id = c.lineage_id order by c.id`,
    { type: QueryTypes.SELECT },
  );
}

describe('migration 0040-class-lineages', () => {
  it('gives classes stored before it the lineages a load would have given them', async () => {
    for (const repository of [await buildRepository(), await buildRepository()]) {
      for (const v of ['v1', 'v2', 'v3']) await loadFolder(repository, `${RELEASES}/${v}`, v);
    }
    const loaded = await classLineages();
    expect(new Set(loaded.map((c) => c.lineageId)).size).toBeLessThan(loaded.length);

    // back to the schema before the migration, then run it over the stored classes
    await db().query('alter table clone_classes drop column lineage_id');
    await db().query('drop table class_lineages cascade');
    await up({ sequelize: db(), queryInterface: db().getQueryInterface() });

    const replayed = await classLineages();
    expect(replayed.map((c) => c.id)).toEqual(loaded.map((c) => c.id));
    // the same classes share a lineage, each lineage starts in the same snapshot of the same repository
    const renamed = new Map<number, number>();
    loaded.forEach((c, i) => {
      const r = replayed[i];
      expect(renamed.get(c.lineageId) ?? r.lineageId).toBe(r.lineageId);
      renamed.set(c.lineageId, r.lineageId);
      expect([r.firstSnapshotId, r.repositoryId]).toEqual([c.firstSnapshotId, c.repositoryId]);
    });
    expect(new Set(renamed.values()).size).toBe(renamed.size);
    const [{ nullable }] = await db().query<{ nullable: string }>(
      `select is_nullable as nullable from information_schema.columns where table_name = 'clone_classes' and column_name = 'lineage_id'`,
      { type: QueryTypes.SELECT },
    );
    expect(nullable).toBe('NO');
  }, 180_000);
});
