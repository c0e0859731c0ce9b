import type { Sequelize } from 'sequelize';
import { connect } from './connection';
import { migrateUp } from './migrate';
import { ensureDatabaseServer } from './postgres';

export { connect, db, disconnect } from './connection';

/**
 * What every entry point that needs the database calls first: start the local PostgreSQL if it is
 * not running (or use DATABASE_URL), connect, and apply pending migrations.
 */
export async function openDatabase(): Promise<Sequelize> {
  const url = await ensureDatabaseServer();
  const sequelize = connect(url);
  await migrateUp(sequelize);
  return sequelize;
}
