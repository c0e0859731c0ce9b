import { createHash } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { analyzeFiles, languageForPath, skipReason } from '../../analyzers';
import type { FileAnalysis, SkippedFile, SourceFile } from '../../analyzers/types';
import { analyzeOptions, optionsKey, type RepositorySettings } from '../clone-index/options';
import { addSets, setHash } from '../clone-index/sets';
import { db } from '../db/connection';
import { ConflictError } from '../errors';
import type { SnapshotSettings } from '../models/Snapshot';
import { analysisOutcomes, findAnalyses, storeAnalyses, storeContents, storeSnapshotFiles, type SnapshotFileRow } from '../queries/files';
import { findSnapshotByLabel, insertRunningSnapshot, markSnapshotFailed, markSnapshotReady } from '../queries/snapshots';
import { queueLoadNotices } from '../mail/load-notices';
import { deriveClones } from './deriveClones';

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
 * Loads one snapshot. Only contents never analyzed with these options are analyzed, only sets
 * never seen are indexed and probed; the snapshot's clone pairs, classes and clone ratio are then
 * derived from stored set pairs, and each class is compared with the previous snapshot's classes.
 * Everything but the snapshot's own row is written in one transaction: a load that fails leaves
 * the snapshot marked failed, with its reason, and nothing half-written.
 */
export async function loadSnapshot(input: LoadSnapshotInput): Promise<LoadSnapshotResult> {
  if (await findSnapshotByLabel(input.repository.id, input.label)) {
    throw new ConflictError(`Snapshot "${input.label}" already exists in this repository.`, 'label');
  }
  const snapshotId = await insertRunningSnapshot({
    repositoryId: input.repository.id,
    label: input.label,
    source: input.source ?? 'folder',
    commitSha: input.commitSha ?? null,
    settings: settingsOf(input.repository),
  });
  try {
    return await db().transaction((tx) => loadInto(tx, snapshotId, input));
  } catch (error) {
    await markSnapshotFailed(snapshotId, error instanceof Error ? error.message : String(error));
    throw error;
  }
}

function settingsOf(repository: RepositorySettings): SnapshotSettings {
  return { threshold: Number(repository.threshold), minTokens: repository.minTokens, shingleSize: repository.shingleSize, ignore: repository.ignore };
}

const skippedRow = (path: string, reason: string): SnapshotFileRow => ({ path, contentHash: null, analysisId: null, language: null, skipReason: reason, error: null });

async function loadInto(tx: Transaction, snapshotId: number, input: LoadSnapshotInput): Promise<LoadSnapshotResult> {
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

  // 1. skip what the rules say, hash the rest, store contents never seen
  const kept: { file: SourceFile; hash: string }[] = [];
  for (const file of input.files) {
    const reason =
      skipReason(file.path, file.content, { ignore: input.repository.ignore }) ??
      (languageForPath(file.path) ? undefined : 'no analyzer for this file type');
    if (reason) rows.push(skippedRow(file.path, reason));
    else kept.push({ file, hash: sha256(file.content) });
  }
  await storeContents(tx, new Map(kept.map((k) => [k.hash, k.file.content])));
  lap('store_contents');

  // 2. analyze each content with no analysis under these options yet (once, however many paths hold it)
  const analysisIds = await findAnalyses(tx, [...new Set(kept.map((k) => k.hash))], key);
  const toAnalyze = new Map<string, SourceFile>();
  for (const k of kept) if (!analysisIds.has(k.hash) && !toAnalyze.has(k.hash)) toAnalyze.set(k.hash, k.file);
  const hashes = [...toAnalyze.keys()];
  const analyzed = await analyzeFiles([...toAnalyze.values()], { ...options, ignore: [], workers: input.workers });
  lap('analyze');
  const byPath = new Map(analyzed.files.map((f) => [f.path, f]));
  const skippedByPath = new Map(analyzed.skipped.map((s) => [s.path, s.reason]));

  // 3. index the new fragments' shingle sets, then store the analyses and their fragments
  const fresh: { hash: string; analysis: FileAnalysis }[] = [];
  const analysisSkips = new Map<string, string>();
  for (const hash of hashes) {
    const path = toAnalyze.get(hash)!.path;
    const analysis = byPath.get(path);
    if (analysis) fresh.push({ hash, analysis });
    else analysisSkips.set(hash, skippedByPath.get(path) ?? 'not analysed');
  }
  const fragmentSets = fresh.flatMap(({ analysis }) => analysis.fragments.map((f) => ({ hash: setHash(f.shingles), shingles: f.shingles })));
  const indexed = await addSets(tx, fragmentSets, { batchSize: input.batchSize });
  timings.index_store = Math.round(indexed.timings.store);
  timings.index_probe = Math.round(indexed.timings.probe);
  await storeAnalyses(tx, key, fresh, indexed.setIds, analysisIds);
  lap('index');

  // 4. the snapshot's files
  const outcomes = await analysisOutcomes(tx, [...analysisIds.values()]);
  for (const k of kept) {
    const analysisId = analysisIds.get(k.hash) ?? null;
    const skip = analysisId === null ? analysisSkips.get(k.hash) ?? 'not analysed' : null;
    const outcome = analysisId === null ? undefined : outcomes.get(analysisId);
    rows.push({ path: k.file.path, contentHash: k.hash, analysisId, language: outcome?.language ?? null, skipReason: skip, error: outcome?.error ?? null });
  }
  await storeSnapshotFiles(tx, snapshotId, rows);
  lap('files');

  // 5. clone pairs, classes, clone ratio, comparison with the previous snapshot
  const derived = await deriveClones(tx, snapshotId, input.repository);
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
  await queueLoadNotices(tx, snapshotId);
  return { snapshotId, ...counts, pairCount: derived.pairCount, classCount: derived.classCount, cloneRatio: derived.cloneRatio, timings };
}
