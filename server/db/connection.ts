import { Sequelize } from 'sequelize';

let current: Sequelize | undefined;
let currentUrl: string | undefined;

/**
 * The process-wide Sequelize instance. `connect(url)` is called once at start-up (server, worker,
 * command line, test set-up); everything else calls `db()`.
 */
export function connect(url: string): Sequelize {
  if (current) return current;
  current = new Sequelize(url, { dialect: 'postgres', logging: false, pool: { max: 10 } });
  currentUrl = url;
  return current;
}

/** The URL `connect` was given, while connected (the job queue opens beside it). */
export function connectedUrl(): string | undefined {
  return currentUrl;
}

/** The connected Sequelize instance; throws when `connect` has not run. */
export function db(): Sequelize {
  if (!current) throw new Error('database not connected: call connect(url) first');
  return current;
}

/** Closes the pool (end of a command or a test file). */
export async function disconnect(): Promise<void> {
  await current?.close();
  current = undefined;
  currentUrl = undefined;
}
