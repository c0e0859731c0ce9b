import { build } from 'vite';
import { projectRoot } from './config';
import { openDatabase } from './db';
import { serve } from './index';

/** `npm start`: database up and migrated, demo data on an empty database, client built, then serve. */
async function main() {
  await openDatabase();
  console.log('Building the client…');
  await build({ configFile: `${projectRoot}/vite.config.ts`, logLevel: 'warn' });
  await serve();
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
