import type { Server, ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { pathToFileURL } from 'node:url';
import { closeSnippetPool } from '../analyzers/snippet-pool';
import { createApp } from './app';
import { loadConfig } from './config';
import { disconnect, openDatabase } from './db';

/**
 * The HTTP entry: `serve()` listens (npm start and npm run dev call it), `drainOnSignals()` gives
 * the process a clean end on SIGTERM/SIGINT, and running this file directly
 * (`node --import tsx server/index.ts`) does both against an already built client, as a process
 * manager or container would run it.
 */

/** Listens with the API and the built client on PORT (0: any free port); resolves once the port is bound. */
export function serve(): Promise<Server> {
  const config = loadConfig();
  const app = createApp();
  return new Promise((resolve, reject) => {
    const server = app.listen(config.port, config.host, () => {
      track(server);
      // Snippets of find copies are analysed in a pool of threads that outlives each request.
      onShutdown('snippet analysis pool', closeSnippetPool);
      const { port } = server.address() as AddressInfo;
      console.log(`Doublet is serving on http://${config.host}:${port}/`);
      resolve(server);
    });
    server.on('error', reject);
  });
}

type ShutdownTask = () => Promise<unknown> | unknown;
const shutdownTasks: { name: string; task: ShutdownTask }[] = [];

/**
 * Registers background work to finish (or abandon cleanly) when the process drains: it runs after
 * the HTTP server has stopped and its in-flight requests are done, before the database pool
 * closes, and gets what is left of the grace period.
 *
 * @example
 * onShutdown('vite dev server', () => vite.close());
 */
export function onShutdown(name: string, task: ShutdownTask): void {
  shutdownTasks.push({ name, task });
}

/** What drain() reports. */
export interface DrainReport {
  /** requests still running when the grace period ended (their connections were cut) */
  abandonedRequests: number;
  /** shutdown tasks that failed or were still running when the grace period ended */
  abandonedTasks: string[];
}

const inFlight = new WeakMap<Server, Set<ServerResponse>>();

/** Tracks the server's in-flight responses, so a drain knows what it waits for. */
function track(server: Server): Set<ServerResponse> {
  let open = inFlight.get(server);
  if (open) return open;
  const responses = new Set<ServerResponse>();
  server.on('request', (_req, res: ServerResponse) => {
    responses.add(res);
    res.on('close', () => responses.delete(res));
  });
  inFlight.set(server, responses);
  open = responses;
  return open;
}

/** Resolves with true when the promise settles within `ms`, false when the time runs out first. */
function within(promise: Promise<unknown>, ms: number): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<boolean>((resolve) => {
    timer = setTimeout(() => resolve(false), Math.max(0, ms));
  });
  return Promise.race([promise.then(() => true, () => true), timeout]).finally(() => clearTimeout(timer));
}

/**
 * Drains the server within `graceMs`: stop accepting connections, let in-flight requests finish
 * (each answer closes its keep-alive connection), cut whatever still runs when the time is up, run
 * the shutdown tasks with the time left, then close the database pool.
 */
export async function drain(server: Server, graceMs: number): Promise<DrainReport> {
  const deadline = Date.now() + graceMs;
  const responses = track(server);
  // From now on no answer keeps its connection open: a keep-alive client must reconnect elsewhere.
  for (const res of responses) if (!res.headersSent) res.setHeader('Connection', 'close');
  server.prependListener('request', (_req, res: ServerResponse) => res.setHeader('Connection', 'close'));
  const closed = new Promise<void>((resolve) => server.close(() => resolve()));
  // A keep-alive connection whose answer went out before the drain began is idle once it is sent:
  // close such connections as they become idle instead of waiting for their keep-alive timeout.
  const sweeper = setInterval(() => server.closeIdleConnections(), 100);
  void closed.finally(() => clearInterval(sweeper));

  let abandonedRequests = 0;
  if (!(await within(closed, deadline - Date.now()))) {
    abandonedRequests = responses.size;
    server.closeAllConnections();
    await closed;
  }

  const abandonedTasks: string[] = [];
  for (const { name, task } of shutdownTasks) {
    let failed = false;
    const run = Promise.resolve()
      .then(task)
      .catch((error: unknown) => {
        failed = true;
        console.error(`shutdown: ${name} failed: ${error instanceof Error ? error.message : String(error)}`);
      });
    if (!(await within(run, deadline - Date.now())) || failed) abandonedTasks.push(name);
  }
  await disconnect();
  return { abandonedRequests, abandonedTasks };
}

/**
 * On SIGTERM or SIGINT: drain the server (see drain()) within the grace period (SHUTDOWN_GRACE_MS),
 * then exit 0. A second signal while draining exits at once with status 1.
 */
export function drainOnSignals(server: Server, graceMs = loadConfig().shutdownGraceMs): void {
  track(server);
  let draining = false;
  const onSignal = (signal: NodeJS.Signals) => {
    if (draining) {
      console.error(`${signal} again: stopping without waiting.`);
      process.exit(1);
    }
    draining = true;
    const open = inFlight.get(server)?.size ?? 0;
    console.log(`${signal}: draining ${open} request(s) in flight, for at most ${graceMs} ms…`);
    drain(server, graceMs).then(
      (report) => {
        if (report.abandonedRequests > 0) console.log(`Cut off ${report.abandonedRequests} request(s) at the end of the grace period.`);
        if (report.abandonedTasks.length > 0) console.log(`Abandoned: ${report.abandonedTasks.join(', ')}.`);
        console.log('Doublet stopped.');
        process.exit(0);
      },
      (error: unknown) => {
        console.error(`shutdown failed: ${error instanceof Error ? error.message : String(error)}`);
        process.exit(1);
      },
    );
  };
  process.on('SIGTERM', onSignal);
  process.on('SIGINT', onSignal);
}

async function main() {
  await openDatabase();
  drainOnSignals(await serve());
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  main().catch((error: unknown) => {
    console.error(error instanceof Error ? error.message : error);
    process.exit(1);
  });
}
