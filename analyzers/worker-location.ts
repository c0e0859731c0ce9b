/**
 * Where the analyzer pool threads start. From the TypeScript sources that is worker.mjs, which
 * loads worker-task.ts (through tsx when the thread has no loader). The compiled command line and
 * server (dist/server, scripts/build.mjs) name their own bundled worker before anything else runs,
 * so their threads load compiled JavaScript. Kept apart from pool.ts so that naming the worker
 * does not load the pool (a command that never analyses starts without piscina).
 */

let compiled: URL | undefined;

/**
 * Makes every pool started from now on load `url` (a module whose default export runs a task, as
 * worker.mjs's does). Called by the compiled entries only.
 *
 * @example useCompiledWorker(new URL('./analyzer-worker.mjs', import.meta.url))
 */
export function useCompiledWorker(url: URL): void {
  compiled = url;
}

/** The file URL a new pool's threads load. */
export function workerUrl(): URL {
  return compiled ?? new URL('./worker.mjs', import.meta.url);
}
