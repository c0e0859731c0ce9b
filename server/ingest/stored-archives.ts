import fs from 'node:fs/promises';
import path from 'node:path';
import { loadConfig } from '../config';

/**
 * Where uploaded archives wait for their load: `<upload dir>/incoming/` while a request streams one
 * in (multer), then `<upload dir>/snapshot-<id>.archive` from the moment its snapshot is queued
 * until the load has read it (or failed, or was cancelled). Folders are made owner-only: they hold
 * code.
 */
export function uploadDir(): string {
  return loadConfig().ingest.uploadDir;
}

/** The folder multer streams request bodies into (created on demand, mode 0700). */
export async function incomingDir(): Promise<string> {
  const dir = path.join(uploadDir(), 'incoming');
  await fs.mkdir(dir, { recursive: true, mode: 0o700 });
  return dir;
}

/** Where a queued snapshot's archive is kept until its load reads it. */
export function storedArchivePath(snapshotId: number): string {
  return path.join(uploadDir(), `snapshot-${snapshotId}.archive`);
}

/** Moves an upload's temporary file to its snapshot's place (same file system: a rename). */
export async function keepArchive(tempFile: string, snapshotId: number): Promise<void> {
  await fs.mkdir(uploadDir(), { recursive: true, mode: 0o700 });
  await fs.rename(tempFile, storedArchivePath(snapshotId));
}

/** Deletes a snapshot's kept archive, if there is one. */
export async function deleteStoredArchive(snapshotId: number): Promise<void> {
  await fs.rm(storedArchivePath(snapshotId), { force: true });
}
