/** Reads and writes of git links: the link itself and the state of its last import (see README.md). */
import type { Transaction } from 'sequelize';
import { select } from '../clone-index/sql';
import { GitLink } from '../models/GitLink';

/** A repository's git link, or null. */
export function findGitLink(repositoryId: number, transaction?: Transaction): Promise<GitLink | null> {
  return GitLink.findByPk(repositoryId, { transaction });
}

/** Creates or changes a repository's link (the import state stays). */
export async function saveGitLink(link: { repositoryId: number; remoteUrl: string; tagPattern: string; createdBy: string | null }): Promise<GitLink> {
  const [saved] = await GitLink.upsert(link, { returning: true });
  return saved;
}

/** Removes a repository's link. */
export async function deleteGitLink(repositoryId: number): Promise<void> {
  await GitLink.destroy({ where: { repositoryId } });
}

/** An import was asked for: queued, with nothing of the previous run's figures left. */
export async function markImportQueued(repositoryId: number, transaction?: Transaction): Promise<void> {
  await GitLink.update(
    {
      importStatus: 'queued',
      importRequestedAt: new Date(),
      importStartedAt: null,
      importFinishedAt: null,
      importTagCount: null,
      importNewTagCount: null,
      importLoadedCount: null,
      importCurrentTag: null,
      importError: null,
    },
    { where: { repositoryId }, transaction },
  );
}

/** A worker took the import. */
export async function markImportRunning(repositoryId: number): Promise<void> {
  await GitLink.update(
    { importStatus: 'running', importStartedAt: new Date(), importFinishedAt: null, importTagCount: null, importNewTagCount: null, importLoadedCount: 0, importCurrentTag: null, importError: null },
    { where: { repositoryId } },
  );
}

/** What the fetch found: matching tags, and how many of them have no snapshot yet. */
export async function recordImportPlan(repositoryId: number, tagCount: number, newTagCount: number): Promise<void> {
  await GitLink.update({ importTagCount: tagCount, importNewTagCount: newTagCount }, { where: { repositoryId } });
}

/** The tag whose load starts now, and how many were loaded before it. */
export async function recordImportProgress(repositoryId: number, currentTag: string | null, loadedCount: number): Promise<void> {
  await GitLink.update({ importCurrentTag: currentTag, importLoadedCount: loadedCount }, { where: { repositoryId } });
}

/** The import ended: succeeded, or failed with its (already redacted) reason. */
export async function markImportFinished(repositoryId: number, outcome: { loadedCount: number; error: string | null }): Promise<void> {
  await GitLink.update(
    {
      importStatus: outcome.error === null ? 'succeeded' : 'failed',
      importFinishedAt: new Date(),
      importLoadedCount: outcome.loadedCount,
      importCurrentTag: null,
      importError: outcome.error,
    },
    { where: { repositoryId } },
  );
}

/** A snapshot's label with what an import needs to know about it. */
export interface SnapshotLabel {
  id: number;
  label: string;
  status: string;
  source: string;
}

/** Every snapshot label of a repository, with status and source. */
export function snapshotLabels(repositoryId: number): Promise<SnapshotLabel[]> {
  return select<SnapshotLabel>(undefined, `select id, label, status, source from snapshots where repository_id = $1`, [repositoryId]);
}
