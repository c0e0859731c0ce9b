import { build } from 'vite';
import { firstAdminLines, firstRunStep } from './commands/firstRun';
import { demoOrganisationExists, demoSignInLines, seedDemo } from './commands/seedDemo';
import { loadConfig, projectRoot } from './config';
import { openDatabase } from './db';
import { drainOnSignals, onShutdown, serve } from './index';
import { startEmbedded, stopEmbedded } from './jobs';
import { initModels, User } from './models';

/**
 * `npm start`: database up and migrated, demo data on a database with no users (DOUBLET_DEMO), the
 * first-admin command printed while no one can sign in, client built, then serve
 * until SIGTERM or Ctrl-C, which drain in-flight requests first. The local cluster keeps running
 * (`npm run db:stop` stops it).
 */
async function main() {
  const sequelize = await openDatabase();
  initModels(sequelize);
  await startEmbedded();
  // Jobs in hand finish (or are left to be retried) after the HTTP requests, within the grace period.
  onShutdown('jobs and the mail catcher', stopEmbedded);
  const step = firstRunStep(await User.count(), loadConfig().demo);
  const seeded = step === 'seed' || step === 'force-seed' ? await seedDemo({ force: step === 'force-seed', log: (line) => console.log(line) }) : null;
  if (seeded || (step !== 'first-admin' && (await demoOrganisationExists()))) {
    console.log('Demo sign-ins (role, e-mail, password):');
    for (const line of demoSignInLines()) console.log(line);
  }
  // Counted again: a seed attempt on a database filled by `npm run import` adds no one.
  if ((await User.count()) === 0) for (const line of firstAdminLines()) console.log(line);
  console.log('Building the client…');
  const nodeEnv = process.env.NODE_ENV;
  await build({ configFile: `${projectRoot}/vite.config.ts`, logLevel: 'warn' });
  // vite's build() sets NODE_ENV=production in this process; whether the server runs in production
  // (and so refuses a missing SESSION_SECRET) is the operator's setting, not the client build's.
  if (nodeEnv === undefined) delete process.env.NODE_ENV;
  else process.env.NODE_ENV = nodeEnv;
  drainOnSignals(await serve());
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
