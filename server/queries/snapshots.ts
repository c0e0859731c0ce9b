/** Reads and writes of snapshots: the row's life cycle, its figures, its neighbours (see README.md). */
import type { InferAttributes, Transaction } from 'sequelize';
import { execute, select } from '../clone-index/sql';
import { Repository } from '../models/Repository';
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

/** Marks a snapshot failed with its reason. */
export function markSnapshotFailed(snapshotId: number, reason: string): Promise<void> {
  return execute(undefined, `update snapshots set status = 'failed', error = $2, updated_at = now() where id = $1`, [snapshotId, reason]);
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
    `update snapshots set status = 'ready', file_count = $2, skipped_count = $3, failed_count = $4, analyzed_file_count = $5,
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

/** A snapshot's release label (inside its load's transaction too), or undefined. */
export async function snapshotLabel(tx: Transaction | undefined, snapshotId: number): Promise<string | undefined> {
  const [row] = await select<{ label: string }>(tx, 'select label from snapshots where id = $1', [snapshotId]);
  return row?.label;
}
