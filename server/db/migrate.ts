import fs from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import { projectRoot } from '../config';

/** Signature of one migration module in server/migrations/ (files named `NNNN-what.ts`). */
export interface Migration {
  up(context: { queryInterface: QueryInterface; sequelize: Sequelize }): Promise<void>;
  down(context: { queryInterface: QueryInterface; sequelize: Sequelize }): Promise<void>;
}

const migrationsDir = path.join(projectRoot, 'server', 'migrations');

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
        const m: Migration = await import(pathToFileURL(path.join(migrationsDir, file)).href);
        await m.up({ queryInterface: sequelize.getQueryInterface(), sequelize });
      },
      down: async () => {
        const m: Migration = await import(pathToFileURL(path.join(migrationsDir, file)).href);
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
