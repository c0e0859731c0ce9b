import { QueryTypes, type Sequelize } from 'sequelize';
import { assignLineages, type LineageClass } from '../clone-index/lineage';
import type { Migration } from '../db/migrate';

/**
 * Class lineages: one group of copies followed across a repository's snapshots (see
 * server/clone-index/lineage.ts). Every clone class belongs to one; a lineage remembers the snapshot
 * it started in (null once that snapshot is deleted, while later classes carry the lineage on).
 *
 * Classes stored before this migration get their lineages by replaying each repository's ready
 * snapshots in load order through the same rule a load applies; a class of a snapshot that is not
 * ready (none is expected: classes are written in the load's transaction) starts a lineage of its own.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`
    create table class_lineages (
      id serial primary key,
      repository_id integer not null references repositories(id) on delete cascade,
      first_snapshot_id integer references snapshots(id) on delete set null,
      created_at timestamptz not null default now()
    )`);
  await sequelize.query(`create index class_lineages_repository on class_lineages (repository_id)`);
  await sequelize.query(`alter table clone_classes add column lineage_id integer references class_lineages(id) on delete cascade`);
  await sequelize.query(`create index clone_classes_lineage on clone_classes (lineage_id)`);

  const snapshots = await sequelize.query<{ id: number; repositoryId: number }>(
    `select id, repository_id as "repositoryId" from snapshots where status = 'ready' order by repository_id, id`,
    { type: QueryTypes.SELECT },
  );
  let previous: LineageClass[] = [];
  let repositoryId = -1;
  for (const snapshot of snapshots) {
    if (snapshot.repositoryId !== repositoryId) {
      repositoryId = snapshot.repositoryId;
      previous = [];
    }
    previous = await replay(sequelize, snapshot.id, snapshot.repositoryId, previous);
  }
  const orphans = await sequelize.query<{ id: number; repositoryId: number; snapshotId: number }>(
    `select c.id, s.repository_id as "repositoryId", s.id as "snapshotId"
       from clone_classes c join snapshots s on s.id = c.snapshot_id where c.lineage_id is null order by c.id`,
    { type: QueryTypes.SELECT },
  );
  for (const orphan of orphans) {
    await sequelize.query(
      `with made as (insert into class_lineages (repository_id, first_snapshot_id) values ($1, $2) returning id)
       update clone_classes set lineage_id = (select id from made) where id = $3`,
      { bind: [orphan.repositoryId, orphan.snapshotId, orphan.id] },
    );
  }
  await sequelize.query(`alter table clone_classes alter column lineage_id set not null`);
};

/** Assigns lineages to one stored snapshot's classes and returns them as the next snapshot's previous classes. */
async function replay(sequelize: Sequelize, snapshotId: number, repositoryId: number, previous: LineageClass[]): Promise<LineageClass[]> {
  // a member's key, as fragmentKey knows it: path, name, and the occurrence of that name in the file
  // (as a JSON array: PostgreSQL text cannot hold fragmentKey's NUL separator)
  const rows = await sequelize.query<{ classId: number; members: string[] }>(
    `with numbered as (
       select sf.id as snapshot_file_id, f.id as fragment_id,
              json_build_array(sf.path, f.name, row_number() over (partition by sf.path, f.name order by f.ordinal) - 1)::text as key
         from snapshot_files sf join fragments f on f.analysis_id = sf.analysis_id
        where sf.snapshot_id = $1)
     select c.id as "classId", array_agg(n.key) as members
       from clone_classes c
       join clone_class_members m on m.class_id = c.id
       join numbered n on n.snapshot_file_id = m.snapshot_file_id and n.fragment_id = m.fragment_id
      where c.snapshot_id = $1
      group by c.id, c.ordinal
      order by c.ordinal`,
    { bind: [snapshotId], type: QueryTypes.SELECT },
  );
  const assigned = assignLineages(previous, rows.map((r) => r.members));
  const fresh = assigned.filter((a) => a === 'new').length;
  const made =
    fresh === 0
      ? []
      : await sequelize.query<{ id: number }>(
          `insert into class_lineages (repository_id, first_snapshot_id) select $1, $2 from generate_series(1, $3) returning id`,
          { bind: [repositoryId, snapshotId, fresh], type: QueryTypes.SELECT },
        );
  const newIds = made.map((m) => m.id).sort((a, b) => a - b);
  let next = 0;
  const lineageIds = assigned.map((a) => (a === 'new' ? newIds[next++] : a));
  if (rows.length > 0) {
    await sequelize.query(`update clone_classes c set lineage_id = u.lineage from unnest($1::int[], $2::int[]) as u(id, lineage) where c.id = u.id`, {
      bind: [rows.map((r) => r.classId), lineageIds],
    });
  }
  return rows.map((r, i) => ({ lineageId: lineageIds[i], members: r.members }));
}

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('alter table clone_classes drop column lineage_id');
  await sequelize.query('drop table class_lineages');
};
