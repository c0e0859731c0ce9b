import { loadConfig } from '../config';
import { startMailCatcher, type MailCatcher } from '../mail/catcher';
import { startJobs, stopJobs } from './queue';

let catcher: MailCatcher | undefined;

/**
 * What `npm start` (and `npm run dev`) run beside the HTTP server: the local mail catcher on
 * 127.0.0.1:DOUBLET_SMTP_PORT unless SMTP_URL names a real server, and the job queue with an
 * embedded worker unless DOUBLET_EMBEDDED_WORKER=false (then `npm run worker` processes do the work).
 */
export async function startEmbedded(): Promise<void> {
  const config = loadConfig();
  if (config.smtpUrl) {
    // The URL may hold a password: name the host only.
    console.log(`Mail goes to the SMTP server at ${new URL(config.smtpUrl).hostname} (SMTP_URL).`);
  } else {
    catcher = await startMailCatcher({ port: config.smtpPort });
    console.log(`Mail goes to the local catcher on 127.0.0.1:${catcher.port}; admins read it on the Outbox page.`);
  }
  await startJobs({ work: config.embeddedWorker });
  if (!config.embeddedWorker) console.log('No embedded worker (DOUBLET_EMBEDDED_WORKER=false): jobs wait for `npm run worker`.');
}

/**
 * Stops what startEmbedded() started: the workers first (letting a delivery in progress finish),
 * then the catcher. For the drain on SIGTERM.
 */
export async function stopEmbedded(): Promise<void> {
  await stopJobs();
  await catcher?.stop();
  catcher = undefined;
}
