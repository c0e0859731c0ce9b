/** Reads and writes of snapshots: the row's life cycle, its figures, its neighbours (see README.md). */
import type { InferAttributes, Transaction } from 'sequelize';
import { execute, select } from '../clone-index/sql';
import { Repository } from '../models/Repository';
import type { LoadProgressDTO, SnapshotStatus } from '../../shared/api/snapshots';
import { Snapshot, type SnapshotSettings } from '../models/Snapshot';
import { SnapshotMetric } from '../models/SnapshotMetric';

/** A snapshot of a repository of the organisation, with that repository, or null. */
export async function findSnapshot(organisationId: string, id: number): Promise<{ snapshot: Snapshot; repository: Repository } | null> {
  const snapshot = await Snapshot.findByPk(id);
  if (!snapshot) return null;
  const repository = await Repository.findOne({ where: { id: snapshot.repositoryId, organisationId } });
  return repository && { snapshot, repository };
}

/** A repository's snapshot by release label, or null. */
export function findSnapshotByLabel(repositoryId: number, label: string): Promise<Snapshot | null> {
  return Snapshot.findOne({ where: { repositoryId, label } });
}

/** The figures of a snapshot, or null until its load has finished. */
export function snapshotMetric(snapshotId: number): Promise<SnapshotMetric | null> {
  return SnapshotMetric.findByPk(snapshotId);
}

/** A repository's snapshots, newest first, each with its figures (null until ready). */
export async function listSnapshots(repositoryId: number): Promise<{ snapshot: Snapshot; metric: SnapshotMetric | null }[]> {
  const snapshots = await Snapshot.findAll({ where: { repositoryId }, order: [['id', 'DESC']] });
  const metrics = await SnapshotMetric.findAll({ where: { snapshotId: snapshots.map((s) => s.id) } });
  const bySnapshot = new Map(metrics.map((m) => [m.snapshotId, m]));
  return snapshots.map((snapshot) => ({ snapshot, metric: bySnapshot.get(snapshot.id) ?? null }));
}

/**
 * The ready snapshot of the repository loaded last before `snapshotId` (what a snapshot is
 * compared with), or undefined for the first one.
 */
export async function previousReadySnapshot(
  tx: Transaction | undefined,
  repositoryId: number,
  snapshotId: number,
): Promise<{ id: number; label: string } | undefined> {
  const [previous] = await select<{ id: number; label: string }>(
    tx,
    `select id, label from snapshots where repository_id = $1 and status = 'ready' and id < $2 order by id desc limit 1`,
    [repositoryId, snapshotId],
  );
  return previous;
}

/** What a snapshot row starts with. */
export interface NewSnapshot {
  repositoryId: number;
  label: string;
  source: string;
  commitSha: string | null;
  settings: SnapshotSettings;
}

/** Inserts a snapshot row in status 'running' (outside the load's transaction, so a failure stays visible) and returns its id. */
export async function insertRunningSnapshot(snapshot: NewSnapshot): Promise<number> {
  const [{ id }] = await select<{ id: number }>(
    undefined,
    `insert into snapshots (repository_id, label, source, commit_sha, status, settings)
     values ($1, $2, $3, $4, 'running', $5) returning id`,
    [snapshot.repositoryId, snapshot.label, snapshot.source, snapshot.commitSha, JSON.stringify(snapshot.settings)],
  );
  return id;
}

/** Inserts an uploaded snapshot in status 'queued' (in the transaction that queues its load) and returns it. */
export async function insertQueuedSnapshot(tx: Transaction, snapshot: NewSnapshot & { startedBy: string | null; archiveSha256: string }): Promise<Snapshot> {
  const [{ id }] = await select<{ id: number }>(
    tx,
    `insert into snapshots (repository_id, label, source, commit_sha, status, settings, started_by, archive_sha256, progress)
     values ($1, $2, $3, $4, 'queued', $5, $6, $7, $8) returning id`,
    [snapshot.repositoryId, snapshot.label, snapshot.source, snapshot.commitSha, JSON.stringify(snapshot.settings), snapshot.startedBy,
      snapshot.archiveSha256, JSON.stringify({ phase: 'unpacking', done: 0, total: 0 })],
  );
  return (await Snapshot.findByPk(id, { transaction: tx }))!;
}

/**
 * Starts a new attempt at a queued or running snapshot's load (a job's first run, or a retry after
 * a worker died): status 'running', the attempt number raised (an older attempt still at work
 * stops at its next write), progress back to the start. Returns the attempt, or null when the load
 * has ended (ready, failed, cancelled) or the snapshot is gone.
 */
export async function startLoadAttempt(snapshotId: number): Promise<number | null> {
  const [row] = await select<{ attempt: number }>(
    undefined,
    `update snapshots set status = 'running', load_attempt = load_attempt + 1, error = null, updated_at = now(),
       progress = '{"phase":"unpacking","done":0,"total":0}'
     where id = $1 and status in ('queued', 'running') returning load_attempt as attempt`,
    [snapshotId],
  );
  return row?.attempt ?? null;
}

/**
 * Writes a running load's progress, only while the row is still this attempt's and running.
 * Otherwise answers why not: the load was cancelled (or ended), its snapshot deleted, or a retry
 * took it over; the load stops then.
 */
export async function writeLoadProgress(snapshotId: number, attempt: number, progress: LoadProgressDTO): Promise<'ours' | 'cancelled' | 'gone' | 'superseded'> {
  const rows = await select<{ id: number }>(
    undefined,
    `update snapshots set progress = $3, updated_at = now() where id = $1 and load_attempt = $2 and status = 'running' returning id`,
    [snapshotId, attempt, JSON.stringify(progress)],
  );
  if (rows.length === 1) return 'ours';
  const [row] = await select<{ status: SnapshotStatus; attempt: number }>(undefined, 'select status, load_attempt as attempt from snapshots where id = $1', [snapshotId]);
  if (!row) return 'gone';
  return row.attempt !== attempt ? 'superseded' : 'cancelled';
}

/** First key of the per-organisation advisory lock (the second is a hash of the organisation id). */
const ORGANISATION_LOAD_LOCK = 0x646f;

/**
 * Serialises the last step of an organisation's loads: each compares with the snapshot ready before
 * it, continues its class lineages, and stores its pairs with the other repositories' latest
 * snapshots, so two loads of one organisation must not do it at once (each would miss the other's
 * new snapshot). Analysis and indexing, most of a load, still run side by side.
 */
export function lockOrganisationLoads(tx: Transaction, organisationId: string): Promise<void> {
  return execute(tx, 'select pg_advisory_xact_lock($1::int, hashtext($2))', [ORGANISATION_LOAD_LOCK, organisationId]);
}

/** Where a load's row stands when it is about to finish: locked in `tx` until the end of the load's last transaction. */
export async function lockLoadingSnapshot(tx: Transaction, snapshotId: number): Promise<{ status: SnapshotStatus; attempt: number } | null> {
  const [row] = await select<{ status: SnapshotStatus; attempt: number }>(
    tx,
    'select status, load_attempt as attempt from snapshots where id = $1 for update',
    [snapshotId],
  );
  return row ?? null;
}

/**
 * Removes whatever an earlier attempt of this snapshot's load may have left (its files, classes,
 * figures); the load's last transaction writes them all or none, so this is a safety net.
 */
export async function clearPartialLoad(snapshotId: number): Promise<void> {
  await execute(undefined, 'delete from clone_classes where snapshot_id = $1', [snapshotId]);
  await execute(undefined, 'delete from snapshot_metrics where snapshot_id = $1', [snapshotId]);
  await execute(undefined, 'delete from snapshot_files where snapshot_id = $1', [snapshotId]);
}

/** The snapshots of a repository whose loads are queued or running (their archives are still kept). */
export async function unfinishedLoadIds(tx: Transaction, repositoryId: number): Promise<number[]> {
  const rows = await select<{ id: number }>(tx, `select id from snapshots where repository_id = $1 and status in ('queued', 'running')`, [repositoryId]);
  return rows.map((r) => r.id);
}

/** Deletes a snapshot whose load failed or was cancelled (it holds no files or classes), freeing its label. */
export async function deleteEndedSnapshot(tx: Transaction, snapshotId: number): Promise<void> {
  await execute(tx, `delete from snapshots where id = $1 and status in ('failed', 'cancelled')`, [snapshotId]);
}

/** Cancels a queued or running load; false when it has already ended. */
export async function cancelLoad(snapshotId: number): Promise<boolean> {
  const rows = await select<{ id: number }>(
    undefined,
    `update snapshots set status = 'cancelled', progress = null, updated_at = now() where id = $1 and status in ('queued', 'running') returning id`,
    [snapshotId],
  );
  return rows.length === 1;
}

/** Marks a snapshot failed with its reason (unless its load has ended otherwise; with `attempt`, only while that attempt holds it). */
export function markSnapshotFailed(snapshotId: number, reason: string, attempt?: number): Promise<void> {
  return execute(
    undefined,
    `update snapshots set status = 'failed', error = $2, progress = null, updated_at = now()
     where id = $1 and status in ('queued', 'running') and ($3::int is null or load_attempt = $3)`,
    [snapshotId, reason, attempt ?? null],
  );
}

/** A finished load's counts, as the snapshot row keeps them. */
export interface SnapshotCounts {
  fileCount: number;
  skippedCount: number;
  failedCount: number;
  analyzedFileCount: number;
  fragmentCount: number;
  newSetCount: number;
  cloneRatio: number;
  timings: Record<string, number>;
}

/** Marks a snapshot ready with its counts and timings. */
export function markSnapshotReady(tx: Transaction, snapshotId: number, counts: SnapshotCounts): Promise<void> {
  return execute(
    tx,
    `update snapshots set status = 'ready', progress = null, error = null, file_count = $2, skipped_count = $3, failed_count = $4, analyzed_file_count = $5,
       fragment_count = $6, new_set_count = $7, clone_ratio = $8, timings = $9, updated_at = now() where id = $1`,
    [snapshotId, counts.fileCount, counts.skippedCount, counts.failedCount, counts.analyzedFileCount, counts.fragmentCount,
      counts.newSetCount, counts.cloneRatio, JSON.stringify(counts.timings)],
  );
}

/** A snapshot's figures, as snapshot_metrics keeps them. */
export type SnapshotFigures = Omit<InferAttributes<SnapshotMetric>, 'snapshotId'>;

/** Stores a snapshot's figures. */
export function insertSnapshotMetrics(tx: Transaction, snapshotId: number, m: SnapshotFigures): Promise<void> {
  return execute(
    tx,
    `insert into snapshot_metrics (snapshot_id, fragment_tokens, cloned_tokens, clone_ratio, pair_count, class_count,
       type1_pairs, type2_pairs, type3_pairs, cross_pair_count, new_class_count, drifted_class_count, gone_class_count, unwaived_cloned_tokens)
     values ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14)`,
    [snapshotId, m.fragmentTokens, m.clonedTokens, m.cloneRatio, m.pairCount, m.classCount, m.type1Pairs, m.type2Pairs, m.type3Pairs,
      m.crossPairCount, m.newClassCount, m.driftedClassCount, m.goneClassCount, m.unwaivedClonedTokens],
  );
}

/**
 * Inserts a snapshot row already failed, with its reason: a release that could not even be read
 * (a git tag over the limits) still shows in the list, and its label stays taken.
 */
export async function insertFailedSnapshot(snapshot: NewSnapshot, reason: string): Promise<number> {
  const [{ id }] = await select<{ id: number }>(
    undefined,
    `insert into snapshots (repository_id, label, source, commit_sha, status, error, settings)
     values ($1, $2, $3, $4, 'failed', $5, $6) returning id`,
    [snapshot.repositoryId, snapshot.label, snapshot.source, snapshot.commitSha, reason, JSON.stringify(snapshot.settings)],
  );
  return id;
}

/**
 * Deletes a snapshot whose load did not finish (failed, or left running by a worker that died),
 * so that its release can be loaded again; a ready snapshot is never deleted here.
 */
export function deleteUnfinishedSnapshot(snapshotId: number): Promise<void> {
  return execute(undefined, `delete from snapshots where id = $1 and status <> 'ready'`, [snapshotId]);
}

/** A snapshot's release label (inside its load's transaction too), or undefined. */
export async function snapshotLabel(tx: Transaction | undefined, snapshotId: number): Promise<string | undefined> {
  const [row] = await select<{ label: string }>(tx, 'select label from snapshots where id = $1', [snapshotId]);
  return row?.label;
}
