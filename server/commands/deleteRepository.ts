import { db } from '../db/connection';
import type { Repository } from '../models/Repository';
import { lockIndex } from '../clone-index/sql';
import { deleteUnheldContents } from '../queries/files';
import { rebuildCrossClasses } from './crossClasses';

/**
 * Deletes a repository, its snapshots (files, classes, metrics go with them), and every stored
 * file text that no snapshot of any repository holds any more (its analyses and fragments go
 * with it). Shingle sets and set pairs stay: they hold hashes of normalized tokens, not code.
 * The organisation's classes across repositories are rebuilt without it.
 */
export async function deleteRepository(repository: Repository): Promise<void> {
  await db().transaction(async (tx) => {
    // queued behind a load in progress, so the classes across repositories are rebuilt from settled snapshots
    await lockIndex(tx);
    await repository.destroy({ transaction: tx });
    await deleteUnheldContents(tx);
    await rebuildCrossClasses(tx, repository.organisationId);
  });
}
