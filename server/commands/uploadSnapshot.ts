import fs from 'node:fs/promises';
import { loadConfig } from '../config';
import { db } from '../db/connection';
import { ConflictError, fromDatabaseError } from '../errors';
import { deleteStoredArchive, keepArchive, readArchive } from '../ingest';
import { send } from '../jobs';
import type { Repository } from '../models/Repository';
import type { Snapshot } from '../models/Snapshot';
import { cancelLoad, deleteEndedSnapshot, findSnapshotByLabel, insertQueuedSnapshot } from '../queries/snapshots';
import { repositorySettings } from './createRepository';
import { settingsOf } from './loadSnapshot';

/** What an upload asks for: a release label and the archive multer wrote to a temporary file. */
export interface UploadSnapshotInput {
  repository: Repository;
  label: string;
  /** The request's temporary file; moved or deleted here, whatever happens. */
  tempFile: string;
  /** Who uploaded it (null for an API token: it has no user). */
  startedBy: string | null;
}

/**
 * Queues the load of an uploaded archive. The archive is read in full first, under the limits, so
 * a refused one (a path leaving the archive, a bomb, too many entries, corrupt, encrypted, not an
 * archive) is answered with its IngestError and leaves nothing: no snapshot row, no file. An
 * accepted one gets a snapshot in status 'queued' and a `snapshot.load` job in one transaction, and
 * its file is kept under the upload folder until the job has read it.
 *
 * The label is unique within the repository: the same archive (sha-256) sent again under its label
 * answers with the snapshot it already made (`created: false`); another archive under a taken label
 * is a 409 naming the label, and so is a race of two uploads for one label. A label whose load
 * failed or was cancelled is taken over by the new upload (that snapshot held nothing).
 */
export async function uploadSnapshot(input: UploadSnapshotInput): Promise<{ snapshot: Snapshot; created: boolean }> {
  try {
    const { sha256 } = await readArchive(input.tempFile, { ignore: input.repository.ignore, checkOnly: true });
    const existing = await findSnapshotByLabel(input.repository.id, input.label);
    // A failed or cancelled load holds nothing: its label is free for another try.
    const replaces = existing && (existing.status === 'failed' || existing.status === 'cancelled') ? existing : undefined;
    if (existing && !replaces) {
      if (existing.archiveSha256 === sha256) return { snapshot: existing, created: false };
      throw labelTaken(input.label);
    }
    let kept: number | undefined;
    try {
      const snapshot = await db().transaction(async (tx) => {
        if (replaces) await deleteEndedSnapshot(tx, replaces.id);
        const row = await insertQueuedSnapshot(tx, {
          repositoryId: input.repository.id,
          label: input.label,
          source: 'archive',
          commitSha: null,
          settings: settingsOf(repositorySettings(input.repository)),
          startedBy: input.startedBy,
          archiveSha256: sha256,
        });
        await keepArchive(input.tempFile, row.id);
        kept = row.id;
        await send('snapshot.load', { snapshotId: row.id }, { transaction: tx, expireInSeconds: loadConfig().loads.leaseSeconds });
        return row;
      });
      return { snapshot, created: true };
    } catch (error) {
      if (kept !== undefined) await deleteStoredArchive(kept);
      const mapped = fromDatabaseError(error);
      throw mapped instanceof ConflictError ? labelTaken(input.label) : mapped;
    }
  } finally {
    await fs.rm(input.tempFile, { force: true });
  }
}

function labelTaken(label: string): ConflictError {
  return new ConflictError(`This repository already has a snapshot labelled ${JSON.stringify(label.slice(0, 100))} from another archive; choose another label.`, 'label');
}

/**
 * Cancels a queued or running load: the snapshot becomes 'cancelled' at once and its archive is
 * deleted; a running load stops at its next progress checkpoint, and since everything of the
 * snapshot is written in the load's last transaction, nothing of it remains. A load already in
 * that last transaction finishes first (this waits for it) and is then no longer cancellable.
 */
export async function cancelSnapshotLoad(snapshot: Snapshot): Promise<Snapshot> {
  if (!(await cancelLoad(snapshot.id))) {
    await snapshot.reload();
    throw new ConflictError(`This load has already ended (${snapshot.status}); only a queued or running load can be cancelled.`);
  }
  await deleteStoredArchive(snapshot.id);
  return snapshot.reload();
}
