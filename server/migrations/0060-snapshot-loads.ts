import type { Migration } from '../db/migrate';

/**
 * Loads become background jobs. A snapshot's status is one of queued | running | ready | failed |
 * cancelled ('pending', never written by any load, becomes 'queued'); `progress` holds the phase
 * and counts of a load in progress (null otherwise); `started_by` is who uploaded it (they may
 * cancel it); `archive_sha256` tells an upload sent again from a new one; `load_attempt` fences
 * attempts: an attempt writes only while the row still carries its number, so a retry that took
 * over from a worker thought dead stops the old one.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query(`update snapshots set status = 'queued' where status = 'pending'`);
  await sequelize.query(`update snapshots set status = 'failed', error = coalesce(error, 'Unknown status ' || status) where status not in ('queued', 'running', 'ready', 'failed')`);
  await sequelize.query(`alter table snapshots alter column status set default 'queued'`);
  await sequelize.query(`alter table snapshots add constraint snapshots_status check (status in ('queued', 'running', 'ready', 'failed', 'cancelled'))`);
  await sequelize.query(`alter table snapshots add column progress jsonb`);
  await sequelize.query(`alter table snapshots add column started_by uuid references users (id) on delete set null`);
  await sequelize.query(`alter table snapshots add column archive_sha256 char(64)`);
  await sequelize.query(`alter table snapshots add column load_attempt integer not null default 0`);
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('alter table snapshots drop column load_attempt');
  await sequelize.query('alter table snapshots drop column archive_sha256');
  await sequelize.query('alter table snapshots drop column started_by');
  await sequelize.query('alter table snapshots drop column progress');
  await sequelize.query('alter table snapshots drop constraint snapshots_status');
  await sequelize.query(`update snapshots set status = 'failed' where status = 'cancelled'`);
  await sequelize.query(`update snapshots set status = 'pending' where status = 'queued'`);
  await sequelize.query(`alter table snapshots alter column status set default 'pending'`);
};
