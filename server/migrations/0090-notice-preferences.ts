import type { Migration } from '../db/migrate';

/**
 * Notice preferences: which kinds of notice mail a user has turned off or on again. A missing row
 * means on, so a user who never opened their settings gets every notice, and a new kind is on for
 * everyone until they turn it off.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`
    create table notice_preferences (
      user_id uuid not null references users(id) on delete cascade,
      kind text not null check (char_length(kind) between 1 and 40),
      enabled boolean not null,
      updated_at timestamptz not null default now(),
      primary key (user_id, kind)
    )`);
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('drop table notice_preferences');
};
