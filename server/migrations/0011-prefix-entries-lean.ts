import type { Migration } from '../db/migrate';

/**
 * Drops the prefix table's index on set_id. No query reads prefix entries by set (the probe reads
 * them by rank through prefix_entries_probe, a rebuild rewrites the whole table), yet every set
 * added paid for it: with three structures to update per entry (heap and two indexes), this one
 * took about a third of the prefix writes in bench:index.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query('drop index if exists prefix_entries_set');
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('create index if not exists prefix_entries_set on prefix_entries (set_id)');
};
