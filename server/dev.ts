import { createServer } from 'vite';
import { projectRoot } from './config';
import { openDatabase } from './db';
import { serve } from './index';
import { startEmbedded } from './jobs';
import { initModels } from './models';

/** `npm run dev`: the API on PORT and Vite's dev server (with /api proxied to it) on 5173. */
async function main() {
  initModels(await openDatabase());
  await startEmbedded();
  await serve();
  const vite = await createServer({ configFile: `${projectRoot}/vite.config.ts` });
  await vite.listen(5173);
  vite.printUrls();
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
