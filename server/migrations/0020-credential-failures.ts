import type { Migration } from '../db/migrate';

/**
 * Failed credential checks (wrong password at sign-in or change password, unusable invitation
 * link), counted per key in a fixed window, so every server process shares the same limits. Keys
 * name an account, an address, or both (see server/auth/credential-limit.ts); rows whose window has
 * passed are pruned.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`
    create table credential_failures (
      key text primary key,
      failures integer not null,
      window_started_at timestamptz not null
    )`);
  await sequelize.query(`create index credential_failures_window on credential_failures (window_started_at)`);
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('drop table credential_failures');
};
