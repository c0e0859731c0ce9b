import { db } from '../db/connection';
import { deleteStoredArchive } from '../ingest';
import type { Repository } from '../models/Repository';
import { deleteUnheldContents, lockContents } from '../queries/files';
import { unfinishedLoadIds } from '../queries/snapshots';
import { rebuildCrossClasses } from './crossClasses';
import { deleteGitMirror } from './gitRemotes';

/**
 * Deletes a repository, its snapshots (files, classes, metrics go with them), the archives its
 * queued or running loads were keeping, its git mirror, and every stored file text that no
 * snapshot of any repository holds any more (its analyses and fragments go with it). Shingle sets
 * and set pairs stay: they hold hashes of normalized tokens, not code. A load of it still running
 * stops at its next checkpoint (its snapshot is gone) and writes nothing. The organisation's
 * classes across repositories are rebuilt without it.
 */
export async function deleteRepository(repository: Repository): Promise<void> {
  const loads = await db().transaction(async (tx) => {
    // Waits for loads finishing (they hold texts another repository's snapshot may be about to share).
    await lockContents(tx, 'delete');
    const ids = await unfinishedLoadIds(tx, repository.id);
    await repository.destroy({ transaction: tx });
    await deleteUnheldContents(tx);
    await rebuildCrossClasses(tx, repository.organisationId);
    return ids;
  });
  for (const id of loads) await deleteStoredArchive(id);
  // After the commit: a failed delete keeps its mirror. (The link row went with the repository.)
  await deleteGitMirror(repository.id);
}
