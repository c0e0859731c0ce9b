import os from 'node:os';
import { Piscina } from 'piscina';
import { noAnalyzerReason } from './analyze';
import { analyzerForPath } from './languages';
import { inspectFile, type SkipOptions } from './skip';
import type { AnalyzeOptions, FileAnalysis, SkippedFile, SourceFile } from './types';
import type { AnalyzeTask } from './worker-task';
import { resolveOptions } from './fragments';
import { workerUrl } from './worker-location';

/** Options of analyzeFiles: analysis, skipping, and the pool. */
export interface AnalyzeFilesOptions extends AnalyzeOptions, SkipOptions {
  /** Pool threads. Default: the number of cores, at most the number of files. */
  workers?: number;
  /** Per-file time limit in ms; the thread running a file over it is terminated. Default 20,000. */
  timeoutMs?: number;
  /** A long-lived pool to run on (shared by several callers); without it a pool is made for this call and closed after. */
  pool?: AnalyzerPool;
  /** Called each time a file is done, with how many are done of how many will be analysed. */
  onFileDone?: (done: number, total: number) => void;
  /** Stops handing out files (the ones running finish, or are cut off) and rejects with the signal's reason. */
  signal?: AbortSignal;
}

/**
 * A pool of analyzer threads that outlives one call, so a process that loads many snapshots (a
 * job worker) starts its threads once. Callers share its threads: a file waits for a free slot
 * before its time limit starts, whichever call it belongs to.
 */
export class AnalyzerPool {
  readonly piscina: Piscina;
  private readonly warming = new Map<string, Promise<void>>();
  private free: number;
  private readonly waiting: Array<() => void> = [];

  constructor(readonly threads: number) {
    if (!Number.isInteger(threads) || threads < 1) throw new RangeError(`an analyzer pool needs a positive whole number of threads, got ${threads}`);
    this.free = threads;
    this.piscina = new Piscina({
      filename: workerUrl().href,
      minThreads: threads,
      maxThreads: threads,
      concurrentTasksPerWorker: 1,
      // Idle threads are unref'd: a process whose other work is done still exits.
      idleTimeout: 60_000,
      resourceLimits: POOL_RESOURCE_LIMITS,
    });
  }

  /**
   * Loads the analyzers of these languages in the threads, once per language (before any file's
   * clock starts); resolves when every one of them is loaded, by this call or an earlier one.
   */
  async warm(languages: Iterable<string>): Promise<void> {
    const wanted = [...new Set(languages)];
    const fresh = wanted.filter((l) => !this.warming.has(l));
    if (fresh.length > 0) {
      const loading = Promise.all(Array.from({ length: this.threads }, () => this.piscina.run({ warm: fresh }))).then(() => undefined);
      for (const l of fresh) this.warming.set(l, loading);
    }
    await Promise.all(wanted.map((l) => this.warming.get(l)));
  }

  /** Runs `work` once a thread is free (the slot is given back after). */
  async withSlot<T>(work: () => Promise<T>): Promise<T> {
    if (this.free > 0) this.free--;
    else await new Promise<void>((resolve) => this.waiting.push(resolve));
    try {
      return await work();
    } finally {
      const next = this.waiting.shift();
      if (next) next();
      else this.free++;
    }
  }

  async close(): Promise<void> {
    await this.piscina.destroy();
  }
}

/** Default per-file time limit: far above what a file under the size cap needs (bench:analyze). */
export const DEFAULT_TIMEOUT_MS = 20_000;

/**
 * V8 heap limits of a pool thread. The young generation is larger than V8's default (about 48 MB,
 * 16 MB semi-spaces): a parse allocates a whole syntax tree and token list that live until the
 * file is done, and with small semi-spaces most of it is copied by several scavenges before it
 * dies; the README's Measured section has what the larger one saved. The space is only taken
 * when a file needs it.
 *
 * @example new Worker(url, { resourceLimits: POOL_RESOURCE_LIMITS })
 */
export const POOL_RESOURCE_LIMITS = { maxOldGenerationSizeMb: 2048, maxYoungGenerationSizeMb: 192 } as const;

/**
 * Analyses many files in a pool of worker threads (one per core by default). Results come back
 * in input order; skipped files (ignore rules, size, binary, encoding, unknown language) are left
 * out of `files` and listed in `skipped` with their reason. A file that fails to parse, runs out
 * of memory or passes `timeoutMs` gets an `error` record (its thread is terminated and replaced)
 * and the others go on. The pool is closed before the promise settles, so a CLI exits when done.
 *
 * @example
 * const { files, skipped } = await analyzeFiles(sourceFiles, { ignore: ['generated/'], workers: 4 });
 */
export async function analyzeFiles(
  files: readonly SourceFile[],
  options: AnalyzeFilesOptions = {},
): Promise<{ files: FileAnalysis[]; skipped: SkippedFile[] }> {
  const { workers, timeoutMs = DEFAULT_TIMEOUT_MS, ignore, maxFileBytes, pool: shared, onFileDone, signal, ...analyzeOptions } = options;
  resolveOptions(analyzeOptions); // reject bad options here, once, not in every thread
  if (!Number.isFinite(timeoutMs) || timeoutMs <= 0) throw new RangeError(`options.timeoutMs must be a positive number, got ${timeoutMs}`);
  if (workers !== undefined && (!Number.isInteger(workers) || workers < 1)) {
    throw new RangeError(`options.workers must be a positive integer, got ${workers}`);
  }

  const skipped: SkippedFile[] = [];
  const tasks: AnalyzeTask[] = [];
  const languages = new Set<string>();
  for (const file of files) {
    const { reason, text } = inspectFile(file.path, file.content, { ignore, maxFileBytes });
    if (reason !== undefined || text === undefined) {
      skipped.push({ path: file.path, reason: reason ?? 'not readable' });
    } else {
      const language = analyzerForPath(file.path);
      if (!language) {
        skipped.push({ path: file.path, reason: noAnalyzerReason(file.path) });
      } else {
        languages.add(language.id);
        tasks.push({ path: file.path, text, options: analyzeOptions });
      }
    }
  }
  if (tasks.length === 0) return { files: [], skipped };
  signal?.throwIfAborted();

  const threads = Math.max(1, Math.min(shared?.threads ?? workers ?? os.availableParallelism(), tasks.length));
  const pool = shared ?? new AnalyzerPool(threads);
  try {
    // Load the analyzers in every thread first, so that a file's time limit measures its own
    // parse and not the thread's start-up.
    await pool.warm(languages);
    // Never more files in flight than threads: a file's clock starts when a thread takes it,
    // not while it waits in the queue behind others (or behind another caller's files).
    const results: FileAnalysis[] = new Array(tasks.length);
    let next = 0;
    let done = 0;
    const lane = async () => {
      while (next < tasks.length && !signal?.aborted) {
        const i = next++;
        results[i] = await pool.withSlot(() => runOne(pool.piscina, tasks[i], timeoutMs, signal));
        onFileDone?.(++done, tasks.length);
      }
    };
    await Promise.all(Array.from({ length: threads }, lane));
    signal?.throwIfAborted();
    return { files: results, skipped };
  } finally {
    if (!shared) await pool.close();
  }
}

async function runOne(pool: Piscina, task: AnalyzeTask, timeoutMs: number, signal?: AbortSignal): Promise<FileAnalysis> {
  const run = await runTimed<FileAnalysis>(pool, task, timeoutMs, signal);
  if (run.ok) return run.value;
  const language = analyzerForPath(task.path)?.id ?? 'unknown';
  const message = run.timedOut
    ? `cut off after ${timeoutMs} ms (time limit per file)`
    : `analysis failed: ${run.error instanceof Error ? run.error.message.slice(0, 300) : String(run.error)}`;
  return { path: task.path, language, fragments: [], error: message };
}

/** How a task run by runTimed ended: its value, or the error (and whether the time limit caused it). */
export type TimedRun<T> = { ok: true; value: T } | { ok: false; timedOut: boolean; error: unknown };

/**
 * Runs one task on a pool thread under a time limit, counted from now: past it, or when `signal`
 * aborts, the task is aborted and its thread terminated (tasks are one a thread, so no other work
 * is lost). Never rejects.
 *
 * @example const run = await runTimed<FileAnalysis>(pool, task, 20_000); // { ok: false, timedOut: true, … }
 */
export async function runTimed<T>(pool: Piscina, task: object, timeoutMs: number, signal?: AbortSignal): Promise<TimedRun<T>> {
  const controller = new AbortController();
  const stop = () => controller.abort();
  signal?.addEventListener('abort', stop, { once: true });
  if (signal?.aborted) controller.abort();
  let timedOut = false;
  const timer = setTimeout(() => {
    timedOut = true;
    controller.abort();
  }, timeoutMs);
  try {
    return { ok: true, value: (await pool.run(task, { signal: controller.signal })) as T };
  } catch (error) {
    return { ok: false, timedOut, error };
  } finally {
    clearTimeout(timer);
    signal?.removeEventListener('abort', stop);
  }
}
