import { createServer } from 'vite';
import { projectRoot } from './config';
import { openDatabase } from './db';
import { drainOnSignals, onShutdown, serve } from './index';
import { startEmbedded, stopEmbedded } from './jobs';
import { initModels } from './models';

/** `npm run dev`: the API on PORT and Vite's dev server (with /api proxied to it) on 5173. */
async function main() {
  initModels(await openDatabase());
  await startEmbedded();
  onShutdown('jobs and the mail catcher', stopEmbedded);
  const server = await serve();
  const vite = await createServer({ configFile: `${projectRoot}/vite.config.ts` });
  await vite.listen(5173);
  onShutdown('vite dev server', () => vite.close());
  drainOnSignals(server);
  vite.printUrls();
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
