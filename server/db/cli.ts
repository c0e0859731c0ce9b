import path from 'node:path';
import { parseArgs } from 'node:util';
import { backupDatabase, restoreDatabase } from './backup';
import { disconnect } from './connection';
import { openDatabase } from './index';
import { ensureDatabaseServer, stopDatabaseServer } from './postgres';
import { loadConfig } from '../config';

const USAGE = 'use start, stop, migrate, backup [--out FILE] or restore FILE [--force]';

/** A file name for a backup made now: .data/backups/<database>-<UTC time>.dump. */
function defaultBackupFile(url: string): string {
  const database = decodeURIComponent(new URL(url).pathname.slice(1)) || 'doublet';
  const stamp = new Date().toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z');
  return path.join(loadConfig().dataDir, 'backups', `${database}-${stamp}.dump`);
}

/** `npm run db:start | db:stop | db:migrate | db:backup | db:restore`. */
async function main(command: string | undefined, args: string[]) {
  const config = loadConfig();
  switch (command) {
    case 'start': {
      const url = await ensureDatabaseServer();
      console.log(`PostgreSQL is up: ${url}`);
      break;
    }
    case 'stop':
      stopDatabaseServer();
      console.log(config.externalDatabaseUrl ? 'DATABASE_URL is set: nothing to stop.' : 'PostgreSQL stopped.');
      break;
    case 'migrate':
      await openDatabase();
      await disconnect();
      console.log('Migrations applied.');
      break;
    case 'backup': {
      const { values, positionals } = parseArgs({ args, options: { out: { type: 'string' } }, allowPositionals: true });
      if (positionals.length > 0) throw new Error(`unexpected argument "${positionals[0]}": ${USAGE}`);
      const url = await ensureDatabaseServer();
      const { file, bytes } = await backupDatabase(url, values.out ?? defaultBackupFile(url));
      console.log(`Backup written: ${file} (${(bytes / 1024).toFixed(0)} KiB)`);
      break;
    }
    case 'restore': {
      const { values, positionals } = parseArgs({ args, options: { force: { type: 'boolean' } }, allowPositionals: true });
      if (positionals.length !== 1) throw new Error(`name one backup file: ${USAGE}`);
      // Creates the configured database when it is missing (on the local cluster), so it starts empty.
      const url = await ensureDatabaseServer();
      await restoreDatabase(url, positionals[0]!, { force: values.force });
      console.log(`Restored ${path.resolve(positionals[0]!)} into ${new URL(url).pathname.slice(1)}. Start the app (npm start) to use it.`);
      break;
    }
    default:
      throw new Error(`unknown command "${command ?? ''}": ${USAGE}`);
  }
}

main(process.argv[2], process.argv.slice(3)).catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
