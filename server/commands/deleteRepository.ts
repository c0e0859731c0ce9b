import { db } from '../db/connection';
import type { Repository } from '../models/Repository';
import { deleteUnheldContents, lockContents } from '../queries/files';
import { deleteGitMirror } from './gitRemotes';

/**
 * Deletes a repository, its snapshots (files, classes, metrics go with them), and every stored
 * file text that no snapshot of any repository holds any more (its analyses and fragments go
 * with it), and its git mirror. Shingle sets and set pairs stay: they hold hashes of normalized tokens, not code.
 */
export async function deleteRepository(repository: Repository): Promise<void> {
  await db().transaction(async (tx) => {
    // Waits for loads finishing (they hold texts another repository's snapshot may be about to share).
    await lockContents(tx, 'delete');
    await repository.destroy({ transaction: tx });
    await deleteUnheldContents(tx);
  });
  // After the commit: a failed delete keeps its mirror. (The link row went with the repository.)
  await deleteGitMirror(repository.id);
}
