import { createHash } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { analyzeFiles, languageForPath, skipReason } from '../../analyzers';
import type { FileAnalysis, SkippedFile, SourceFile } from '../../analyzers/types';
import { compareClasses, occurrences, type MemberIdentity } from '../clone-index/compare';
import { analyzeOptions, optionsKey, repositoryThreshold, type RepositorySettings } from '../clone-index/options';
import { clonePairsAcross, clonePairsWithin, snapshotInstances, type Instance, type InstancePair } from '../clone-index/snapshot-pairs';
import { addSets, setHash } from '../clone-index/sets';
import { chunks, execute, select } from '../clone-index/sql';
import { db } from '../db/connection';
import { ConflictError } from '../errors';
import { cloneClasses, clonedTokens } from '../matching/classes';

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
 * Loads one snapshot. Only contents never analysed with these options are analysed, only sets
 * never seen are indexed and probed; the snapshot's clone pairs, classes and clone ratio are then
 * derived from stored set pairs, and each class is compared with the previous snapshot's classes.
 * Everything but the snapshot's own row is written in one transaction: a load that fails leaves
 * the snapshot marked failed, with its reason, and nothing half-written.
 */
export async function loadSnapshot(input: LoadSnapshotInput): Promise<LoadSnapshotResult> {
  const sequelize = db();
  const [existing] = await select<{ id: number }>(undefined, 'select id from snapshots where repository_id = $1 and label = $2', [
    input.repository.id,
    input.label,
  ]);
  if (existing) throw new ConflictError(`Snapshot "${input.label}" already exists in this repository.`, 'label');
  const [{ id: snapshotId }] = await select<{ id: number }>(
    undefined,
    `insert into snapshots (repository_id, label, source, commit_sha, status, settings)
     values ($1, $2, $3, $4, 'running', $5) returning id`,
    [input.repository.id, input.label, input.source ?? 'folder', input.commitSha ?? null, JSON.stringify(settingsOf(input.repository))],
  );
  try {
    return await sequelize.transaction((tx) => loadInto(tx, snapshotId, input));
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    await execute(undefined, `update snapshots set status = 'failed', error = $2, updated_at = now() where id = $1`, [snapshotId, message]);
    throw error;
  }
}

function settingsOf(repository: RepositorySettings) {
  return { threshold: Number(repository.threshold), minTokens: repository.minTokens, shingleSize: repository.shingleSize, ignore: repository.ignore };
}

interface FileRow {
  path: string;
  contentHash: string | null;
  analysisId: number | null;
  language: string | null;
  skipReason: string | null;
  error: string | null;
}

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
  const rows: FileRow[] = (input.skipped ?? []).map((s) => ({ path: s.path, contentHash: null, analysisId: null, language: null, skipReason: s.reason, error: null }));

  // 1. skip what the rules say, hash the rest, store contents never seen
  const kept: { file: SourceFile; hash: string }[] = [];
  for (const file of input.files) {
    const reason =
      skipReason(file.path, file.content, { ignore: input.repository.ignore }) ??
      (languageForPath(file.path) ? undefined : 'no analyzer for this file type');
    if (reason) rows.push({ path: file.path, contentHash: null, analysisId: null, language: null, skipReason: reason, error: null });
    else kept.push({ file, hash: sha256(file.content) });
  }
  await storeContents(tx, kept);
  lap('store_contents');

  // 2. analyse each content with no analysis under these options yet (once, however many paths hold it)
  const analysisIds = await existingAnalyses(tx, [...new Set(kept.map((k) => k.hash))], key);
  const toAnalyse = new Map<string, SourceFile>();
  for (const k of kept) if (!analysisIds.has(k.hash) && !toAnalyse.has(k.hash)) toAnalyse.set(k.hash, k.file);
  const hashes = [...toAnalyse.keys()];
  const analysed = await analyzeFiles([...toAnalyse.values()], { ...options, ignore: [], workers: input.workers });
  lap('analyze');
  const byPath = new Map(analysed.files.map((f) => [f.path, f]));
  const skippedByPath = new Map(analysed.skipped.map((s) => [s.path, s.reason]));

  // 3. index the new fragments' shingle sets, then store the analyses and their fragments
  const fresh: { hash: string; analysis: FileAnalysis }[] = [];
  const analysisSkips = new Map<string, string>();
  for (const hash of hashes) {
    const path = toAnalyse.get(hash)!.path;
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
  const errors = await analysisErrors(tx, [...analysisIds.values()]);
  for (const k of kept) {
    const analysisId = analysisIds.get(k.hash) ?? null;
    const skip = analysisId === null ? analysisSkips.get(k.hash) ?? 'not analysed' : null;
    const info = analysisId === null ? undefined : errors.get(analysisId);
    rows.push({ path: k.file.path, contentHash: k.hash, analysisId, language: info?.language ?? null, skipReason: skip, error: info?.error ?? null });
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
  await execute(
    tx,
    `update snapshots set status = 'ready', file_count = $2, skipped_count = $3, failed_count = $4, analyzed_file_count = $5,
       fragment_count = $6, new_set_count = $7, clone_ratio = $8, timings = $9, updated_at = now() where id = $1`,
    [snapshotId, counts.fileCount, counts.skippedCount, counts.failedCount, counts.analyzedFileCount, counts.fragmentCount,
      counts.newSetCount, derived.cloneRatio, JSON.stringify(timings)],
  );
  return { snapshotId, ...counts, pairCount: derived.pairCount, classCount: derived.classCount, cloneRatio: derived.cloneRatio, timings };
}

async function storeContents(tx: Transaction, kept: { file: SourceFile; hash: string }[]) {
  const unique = new Map(kept.map((k) => [k.hash, k.file.content]));
  const hashes = [...unique.keys()];
  for (const [start, end] of chunks(hashes.length, 500)) {
    const slice = hashes.slice(start, end);
    await execute(
      tx,
      `insert into file_contents (hash, text, byte_size) select * from unnest($1::text[], $2::text[], $3::int[]) on conflict do nothing`,
      [slice, slice.map((h) => Buffer.from(unique.get(h)!).toString('utf8')), slice.map((h) => unique.get(h)!.byteLength)],
    );
  }
}

async function existingAnalyses(tx: Transaction, hashes: string[], key: string) {
  const rows = await select<{ id: number; contentHash: string }>(
    tx,
    'select id, content_hash as "contentHash" from analyses where options_key = $1 and content_hash = any($2::text[])',
    [key, hashes],
  );
  return new Map(rows.map((r) => [r.contentHash, r.id]));
}

async function analysisErrors(tx: Transaction, ids: number[]) {
  const rows = await select<{ id: number; language: string; error: string | null }>(tx, 'select id, language, error from analyses where id = any($1::int[])', [ids]);
  return new Map(rows.map((r) => [r.id, r]));
}

async function storeAnalyses(
  tx: Transaction,
  key: string,
  fresh: { hash: string; analysis: FileAnalysis }[],
  setIds: number[],
  analysisIds: Map<string, number>,
) {
  if (fresh.length === 0) return;
  const rows = await select<{ id: number; contentHash: string }>(
    tx,
    `insert into analyses (content_hash, options_key, language, error)
     select h, $1, l, e from unnest($2::text[], $3::text[], $4::text[]) as t(h, l, e)
     returning id, content_hash as "contentHash"`,
    [key, fresh.map((f) => f.hash), fresh.map((f) => f.analysis.language), fresh.map((f) => f.analysis.error ?? null)],
  );
  for (const r of rows) analysisIds.set(r.contentHash, r.id);
  const columns: unknown[][] = Array.from({ length: 14 }, () => []);
  let setIndex = 0;
  for (const { hash, analysis } of fresh) {
    analysis.fragments.forEach((f, ordinal) => {
      const values = [analysisIds.get(hash), ordinal, f.name, f.kind, f.startLine, f.startColumn, f.endLine, f.endColumn, f.tokens, f.tokenStart, f.tokenEnd, f.rawHash, f.normalizedHash, setIds[setIndex++]];
      values.forEach((v, i) => columns[i].push(v));
    });
  }
  for (const [start, end] of chunks(columns[0].length, 20_000)) {
    await execute(
      tx,
      `insert into fragments (analysis_id, ordinal, name, kind, start_line, start_column, end_line, end_column, tokens, token_start, token_end, raw_hash, normalized_hash, set_id)
       select * from unnest($1::int[], $2::int[], $3::text[], $4::text[], $5::int[], $6::int[], $7::int[], $8::int[], $9::int[], $10::int[], $11::int[], $12::text[], $13::text[], $14::int[])`,
      columns.map((c) => c.slice(start, end)),
    );
  }
}

async function storeSnapshotFiles(tx: Transaction, snapshotId: number, rows: FileRow[]) {
  for (const [start, end] of chunks(rows.length, 10_000)) {
    const slice = rows.slice(start, end);
    await execute(
      tx,
      `insert into snapshot_files (snapshot_id, path, content_hash, analysis_id, language, skip_reason, error)
       select $1, * from unnest($2::text[], $3::text[], $4::int[], $5::text[], $6::text[], $7::text[])`,
      [snapshotId, slice.map((r) => r.path), slice.map((r) => r.contentHash), slice.map((r) => r.analysisId), slice.map((r) => r.language), slice.map((r) => r.skipReason), slice.map((r) => r.error)],
    );
  }
}

function identities(instances: Instance[]): MemberIdentity[] {
  const nth = occurrences(instances);
  return instances.map((x, i) => ({ path: x.path, name: x.name, occurrence: nth[i], rawHash: x.rawHash }));
}

async function deriveClones(tx: Transaction, snapshotId: number, repository: RepositorySettings & { id: number }) {
  const t = repositoryThreshold(repository);
  const instances = await snapshotInstances(tx, snapshotId);
  const pairs = await clonePairsWithin(tx, instances, t);
  const classes = cloneClasses(instances.length, pairs);
  const tokens = clonedTokens(instances.map((x) => ({ file: x.snapshotFileId, tokenStart: x.tokenStart, tokenEnd: x.tokenEnd })), pairs);
  const cloneRatio = tokens.total === 0 ? 0 : tokens.cloned / tokens.total;
  const cross = await clonePairsAcross(tx, repository.id, instances, t);

  // the previous ready snapshot of this repository and its classes
  const [previous] = await select<{ id: number }>(
    tx,
    `select id from snapshots where repository_id = $1 and status = 'ready' and id < $2 order by id desc limit 1`,
    [repository.id, snapshotId],
  );
  const mine = identities(instances);
  let comparison = compareClasses(classes.map((c) => c.map((i) => mine[i])), [], new Map());
  let previousClassIds: number[] = [];
  if (previous) {
    const before = await snapshotInstances(tx, previous.id);
    const theirs = identities(before);
    const keyed = new Map<string, number>();
    before.forEach((x, i) => keyed.set(`${x.snapshotFileId}:${x.fragmentId}`, i));
    const members = await select<{ classId: number; snapshotFileId: number; fragmentId: number }>(
      tx,
      `select m.class_id as "classId", m.snapshot_file_id as "snapshotFileId", m.fragment_id as "fragmentId"
         from clone_class_members m join clone_classes c on c.id = m.class_id where c.snapshot_id = $1 order by c.ordinal`,
      [previous.id],
    );
    const grouped = new Map<number, MemberIdentity[]>();
    for (const m of members) {
      const list = grouped.get(m.classId) ?? [];
      list.push(theirs[keyed.get(`${m.snapshotFileId}:${m.fragmentId}`)!]);
      grouped.set(m.classId, list);
    }
    previousClassIds = [...grouped.keys()];
    const fragmentsBefore = new Map(theirs.map((m) => [`${m.path}\u0000${m.name}\u0000${m.occurrence}`, m.rawHash]));
    comparison = compareClasses(classes.map((c) => c.map((i) => mine[i])), [...grouped.values()], fragmentsBefore);
  }

  await storeClasses(tx, snapshotId, instances, pairs, classes, comparison.classes, previousClassIds);
  const byType = [1, 2, 3].map((type) => pairs.filter((p) => p.type === type).length);
  await execute(
    tx,
    `insert into snapshot_metrics (snapshot_id, fragment_tokens, cloned_tokens, clone_ratio, pair_count, class_count,
       type1_pairs, type2_pairs, type3_pairs, cross_pair_count, new_class_count, drifted_class_count, gone_class_count)
     values ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13)`,
    [snapshotId, tokens.total, tokens.cloned, cloneRatio, pairs.length, classes.length, ...byType, cross.length,
      comparison.classes.filter((c) => c.status === 'new').length,
      comparison.classes.filter((c) => c.status === 'drifted').length, comparison.gone.length],
  );
  return { fragmentCount: instances.length, pairCount: pairs.length, classCount: classes.length, cloneRatio };
}

async function storeClasses(
  tx: Transaction,
  snapshotId: number,
  instances: Instance[],
  pairs: InstancePair[],
  classes: number[][],
  comparisons: { status: string; previous: number; changed: boolean[] }[],
  previousClassIds: number[],
) {
  if (classes.length === 0) return;
  const classOf = new Int32Array(instances.length).fill(-1);
  classes.forEach((members, c) => members.forEach((i) => (classOf[i] = c)));
  const stats = classes.map(() => ({ min: 1, max: 0, type: 1 }));
  for (const p of pairs) {
    const s = stats[classOf[p.a]];
    s.min = Math.min(s.min, p.similarity);
    s.max = Math.max(s.max, p.similarity);
    s.type = Math.max(s.type, p.type);
  }
  const ids = await select<{ id: number; ordinal: number }>(
    tx,
    `insert into clone_classes (snapshot_id, ordinal, size, tokens, min_similarity, max_similarity, clone_type, language, status, previous_class_id)
     select $1, * from unnest($2::int[], $3::int[], $4::int[], $5::float8[], $6::float8[], $7::int[], $8::text[], $9::text[], $10::int[])
     returning id, ordinal`,
    [
      snapshotId,
      classes.map((_, i) => i),
      classes.map((c) => c.length),
      classes.map((c) => c.reduce((sum, i) => sum + instances[i].tokens, 0)),
      stats.map((s) => s.min),
      stats.map((s) => s.max),
      stats.map((s) => s.type),
      classes.map((c) => instances[c[0]].language),
      comparisons.map((c) => c.status),
      comparisons.map((c) => (c.previous >= 0 ? previousClassIds[c.previous] : null)),
    ],
  );
  const idOf = new Map(ids.map((r) => [r.ordinal, r.id]));
  const classIds: number[] = [];
  const fileIds: number[] = [];
  const fragmentIds: number[] = [];
  const changed: boolean[] = [];
  classes.forEach((members, c) =>
    members.forEach((i, m) => {
      classIds.push(idOf.get(c)!);
      fileIds.push(instances[i].snapshotFileId);
      fragmentIds.push(instances[i].fragmentId);
      changed.push(comparisons[c].changed[m]);
    }),
  );
  await execute(
    tx,
    `insert into clone_class_members (class_id, snapshot_file_id, fragment_id, code_changed)
     select * from unnest($1::int[], $2::int[], $3::int[], $4::bool[])`,
    [classIds, fileIds, fragmentIds, changed],
  );
}
