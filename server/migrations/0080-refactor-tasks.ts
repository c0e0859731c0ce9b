import type { Migration } from '../db/migrate';

/**
 * Refactor tasks: a lead's request to consolidate one class lineage, assigned to a member of the
 * organisation, with a status of Doublet's own (open, in progress, in review, done, won't do), its
 * history of changes and comments. A task points at the lineage, so it follows the copies from
 * release to release; closed_by_snapshot_id names the snapshot in which a load found the lineage
 * gone and marked the task done by itself (null once a person changes the status again), and
 * closed_member_keys the members (path, name, occurrence) the lineage last had, so a later load can
 * tell that the copies came back.
 *
 * task_events keep every change: who (actor_id; automatic rows are Doublet's own, with no user),
 * when, what (kind) and from/to as text. Deleting the repository deletes its tasks.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`
    create table tasks (
      id serial primary key,
      organisation_id uuid not null references organisations (id) on delete cascade,
      repository_id integer not null references repositories (id) on delete cascade,
      lineage_id integer not null references class_lineages (id) on delete cascade,
      title text not null check (char_length(title) between 1 and 200),
      description text not null default '' check (char_length(description) <= 5000),
      status text not null default 'open' check (status in ('open', 'in_progress', 'in_review', 'done', 'wont_do')),
      wont_do_reason text check (wont_do_reason is null or char_length(wont_do_reason) between 1 and 500),
      assignee_id uuid references users (id) on delete set null,
      created_by uuid references users (id) on delete set null,
      due_on date,
      closed_by_snapshot_id integer references snapshots (id) on delete set null,
      closed_member_keys text[],
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now()
    )`);
  await sequelize.query(`create index tasks_organisation on tasks (organisation_id, updated_at desc)`);
  await sequelize.query(`create index tasks_repository_status on tasks (repository_id, status)`);
  await sequelize.query(`create index tasks_lineage on tasks (lineage_id)`);
  await sequelize.query(`create index tasks_assignee on tasks (assignee_id)`);
  await sequelize.query(`
    create table task_events (
      id serial primary key,
      task_id integer not null references tasks (id) on delete cascade,
      actor_id uuid references users (id) on delete set null,
      automatic boolean not null default false,
      kind text not null check (kind in ('created', 'status', 'assignee', 'title', 'description', 'due')),
      from_value text,
      to_value text,
      note text check (note is null or char_length(note) <= 1000),
      snapshot_id integer references snapshots (id) on delete set null,
      created_at timestamptz not null default now()
    )`);
  await sequelize.query(`create index task_events_task on task_events (task_id, id)`);
  await sequelize.query(`
    create table task_comments (
      id serial primary key,
      task_id integer not null references tasks (id) on delete cascade,
      author_id uuid references users (id) on delete set null,
      body text not null check (char_length(body) between 1 and 5000),
      created_at timestamptz not null default now()
    )`);
  await sequelize.query(`create index task_comments_task on task_comments (task_id, id)`);
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('drop table task_comments');
  await sequelize.query('drop table task_events');
  await sequelize.query('drop table tasks');
};
