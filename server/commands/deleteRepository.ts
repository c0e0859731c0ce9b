import { execute } from '../clone-index/sql';
import { db } from '../db/connection';
import type { Repository } from '../models/Repository';

/**
 * Deletes a repository, its snapshots (files, classes, metrics go with them), and every stored
 * file text that no snapshot of any repository holds any more (its analyses and fragments go
 * with it). Shingle sets and set pairs stay: they hold hashes of normalised tokens, not code.
 */
export async function deleteRepository(repository: Repository): Promise<void> {
  await db().transaction(async (tx) => {
    await repository.destroy({ transaction: tx });
    await execute(
      tx,
      `delete from file_contents fc where not exists (select 1 from snapshot_files sf where sf.content_hash = fc.hash)`,
    );
  });
}
