import type { Migration } from '../db/migrate';

/**
 * Repository-scoped API tokens for CI. Only a SHA-256 of the secret is stored (a database read
 * hands out no working token); `prefix` is the first characters, kept so people can tell tokens
 * apart. Deleting the repository deletes its tokens.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`
    create table api_tokens (
      id serial primary key,
      organisation_id uuid not null references organisations (id) on delete cascade,
      repository_id integer not null references repositories (id) on delete cascade,
      name text not null,
      token_hash char(64) not null unique,
      prefix text not null,
      created_by uuid references users (id) on delete set null,
      created_at timestamptz not null default now(),
      expires_at timestamptz,
      last_used_at timestamptz,
      revoked_at timestamptz
    )`);
  await sequelize.query(`create index api_tokens_organisation on api_tokens (organisation_id)`);
  await sequelize.query(`create index api_tokens_repository on api_tokens (repository_id)`);
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('drop table api_tokens');
};
