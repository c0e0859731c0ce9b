import type { Migration } from '../db/migrate';

/**
 * The session table of connect-pg-simple (its documented layout: sid, sess, expire), created here
 * rather than lazily by the store. `sess` is jsonb so a user's sessions can be found and ended when
 * they are deactivated.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`
    create table sessions (
      sid varchar not null primary key,
      sess jsonb not null,
      expire timestamp(6) not null
    )`);
  await sequelize.query(`create index sessions_expire on sessions (expire)`);
  await sequelize.query(`create index sessions_user on sessions ((sess -> 'passport' ->> 'user'))`);
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('drop table sessions');
};
