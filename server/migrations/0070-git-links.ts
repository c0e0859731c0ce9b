import type { Migration } from '../db/migrate';

/**
 * A repository's link to a git remote: where its releases come from (the remote, never with
 * credentials in it: the server's credential helper or ssh key supplies those) and which tags are
 * releases (a glob, `*` by default). The import_* columns are the state of the last "Import
 * releases" run, as the repository page shows it; its error text has credentials redacted.
 * Deleting the repository deletes its link.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`
    create table git_links (
      repository_id integer primary key references repositories (id) on delete cascade,
      remote_url text not null check (char_length(remote_url) between 1 and 2048),
      tag_pattern text not null default '*' check (char_length(tag_pattern) between 1 and 200),
      created_by uuid references users (id) on delete set null,
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now(),
      import_status text check (import_status in ('queued', 'running', 'succeeded', 'failed')),
      import_requested_at timestamptz,
      import_started_at timestamptz,
      import_finished_at timestamptz,
      import_tag_count integer,
      import_new_tag_count integer,
      import_loaded_count integer,
      import_current_tag text,
      import_error text
    )`);
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('drop table git_links');
};
