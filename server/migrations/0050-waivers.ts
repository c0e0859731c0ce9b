import type { Migration } from '../db/migrate';

/**
 * Waivers: a lead's decision that one class lineage is accepted for now (a reason, optionally "until
 * release …"). At most one waiver of a lineage is active (ended_at is null); a waiver ends when it is
 * lifted or, by itself, when a load finds a new member in the lineage's class (ended_snapshot_id
 * names that snapshot). snapshot_metrics gains the cloned tokens counted without the classes whose
 * lineage was waived when the snapshot was loaded; rows stored before this migration had no waivers,
 * so their unwaived count is their cloned count.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`
    create table waivers (
      id serial primary key,
      lineage_id integer not null references class_lineages(id) on delete cascade,
      reason text not null check (char_length(reason) between 1 and 500),
      until_label text check (until_label is null or char_length(until_label) between 1 and 100),
      created_by uuid references users(id) on delete set null,
      created_at timestamptz not null default now(),
      ended_at timestamptz,
      ended_reason text,
      ended_snapshot_id integer references snapshots(id) on delete set null
    )`);
  await sequelize.query(`create unique index waivers_active_lineage on waivers (lineage_id) where ended_at is null`);
  await sequelize.query(`create index waivers_lineage on waivers (lineage_id)`);
  await sequelize.query(`alter table snapshot_metrics add column unwaived_cloned_tokens bigint`);
  await sequelize.query(`update snapshot_metrics set unwaived_cloned_tokens = cloned_tokens`);
  await sequelize.query(`alter table snapshot_metrics alter column unwaived_cloned_tokens set not null`);
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('alter table snapshot_metrics drop column unwaived_cloned_tokens');
  await sequelize.query('drop table waivers');
};
