import type { Migration } from '../db/migrate';

/**
 * Clone classes that span repositories, and the one definition of "the latest ready snapshot of a
 * repository" every query joins.
 *
 * - `latest_ready_snapshots`: a view, one row a repository with a ready snapshot (the newest by id).
 * - `cross_pairs`: the clone pairs a load finds between its snapshot's fragments and those of the
 *   latest ready snapshot of every other repository of the organisation (until now only counted).
 * - `cross_classes` / `cross_class_members`: the organisation's classes that span repositories,
 *   rebuilt after each load and each deletion of a repository from the cross pairs between the
 *   current latest snapshots and those snapshots' own classes. Migration 0101 fills in the pairs
 *   of snapshots loaded before this one.
 */
// Every column a cascade follows is indexed, so deleting a repository does not scan these tables
// once per deleted row. Fragment ids carry no foreign key: a fragment is only deleted with the file
// content no snapshot holds any more, by which time the rows that name it went with their snapshot file.
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`create index snapshots_latest_ready on snapshots (repository_id, id desc) where status = 'ready'`);
  await sequelize.query(`
    create view latest_ready_snapshots as
      select distinct on (repository_id) repository_id, id as snapshot_id
        from snapshots where status = 'ready' order by repository_id, id desc`);
  await sequelize.query(`
    create table cross_pairs (
      snapshot_id integer not null references snapshots(id) on delete cascade,
      snapshot_file_id integer not null references snapshot_files(id) on delete cascade,
      fragment_id integer not null,
      other_snapshot_id integer not null references snapshots(id) on delete cascade,
      other_snapshot_file_id integer not null references snapshot_files(id) on delete cascade,
      other_fragment_id integer not null,
      similarity double precision not null,
      clone_type integer not null
    )`);
  await sequelize.query(`create index cross_pairs_snapshot on cross_pairs (snapshot_id)`);
  await sequelize.query(`create index cross_pairs_other_snapshot on cross_pairs (other_snapshot_id)`);
  await sequelize.query(`create index cross_pairs_file on cross_pairs (snapshot_file_id)`);
  await sequelize.query(`create index cross_pairs_other_file on cross_pairs (other_snapshot_file_id)`);
  await sequelize.query(`
    create table cross_classes (
      id serial primary key,
      organisation_id uuid not null references organisations(id) on delete cascade,
      ordinal integer not null,
      size integer not null,
      tokens integer not null,
      repository_count integer not null,
      min_similarity double precision not null,
      max_similarity double precision not null,
      clone_type integer not null,
      language text not null,
      created_at timestamptz not null default now()
    )`);
  await sequelize.query(`create index cross_classes_organisation on cross_classes (organisation_id)`);
  await sequelize.query(`
    create table cross_class_members (
      cross_class_id integer not null references cross_classes(id) on delete cascade,
      snapshot_id integer not null references snapshots(id) on delete cascade,
      snapshot_file_id integer not null references snapshot_files(id) on delete cascade,
      fragment_id integer not null,
      class_id integer references clone_classes(id) on delete set null,
      primary key (cross_class_id, snapshot_file_id, fragment_id)
    )`);
  await sequelize.query(`create index cross_class_members_file on cross_class_members (snapshot_file_id)`);
  await sequelize.query(`create index cross_class_members_snapshot on cross_class_members (snapshot_id)`);
  await sequelize.query(`create index cross_class_members_class on cross_class_members (class_id)`);
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('drop table cross_class_members, cross_classes, cross_pairs');
  await sequelize.query('drop view latest_ready_snapshots');
  await sequelize.query('drop index snapshots_latest_ready');
};
