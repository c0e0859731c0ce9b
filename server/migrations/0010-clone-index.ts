import type { Migration } from '../db/migrate';

/**
 * Repositories, snapshots and the content-addressed prefix index.
 * High-volume tables (shingles, shingle_sets, prefix_entries, set_pairs, fragments) are written
 * with unnest-array batches and read by hand-written SQL; their layout serves those queries.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`
    create table repositories (
      id serial primary key,
      organisation_id uuid not null references organisations(id) on delete cascade,
      name text not null,
      description text not null default '',
      threshold numeric(7,6) not null default 0.8,
      min_tokens integer not null default 50,
      shingle_size integer not null default 3,
      ignore text[] not null default '{}',
      clone_budget numeric(7,6),
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now(),
      unique (organisation_id, name)
    );

    create table snapshots (
      id serial primary key,
      repository_id integer not null references repositories(id) on delete cascade,
      label text not null,
      source text not null default 'folder',
      commit_sha text,
      status text not null default 'pending',
      error text,
      settings jsonb not null default '{}',
      file_count integer not null default 0,
      skipped_count integer not null default 0,
      failed_count integer not null default 0,
      analyzed_file_count integer not null default 0,
      fragment_count integer not null default 0,
      new_set_count integer not null default 0,
      clone_ratio double precision,
      timings jsonb not null default '{}',
      created_at timestamptz not null default now(),
      updated_at timestamptz not null default now(),
      unique (repository_id, label)
    );

    -- File text stored once per content hash (sha-256 of the bytes).
    create table file_contents (
      hash text primary key,
      text text not null,
      byte_size integer not null,
      created_at timestamptz not null default now()
    );

    -- One analysis of one content under one set of analyzer options.
    create table analyses (
      id serial primary key,
      content_hash text not null references file_contents(hash) on delete cascade,
      options_key text not null,
      language text not null,
      error text,
      unique (content_hash, options_key)
    );

    -- Shingle dictionary. rank is the global order: lower = rarer. New shingles get ranks below
    -- every known one, so stored sets never change order until a rebuild re-ranks everything.
    create table shingles (
      id serial primary key,
      text text not null unique,
      rank integer not null unique
    );

    -- A shingle set stored once per hash of its sorted shingles; ranks ascending.
    create table shingle_sets (
      id serial primary key,
      hash text not null unique,
      size integer not null,
      ranks integer[] not null
    );

    -- Probing prefix (at the lowest threshold the index serves) of every stored set.
    create table prefix_entries (
      rank integer not null,
      set_id integer not null,
      position integer not null,
      size integer not null
    );
    create index prefix_entries_probe on prefix_entries (rank, size) include (set_id, position);
    create index prefix_entries_set on prefix_entries (set_id);

    -- Every pair of distinct stored sets at or above the lowest threshold, set_a < set_b.
    create table set_pairs (
      set_a integer not null,
      set_b integer not null,
      overlap integer not null,
      similarity double precision not null,
      primary key (set_a, set_b)
    );
    create index set_pairs_b on set_pairs (set_b);

    create table fragments (
      id serial primary key,
      analysis_id integer not null references analyses(id) on delete cascade,
      ordinal integer not null,
      name text not null,
      kind text not null,
      start_line integer not null,
      start_column integer not null,
      end_line integer not null,
      end_column integer not null,
      tokens integer not null,
      raw_hash text not null,
      normalized_hash text not null,
      set_id integer not null references shingle_sets(id),
      unique (analysis_id, ordinal)
    );
    create index fragments_set on fragments (set_id);

    create table snapshot_files (
      id serial primary key,
      snapshot_id integer not null references snapshots(id) on delete cascade,
      path text not null,
      content_hash text references file_contents(hash),
      analysis_id integer references analyses(id),
      language text,
      skip_reason text,
      error text,
      unique (snapshot_id, path)
    );
    create index snapshot_files_analysis on snapshot_files (analysis_id);

    create table clone_classes (
      id serial primary key,
      snapshot_id integer not null references snapshots(id) on delete cascade,
      ordinal integer not null,
      size integer not null,
      tokens integer not null,
      min_similarity double precision not null,
      max_similarity double precision not null,
      clone_type integer not null,
      language text not null,
      status text not null default 'new',
      previous_class_id integer references clone_classes(id) on delete set null,
      unique (snapshot_id, ordinal)
    );

    create table clone_class_members (
      class_id integer not null references clone_classes(id) on delete cascade,
      snapshot_file_id integer not null references snapshot_files(id) on delete cascade,
      fragment_id integer not null references fragments(id),
      code_changed boolean not null default false,
      primary key (class_id, snapshot_file_id, fragment_id)
    );
    create index clone_class_members_file on clone_class_members (snapshot_file_id);

    create table snapshot_metrics (
      snapshot_id integer primary key references snapshots(id) on delete cascade,
      fragment_tokens bigint not null,
      cloned_tokens bigint not null,
      clone_ratio double precision not null,
      pair_count integer not null,
      class_count integer not null,
      type1_pairs integer not null,
      type2_pairs integer not null,
      type3_pairs integer not null,
      cross_pair_count integer not null,
      new_class_count integer not null,
      drifted_class_count integer not null,
      gone_class_count integer not null
    );
  `);
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query(`
    drop table if exists snapshot_metrics, clone_class_members, clone_classes, snapshot_files, fragments,
      set_pairs, prefix_entries, shingle_sets, shingles, analyses, file_contents, snapshots, repositories cascade;
  `);
};
