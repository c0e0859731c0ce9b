import { disconnect } from './connection';
import { openDatabase } from './index';
import { ensureDatabaseServer, stopDatabaseServer } from './postgres';
import { loadConfig } from '../config';

/** `npm run db:start | db:stop | db:migrate`. */
async function main(command: string | undefined) {
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
    default:
      throw new Error(`unknown command "${command ?? ''}": use start, stop or migrate`);
  }
}

main(process.argv[2]).catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
