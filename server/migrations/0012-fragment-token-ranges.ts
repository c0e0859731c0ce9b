import type { Migration } from '../db/migrate';

/**
 * Each fragment's token range in its file ([token_start, token_end) of the file's token stream),
 * so the clone ratio counts every source token once even where functions nest.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`
    alter table fragments add column token_start integer not null default 0;
    alter table fragments add column token_end integer not null default 0;
  `);
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('alter table fragments drop column token_start, drop column token_end');
};
