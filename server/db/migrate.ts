import fs from 'node:fs';
import path from 'node:path';
import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import { projectRoot } from '../config';

/** Signature of one migration module in server/migrations/ (files named `NNNN-what.ts`). */
export interface Migration {
  up(context: { queryInterface: QueryInterface; sequelize: Sequelize }): Promise<void>;
  down(context: { queryInterface: QueryInterface; sequelize: Sequelize }): Promise<void>;
}

const migrationsDir = path.join(projectRoot, 'server', 'migrations');

/**
 * One migration module. The import names its folder in a template so that the compiled server
 * (scripts/build.mjs bundles with esbuild, which follows such a pattern) carries every migration
 * as compiled JavaScript; from the sources it is an ordinary relative import.
 */
async function loadMigration(file: string): Promise<Migration> {
  return (await import(`../migrations/${file.replace(/\.ts$/, '')}.ts`)) as Migration;
}

/** An umzug instance over every file in server/migrations, in file-name order. */
export function migrator(sequelize: Sequelize) {
  const files = fs
    .readdirSync(migrationsDir)
    .filter((f) => /^\d{4}-[\w-]+\.ts$/.test(f))
    .sort();
  return new Umzug({
    migrations: files.map((file) => ({
      name: file.replace(/\.ts$/, ''),
      up: async () => {
        const m = await loadMigration(file);
        await m.up({ queryInterface: sequelize.getQueryInterface(), sequelize });
      },
      down: async () => {
        const m = await loadMigration(file);
        await m.down({ queryInterface: sequelize.getQueryInterface(), sequelize });
      },
    })),
    context: {},
    storage: new SequelizeStorage({ sequelize }),
    logger: undefined,
  });
}

/** Applies every pending migration. */
export async function migrateUp(sequelize: Sequelize): Promise<void> {
  await migrator(sequelize).up();
}
