import { AnalyzerPool } from '../../analyzers';
import type { LoadProgressDTO } from '../../shared/api/snapshots';
import { repositorySettings } from '../commands/createRepository';
import { LoadStoppedError, runLoad } from '../commands/loadSnapshot';
import { loadConfig } from '../config';
import { isDatabaseUnavailable } from '../db/unavailable';
import { deleteStoredArchive, IngestError, readArchive, storedArchivePath } from '../ingest';
import { Repository } from '../models/Repository';
import { Snapshot } from '../models/Snapshot';
import { clearPartialLoad, markSnapshotFailed, startLoadAttempt, writeLoadProgress } from '../queries/snapshots';
import { defineJob } from './definition';

/** What a `snapshot.load` job carries: the snapshot only (its archive waits in the upload folder). */
export interface SnapshotLoadData {
  snapshotId: number;
}

/** How often a load writes its progress at most (a phase change is written at once). */
const PROGRESS_INTERVAL_MS = 500;

/**
 * A load's progress, written to its snapshot row at most every PROGRESS_INTERVAL_MS and at each
 * change of phase. Each write is also the load's checkpoint: when the row is no longer this
 * attempt's running load (cancelled, deleted, taken over by a retry), `signal` aborts and the load
 * stops at its next step.
 */
class ProgressWriter {
  private readonly controller = new AbortController();
  private latest: LoadProgressDTO | undefined;
  private written: LoadProgressDTO | undefined;
  private lastWrite = 0;
  private inFlight: Promise<void> = Promise.resolve();
  private timer: NodeJS.Timeout | undefined;

  constructor(private readonly snapshotId: number, private readonly attempt: number) {}

  get signal(): AbortSignal {
    return this.controller.signal;
  }

  readonly report = (progress: LoadProgressDTO): void => {
    this.latest = progress;
    const phaseChanged = this.written?.phase !== progress.phase;
    const wait = PROGRESS_INTERVAL_MS - (Date.now() - this.lastWrite);
    if (phaseChanged || wait <= 0) this.write();
    else this.timer ??= setTimeout(() => this.write(), wait);
  };

  private write(): void {
    clearTimeout(this.timer);
    this.timer = undefined;
    this.lastWrite = Date.now();
    const progress = this.latest!;
    this.written = progress;
    this.inFlight = this.inFlight.then(async () => {
      if (this.controller.signal.aborted) return;
      try {
        const state = await writeLoadProgress(this.snapshotId, this.attempt, progress);
        if (state !== 'ours') this.controller.abort(new LoadStoppedError(state));
      } catch {
        // A failed progress write (database restarting) is not a reason to stop the load.
      }
    });
  }

  /** Waits for the writes in flight; no more are made after. */
  async stop(): Promise<void> {
    clearTimeout(this.timer);
    this.timer = undefined;
    await this.inFlight;
  }
}

let pool: AnalyzerPool | undefined;

/** This process's one analyzer pool, made on the first load and shared by every load after (DOUBLET_ANALYZER_THREADS threads). */
export function loadAnalyzerPool(): AnalyzerPool {
  pool ??= new AnalyzerPool(loadConfig().loads.analyzerThreads);
  return pool;
}

/** Why a load failed, in words for the people who uploaded it (never file content). */
function failureReason(error: unknown): string {
  if (error instanceof IngestError) return error.message;
  const message = error instanceof Error ? error.message : String(error);
  return `The load failed on the server: ${message.slice(0, 500)}`;
}

/**
 * `snapshot.load`: loads an uploaded archive into its queued snapshot, with progress on the row
 * (unpacking, analysing n of N files, indexing n of N sets, deriving classes), and ends it ready,
 * failed with its reason, or — when cancelled — with nothing of it written. The archive is
 * deleted once the load has ended either way.
 *
 * Safe to repeat: every attempt raises the row's attempt number first, so a worker killed mid-load
 * (its lease, `expireInSeconds`, runs out and pg-boss retries the job on any worker) is superseded,
 * and its partial work is gone with its transactions; the retry reads the kept archive again and
 * ends with the same result. A failure is final (no retry): reading or loading the same archive
 * again would fail the same way; only a lost database connection fails the attempt for a retry.
 */
export const snapshotLoadJob = defineJob<SnapshotLoadData>({
  queue: 'snapshot.load',
  // The lease (expireInSeconds) is set when the job is sent, from DOUBLET_LOAD_LEASE_SECONDS.
  sendOptions: { retryLimit: 5, retryDelay: 2, retryBackoff: true, retentionHours: 48, deadLetter: 'snapshot.load-abandoned' },
  get workers() {
    return loadConfig().loads.perWorker;
  },
  handler: async ({ snapshotId }) => {
    const attempt = await startLoadAttempt(snapshotId);
    const snapshot = attempt === null ? null : await Snapshot.findByPk(snapshotId);
    const repository = snapshot && (await Repository.findByPk(snapshot.repositoryId));
    if (attempt === null || !repository) {
      // Cancelled while queued, already ended, or deleted with its repository.
      await deleteStoredArchive(snapshotId);
      return;
    }
    if (attempt > 1) await clearPartialLoad(snapshotId);
    const progress = new ProgressWriter(snapshotId, attempt);
    try {
      progress.report({ phase: 'unpacking', done: 0, total: 0 });
      const contents = await readArchive(storedArchivePath(snapshotId), { ignore: repository.ignore });
      progress.report({ phase: 'unpacking', done: contents.files.length, total: contents.files.length });
      progress.signal.throwIfAborted();
      await runLoad(
        snapshotId,
        { repository: repositorySettings(repository), label: snapshot!.label, source: 'archive', files: contents.files, skipped: contents.skipped },
        { onProgress: progress.report, signal: progress.signal, attempt, pool: loadAnalyzerPool() },
      );
      await progress.stop();
    } catch (error) {
      await progress.stop();
      const stop = error instanceof LoadStoppedError ? error : progress.signal.aborted ? (progress.signal.reason as LoadStoppedError) : undefined;
      // A newer attempt owns the archive now; in every other case the load has ended.
      if (stop?.why === 'superseded') return;
      // PostgreSQL restarting is not the archive's fault: fail the attempt, and pg-boss retries it.
      if (!stop && isDatabaseUnavailable(error)) throw error;
      if (!stop) await markSnapshotFailed(snapshotId, failureReason(error), attempt);
    }
    await deleteStoredArchive(snapshotId);
  },
});

/**
 * `snapshot.load-abandoned`: pg-boss's dead letter of `snapshot.load`. A load whose every attempt
 * was cut off (each worker died, or each ran past the lease) would otherwise stay `running` for
 * ever: it is marked failed with the reason, and its archive deleted.
 */
export const snapshotLoadAbandonedJob = defineJob<SnapshotLoadData>({
  queue: 'snapshot.load-abandoned',
  sendOptions: { retryLimit: 3, retryDelay: 5, retentionHours: 48 },
  handler: async ({ snapshotId }) => {
    const lease = loadConfig().loads.leaseSeconds;
    await markSnapshotFailed(
      snapshotId,
      `The load was cut off on every attempt (its worker stopped, or it ran past the lease of ${lease} seconds, DOUBLET_LOAD_LEASE_SECONDS). Upload the release again; raise the lease for releases this large.`,
    );
    await deleteStoredArchive(snapshotId);
  },
});
