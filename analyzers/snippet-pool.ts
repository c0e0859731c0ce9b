import os from 'node:os';
import { Piscina } from 'piscina';
import type { AnalysisLimit } from './limits';
import { DEFAULT_TIMEOUT_MS, runTimed, type TimedRun } from './pool';
import type { AnalyzeOptions, Fragment } from './types';
import type { SnippetTask } from './worker-task';
import { workerUrl } from './worker-location';

/** Options of analyzeSnippetInPool. */
export interface SnippetPoolOptions extends AnalyzeOptions {
  /** Abort the analysis (a thread running it is terminated), e.g. when the client has gone. */
  signal?: AbortSignal;
  /** Time limit in ms, counted from when a thread takes the snippet. Default DEFAULT_TIMEOUT_MS. */
  timeoutMs?: number;
}

/**
 * What became of a snippet: its fragments, or why it was refused. `invalid`: the language is
 * unknown or the parser could not read it at all (the caller's 400); `limit`: it went over an
 * analysis bound, named in `limit` and in the message (a 422); `busy`: too many snippets wait
 * already (a 503). Messages never quote the snippet.
 */
export type SnippetOutcome =
  | { ok: true; fragments: Fragment[] }
  | { ok: false; refusal: 'invalid'; message: string }
  | { ok: false; refusal: 'limit'; limit: AnalysisLimit; message: string }
  | { ok: false; refusal: 'busy'; message: string };

/** Snippets waiting for a thread, at most; more are refused as `busy`. */
export const MAX_WAITING_SNIPPETS = 64;

/**
 * Heap of a snippet thread. A snippet is at most a few hundred kB and the analysis bounds keep its
 * work linear, so this is far more than it needs; a thread that still runs out is ended alone.
 */
const SNIPPET_RESOURCE_LIMITS = { maxOldGenerationSizeMb: 512, maxYoungGenerationSizeMb: 64 } as const;

let pool: Piscina | undefined;
let running = 0;
const waiting: Array<() => void> = [];

function threads(): number {
  return Math.max(1, os.availableParallelism());
}

function snippetPool(): Piscina {
  pool ??= new Piscina({
    filename: workerUrl().href,
    minThreads: 1,
    maxThreads: threads(),
    // Each snippet is its own abortable task; abortable tasks never share a thread.
    concurrentTasksPerWorker: 1,
    // Idle threads are unref'd by the pool, so a command-line process still exits when done.
    idleTimeout: 60_000,
    resourceLimits: SNIPPET_RESOURCE_LIMITS,
  });
  return pool;
}

/** Waits for a free thread (the time limit starts only then); false when aborted first. */
async function acquire(signal: AbortSignal | undefined): Promise<boolean> {
  if (running < threads()) {
    running++;
    return true;
  }
  return new Promise<boolean>((resolve) => {
    const onAbort = () => {
      const at = waiting.indexOf(grant);
      if (at >= 0) waiting.splice(at, 1);
      resolve(false);
    };
    const grant = () => {
      signal?.removeEventListener('abort', onAbort);
      running++;
      resolve(true);
    };
    waiting.push(grant);
    signal?.addEventListener('abort', onAbort, { once: true });
  });
}

function release(): void {
  running--;
  waiting.shift()?.();
}

/**
 * analyzeSnippet in a thread of a shared worker pool, never on the caller's thread: under a
 * time limit, with the analysis bounds (ANALYSIS_LIMITS), and stopped (its thread terminated)
 * when `signal` aborts. Rejects only when aborted (with the signal's reason) or on a bug; every
 * refusal of the snippet itself is an outcome.
 *
 * @example
 * const outcome = await analyzeSnippetInPool('python', text, { shingleSize: 3, signal });
 * if (!outcome.ok) console.log(outcome.refusal, outcome.message); // 'limit', '… (nesting limit)'
 */
export async function analyzeSnippetInPool(language: string, text: string, options: SnippetPoolOptions = {}): Promise<SnippetOutcome> {
  const { signal, timeoutMs = DEFAULT_TIMEOUT_MS, ...analyzeOptions } = options;
  if (!Number.isFinite(timeoutMs) || timeoutMs <= 0) throw new RangeError(`options.timeoutMs must be a positive number, got ${timeoutMs}`);
  signal?.throwIfAborted();
  if (running >= threads() && waiting.length >= MAX_WAITING_SNIPPETS) {
    return { ok: false, refusal: 'busy', message: `${MAX_WAITING_SNIPPETS} snippets are waiting to be analysed already; try again shortly` };
  }
  // acquire gives up only when the signal aborts.
  if (!(await acquire(signal))) throw signal?.reason;
  let run: TimedRun<SnippetOutcome>;
  try {
    const task: SnippetTask = { snippet: { language, text, options: analyzeOptions } };
    run = await runTimed<SnippetOutcome>(snippetPool(), task, timeoutMs, signal);
  } finally {
    release();
  }
  signal?.throwIfAborted();
  if (run.ok) return run.value;
  if (run.timedOut) return { ok: false, refusal: 'limit', limit: 'time', message: `the analysis took longer than ${timeoutMs} ms (time limit)` };
  if ((run.error as { code?: string } | null)?.code === 'ERR_WORKER_OUT_OF_MEMORY') {
    return { ok: false, refusal: 'limit', limit: 'memory', message: 'the analysis ran out of memory (memory limit of a snippet thread)' };
  }
  throw run.error;
}

/** Ends the snippet threads (tests and shutdown); the next snippet starts a new pool. */
export async function closeSnippetPool(): Promise<void> {
  const closing = pool;
  pool = undefined;
  await closing?.destroy();
}
