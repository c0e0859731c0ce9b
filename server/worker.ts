import { disconnect, openDatabase } from './db';
import { jobDefinitions, startJobs, stopJobs } from './jobs';
import { initModels } from './models';

/** How long jobs in hand may run after SIGTERM. */
const GRACE_MS = 10_000;

/**
 * `npm run worker`: a process that only works jobs, against the same database as the server (this
 * machine's local cluster, or DATABASE_URL on another machine). Start as many as the load needs;
 * pg-boss hands each job to one of them. Mail goes to SMTP_URL, or to the catcher of the `npm
 * start` on this machine (127.0.0.1:DOUBLET_SMTP_PORT). SIGTERM or Ctrl-C lets the jobs in hand
 * finish (up to GRACE_MS) and exits; what is still running then is retried by another worker.
 */
async function main() {
  const sequelize = await openDatabase();
  initModels(sequelize);
  await startJobs({ work: true });
  const queues = (await jobDefinitions()).map((d) => d.queue).join(', ');
  console.log(`Doublet worker ${process.pid} is working: ${queues}.`);

  let stopping = false;
  const stop = (signal: NodeJS.Signals) => {
    if (stopping) process.exit(1);
    stopping = true;
    console.log(`${signal}: finishing the jobs in hand…`);
    stopJobs({ timeoutMs: GRACE_MS })
      .then(() => disconnect())
      .then(
        () => process.exit(0),
        (error: unknown) => {
          console.error(`worker: ${error instanceof Error ? error.message : String(error)}`);
          process.exit(1);
        },
      );
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
