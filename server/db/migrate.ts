import fs from 'node:fs';
import path from 'node:path';
import type { QueryInterface, Sequelize } from 'sequelize';
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

/** The migration files' names (without `.ts`), in the order they run. */
function migrationNames(): string[] {
  return fs
    .readdirSync(migrationsDir)
    .filter((f) => /^\d{4}-[\w-]+\.ts$/.test(f))
    .sort()
    .map((f) => f.replace(/\.ts$/, ''));
}

/** An umzug instance over every file in server/migrations, in file-name order. */
export async function migrator(sequelize: Sequelize) {
  const { SequelizeStorage, Umzug } = await import('umzug');
  return new Umzug({
    migrations: migrationNames().map((name) => ({
      name,
      up: async () => {
        const m = await loadMigration(`${name}.ts`);
        await m.up({ queryInterface: sequelize.getQueryInterface(), sequelize });
      },
      down: async () => {
        const m = await loadMigration(`${name}.ts`);
        await m.down({ queryInterface: sequelize.getQueryInterface(), sequelize });
      },
    })),
    context: {},
    storage: new SequelizeStorage({ sequelize }),
    logger: undefined,
  });
}

/**
 * Applies every pending migration. When umzug's table already lists every migration file there is
 * nothing to do, and umzug (with its command-line dependencies, a tenth of a second to load) is
 * never imported: the common case of every command-line start.
 */
export async function migrateUp(sequelize: Sequelize): Promise<void> {
  if (await everyMigrationApplied(sequelize)) return;
  await (await migrator(sequelize)).up();
}

async function everyMigrationApplied(sequelize: Sequelize): Promise<boolean> {
  const [[table]] = (await sequelize.query(`select to_regclass('"SequelizeMeta"') is not null as present`)) as [{ present: boolean }[], unknown];
  if (!table.present) return false;
  const [rows] = (await sequelize.query('select name from "SequelizeMeta"')) as [{ name: string }[], unknown];
  const applied = new Set(rows.map((r) => r.name));
  return migrationNames().every((name) => applied.has(name));
}
