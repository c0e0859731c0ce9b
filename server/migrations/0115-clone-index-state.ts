import type { Migration } from '../db/migrate';

/**
 * One row that tells a process whether its in-memory mirror of the index (server/clone-index/mirror.ts)
 * still describes this database: `instance` is drawn once per database, `epoch` grows with every
 * rebuild (which re-ranks every stored set). Loads only append sets, which the mirror reads by id.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`
    create table clone_index_state (
      singleton boolean primary key default true check (singleton),
      instance uuid not null default gen_random_uuid(),
      epoch integer not null default 0
    )`);
  await sequelize.query('insert into clone_index_state default values');
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('drop table clone_index_state');
};
