import type { Migration } from '../db/migrate';

/**
 * The column default of repositories.threshold follows DEFAULT_REPOSITORY_SETTINGS (0.7 since the
 * detection-quality benchmark). Only the default changes: every existing repository keeps the
 * threshold stored in its settings. The value is written here, not imported, so that this
 * migration means the same thing whenever it runs.
 */
export const up: Migration['up'] = async ({ sequelize }) => {
  await sequelize.query('alter table repositories alter column threshold set default 0.7');
};

export const down: Migration['down'] = async ({ sequelize }) => {
  await sequelize.query('alter table repositories alter column threshold set default 0.8');
};
