import { createHash } from 'node:crypto';
import { analyzeFiles, languageForPath, skipReason, type AnalyzerPool } from '../../analyzers';
import type { FileAnalysis, SkippedFile, SourceFile } from '../../analyzers/types';
import type { LoadProgressDTO } from '../../shared/api/snapshots';
import { analyzeOptions, optionsKey, type RepositorySettings } from '../clone-index/options';
import { addSets, setHash } from '../clone-index/sets';
import { db } from '../db/connection';
import { ConflictError, fromDatabaseError } from '../errors';
import type { SnapshotSettings } from '../models/Snapshot';
import { analysisOutcomes, findAnalyses, lockContents, storeAnalyses, storeContents, storeSnapshotFiles, type SnapshotFileRow } from '../queries/files';
import { findSnapshotByLabel, insertRunningSnapshot, lockLoadingSnapshot, lockOrganisationLoads, markSnapshotFailed, markSnapshotReady } from '../queries/snapshots';
import { queueLoadNotices } from '../mail/load-notices';
import { organisationOfRepository } from '../queries/cross-classes';
import { rebuildCrossClasses } from './crossClasses';
import { deriveClones } from './deriveClones';
import { settleTasks } from './settleTasks';

/** What to load: a repository's files at one release. */
export interface LoadSnapshotInput {
  repository: RepositorySettings & { id: number };
  label: string;
  source?: 'folder' | 'archive' | 'git' | 'push';
  commitSha?: string | null;
  files: SourceFile[];
  /** files the reader already skipped (links, pruned folders…), recorded with their reasons */
  skipped?: SkippedFile[];
  /** new sets per probe query (results do not depend on it) */
  batchSize?: number;
  workers?: number;
}

/** Counts and timings of a load. */
export interface LoadSnapshotResult {
  snapshotId: number;
  fileCount: number;
  skippedCount: number;
  failedCount: number;
  analyzedFileCount: number;
  fragmentCount: number;
  newSetCount: number;
  pairCount: number;
  classCount: number;
  cloneRatio: number;
  timings: Record<string, number>;
}

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

/**
 * What a caller may give a load besides its input: progress reports, a way to stop it, the
 * attempt it runs as (a job's), and the process's analyzer pool.
 */
export interface LoadHooks {
  /** Each step's progress; called often (the caller throttles its writes). */
  onProgress?: (progress: LoadProgressDTO) => void;
  /** Aborting it stops the load at its next checkpoint; nothing of the snapshot is written then. */
  signal?: AbortSignal;
  /** The snapshot row's attempt number this load writes under (a job's); absent: any running row. */
  attempt?: number;
  pool?: AnalyzerPool;
}

/** Thrown when a load finds, at its last step, that its snapshot is no longer its to finish. */
export class LoadStoppedError extends Error {
  constructor(readonly why: 'cancelled' | 'gone' | 'superseded' | 'ended') {
    super(`The load stopped: the snapshot was ${why === 'gone' ? 'deleted' : why === 'superseded' ? 'taken over by a newer attempt' : why}.`);
    this.name = 'LoadStoppedError';
  }
}

/** A reused analysis that a deletion removed while the load was analysing the rest: analyse again. */
class AnalysesVanishedError extends Error {}

/**
 * Loads one snapshot from the command line or a test: inserts its row in status 'running', then
 * runs the load (see runLoad). A load that fails leaves the snapshot marked failed, with its
 * reason, and nothing half-written.
 */
export async function loadSnapshot(input: LoadSnapshotInput, hooks: LoadHooks = {}): Promise<LoadSnapshotResult> {
  if (await findSnapshotByLabel(input.repository.id, input.label)) {
    throw new ConflictError(`Snapshot "${input.label}" already exists in this repository.`, 'label');
  }
  let snapshotId: number;
  try {
    snapshotId = await insertRunningSnapshot({
      repositoryId: input.repository.id,
      label: input.label,
      source: input.source ?? 'folder',
      commitSha: input.commitSha ?? null,
      settings: settingsOf(input.repository),
    });
  } catch (error) {
    // Two loads racing for one label: the unique constraint answers, as a conflict.
    throw fromDatabaseError(error);
  }
  try {
    return await runLoad(snapshotId, input, hooks);
  } catch (error) {
    await markSnapshotFailed(snapshotId, error instanceof Error ? error.message : String(error));
    throw error;
  }
}

/** The settings a snapshot keeps from its repository at load time. */
export function settingsOf(repository: RepositorySettings): SnapshotSettings {
  return { threshold: Number(repository.threshold), minTokens: repository.minTokens, shingleSize: repository.shingleSize, ignore: repository.ignore };
}

const skippedRow = (path: string, reason: string): SnapshotFileRow => ({ path, contentHash: null, analysisId: null, language: null, skipReason: reason, error: null });

/**
 * Runs the load of a snapshot whose row exists in status 'running'. Only contents never analysed
 * with these options are analysed, only sets never seen are indexed and probed; the snapshot's
 * clone pairs, classes and clone ratio are then derived from stored set pairs, and each class is
 * compared with the previous snapshot's classes. Three steps, so that several loads run at once:
 *
 *  1. analysis, in the analyzer pool, with no transaction and no lock (most of the work);
 *  2. the index: new shingle sets get ranks and are stored and probed under the index write lock,
 *     in a transaction of their own that commits and releases the lock (sets and set pairs are
 *     content-addressed and hold hashes, not code; a later failure leaves them for the next load);
 *  3. everything of the snapshot — file texts, analyses, fragments, its files, classes, figures,
 *     status ready — in one last transaction: a load that fails or is cancelled writes none of it.
 */
export async function runLoad(snapshotId: number, input: LoadSnapshotInput, hooks: LoadHooks = {}): Promise<LoadSnapshotResult> {
  const analysed = new Map<string, FileAnalysis | string>();
  for (let round = 1; ; round++) {
    try {
      return await loadRound(snapshotId, input, hooks, analysed);
    } catch (error) {
      // Deleting another repository can remove a text this load found stored and meant to reuse; analyse those now.
      if (error instanceof AnalysesVanishedError && round < 3) continue;
      throw error;
    }
  }
}

async function loadRound(
  snapshotId: number,
  input: LoadSnapshotInput,
  hooks: LoadHooks,
  analysed: Map<string, FileAnalysis | string>,
): Promise<LoadSnapshotResult> {
  const { signal } = hooks;
  const progress = (phase: LoadProgressDTO['phase'], done: number, total: number) => {
    hooks.onProgress?.({ phase, done, total });
    signal?.throwIfAborted();
  };
  const timings: Record<string, number> = {};
  let mark = performance.now();
  const lap = (name: string) => {
    const now = performance.now();
    timings[name] = Math.round(now - mark);
    mark = now;
  };
  const options = analyzeOptions(input.repository);
  const key = optionsKey(options);
  const rows: SnapshotFileRow[] = (input.skipped ?? []).map((s) => skippedRow(s.path, s.reason));

  // 1. skip what the rules say, hash the rest; analyse each content with no analysis under these
  //    options yet (once, however many paths hold it), outside any transaction
  const kept: { file: SourceFile; hash: string }[] = [];
  for (const file of input.files) {
    const reason =
      skipReason(file.path, file.content, { ignore: input.repository.ignore }) ??
      (languageForPath(file.path) ? undefined : 'no analyzer for this file type');
    if (reason) rows.push(skippedRow(file.path, reason));
    else kept.push({ file, hash: sha256(file.content) });
  }
  const reused = await findAnalyses(undefined, [...new Set(kept.map((k) => k.hash))], key);
  const toAnalyze = new Map<string, SourceFile>();
  for (const k of kept) if (!reused.has(k.hash) && !toAnalyze.has(k.hash) && !analysed.has(k.hash)) toAnalyze.set(k.hash, k.file);
  progress('analysing', 0, toAnalyze.size);
  const result = await analyzeFiles([...toAnalyze.values()], {
    ...options,
    ignore: [],
    workers: input.workers,
    pool: hooks.pool,
    signal,
    onFileDone: (done, total) => progress('analysing', done, total),
  });
  const byPath = new Map(result.files.map((f) => [f.path, f]));
  const skippedByPath = new Map(result.skipped.map((s) => [s.path, s.reason]));
  for (const [hash, file] of toAnalyze) analysed.set(hash, byPath.get(file.path) ?? skippedByPath.get(file.path) ?? 'not analysed');
  lap('analyze');

  // 2. index the fresh fragments' shingle sets, under the index lock, committed on their own
  const fresh: { hash: string; analysis: FileAnalysis }[] = [];
  const analysisSkips = new Map<string, string>();
  for (const hash of new Set(kept.map((k) => k.hash))) {
    if (reused.has(hash)) continue;
    const outcome = analysed.get(hash)!;
    if (typeof outcome === 'string') analysisSkips.set(hash, outcome);
    else fresh.push({ hash, analysis: outcome });
  }
  const fragmentSets = fresh.flatMap(({ analysis }) => analysis.fragments.map((f) => ({ hash: setHash(f.shingles), shingles: f.shingles })));
  progress('indexing', 0, fragmentSets.length);
  const indexed = await db().transaction((tx) =>
    addSets(tx, fragmentSets, { batchSize: input.batchSize, onProgress: (done, total) => progress('indexing', done, total) }),
  );
  timings.index_store = Math.round(indexed.timings.store);
  timings.index_dictionary = Math.round(indexed.timings.dictionary);
  timings.index_prefixes = Math.round(indexed.timings.prefixes);
  timings.index_probe = Math.round(indexed.timings.probe);
  lap('index');

  // 3. the snapshot's texts, analyses, files, clone pairs, classes and figures, all or nothing
  progress('deriving', 0, 0);
  return db().transaction(async (tx) => {
    await lockContents(tx, 'load');
    const organisationId = await organisationOfRepository(tx, input.repository.id);
    if (organisationId === null) throw new LoadStoppedError('gone');
    await lockOrganisationLoads(tx, organisationId);
    const row = await lockLoadingSnapshot(tx, snapshotId);
    if (!row) throw new LoadStoppedError('gone');
    if (row.status === 'cancelled') throw new LoadStoppedError('cancelled');
    if (row.status !== 'running') throw new LoadStoppedError('ended');
    if (hooks.attempt !== undefined && row.attempt !== hooks.attempt) throw new LoadStoppedError('superseded');
    signal?.throwIfAborted();

    await storeContents(tx, new Map(kept.map((k) => [k.hash, k.file.content])));
    const analysisIds = await findAnalyses(tx, [...reused.keys()], key);
    if (analysisIds.size < reused.size) throw new AnalysesVanishedError();
    await storeAnalyses(tx, key, fresh, indexed.setIds, analysisIds);
    lap('store');

    const outcomes = await analysisOutcomes(tx, [...analysisIds.values()]);
    for (const k of kept) {
      const analysisId = analysisIds.get(k.hash) ?? null;
      const skip = analysisId === null ? analysisSkips.get(k.hash) ?? 'not analysed' : null;
      const outcome = analysisId === null ? undefined : outcomes.get(analysisId);
      rows.push({ path: k.file.path, contentHash: k.hash, analysisId, language: outcome?.language ?? null, skipReason: skip, error: outcome?.error ?? null });
    }
    await storeSnapshotFiles(tx, snapshotId, rows);
    lap('files');

    const derived = await deriveClones(tx, snapshotId, input.repository);
    await settleTasks(tx, snapshotId, input.repository.id); // refactor tasks whose copies are gone, or back (commands/settleTasks.ts)
    lap('classes');

    const counts = {
      fileCount: rows.length,
      skippedCount: rows.filter((r) => r.skipReason).length,
      failedCount: rows.filter((r) => r.error).length,
      analyzedFileCount: fresh.length,
      fragmentCount: derived.fragmentCount,
      newSetCount: indexed.newSetCount,
    };
    await markSnapshotReady(tx, snapshotId, { ...counts, cloneRatio: derived.cloneRatio, timings });
    // the organisation's classes across repositories, now that this snapshot is the latest ready one
    await rebuildCrossClasses(tx, organisationId);
    await queueLoadNotices(tx, snapshotId);
    return { snapshotId, ...counts, pairCount: derived.pairCount, classCount: derived.classCount, cloneRatio: derived.cloneRatio, timings };
  });
}
