import type { Migration } from '../db/migrate';

/**
 * Load notices: one row a snapshot whose notice mails (over budget, drifted classes) have been
 * queued. The `load.notices` job claims the row in the transaction that queues the mails, so a job
 * run twice (a retry after a lost answer) never mails twice.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`
    create table load_notices (
      snapshot_id integer primary key references snapshots(id) on delete cascade,
      queued_at timestamptz not null default now()
    )`);
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('drop table load_notices');
};
