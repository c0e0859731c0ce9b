import type { AnalyzerPool } from '../../analyzers';
import type { LoadProgressDTO } from '../../shared/api/snapshots';
import { ConflictError } from '../errors';
import { IngestError } from '../ingest/errors';
import { fetchTags, listTags, readTag, redactCredentials, type GitTag } from '../ingest/git';
import { Repository } from '../models/Repository';
import { findGitLink, markImportFinished, markImportRunning, recordImportPlan, recordImportProgress, snapshotLabels } from '../queries/gitLinks';
import { deleteUnfinishedSnapshot, findSnapshotByLabel, insertFailedSnapshot, writeLoadProgress } from '../queries/snapshots';
import { repositorySettings } from './createRepository';
import { checkRemoteForImport, repositoryGitCacheDir } from './gitRemotes';
import { loadSnapshot } from './loadSnapshot';

/**
 * New tags one import loads at most; the rest wait for the next "Check for new tags" (still
 * oldest first), so one job stays within its lease.
 */
export const MAX_TAGS_PER_IMPORT = 50;

/** What an import did. */
export interface GitImportResult {
  tagCount: number;
  newTagCount: number;
  loadedCount: number;
  error: string | null;
}

/**
 * Imports a linked repository's releases: fetches the remote's tags into the repository's mirror,
 * then loads one snapshot per matching tag that has none yet, oldest first by tag date, so each
 * release is compared with the one before it. A tag whose earlier load did not finish (failed, or
 * cut off by a worker that died) is loaded again; a label already taken by an upload is left
 * alone. The import stops at the first tag that fails, so no later release is compared with the
 * wrong one; that tag's snapshot shows the reason, and the next import tries it again.
 *
 * The outcome is recorded on the link (status, counts, the error in words with credentials
 * redacted) rather than thrown: the job ends, and "Check for new tags" starts another. Safe to run
 * twice for one request (a retried job): it only loads what is still missing.
 *
 * @example await importGitReleases(repository.id); // loads release-9, release-10, release-11
 */
export async function importGitReleases(repositoryId: number, options: { maxTags?: number; pool?: AnalyzerPool } = {}): Promise<GitImportResult | null> {
  const link = await findGitLink(repositoryId);
  const repository = await Repository.findByPk(repositoryId);
  if (!link || !repository) return null;
  await markImportRunning(repositoryId);
  const result: GitImportResult = { tagCount: 0, newTagCount: 0, loadedCount: 0, error: null };
  try {
    const remote = await checkRemoteForImport(link.remoteUrl);
    const cacheDir = repositoryGitCacheDir(repositoryId);
    const mirror = await fetchTags(remote, { cacheDir });
    const tags = await listTags(mirror, link.tagPattern, { cacheDir });
    const byLabel = new Map((await snapshotLabels(repositoryId)).map((s) => [s.label, s]));
    const toLoad = tags.filter((tag) => {
      const existing = byLabel.get(tag.name);
      return !existing || (existing.source === 'git' && existing.status !== 'ready');
    });
    Object.assign(result, { tagCount: tags.length, newTagCount: toLoad.length });
    await recordImportPlan(repositoryId, tags.length, toLoad.length);
    for (const tag of toLoad.slice(0, options.maxTags ?? MAX_TAGS_PER_IMPORT)) {
      // Unlinked (or the repository deleted) meanwhile: stop quietly.
      if (!(await findGitLink(repositoryId))) return result;
      await recordImportProgress(repositoryId, tag.name, result.loadedCount);
      const unfinished = byLabel.get(tag.name);
      if (unfinished) await deleteUnfinishedSnapshot(unfinished.id);
      if (await loadTag(repository, mirror, cacheDir, tag, options.pool)) result.loadedCount += 1;
    }
  } catch (error) {
    result.error = redactCredentials(error instanceof Error ? error.message : String(error)).slice(0, 2000);
  }
  await markImportFinished(repositoryId, { loadedCount: result.loadedCount, error: result.error });
  return result;
}

/**
 * Reads one tag and loads it as a snapshot labelled with the tag's name. Returns false when an
 * upload took the label meanwhile; throws an error naming the tag when it cannot be loaded.
 */
async function loadTag(repository: Repository, mirror: string, cacheDir: string, tag: GitTag, pool?: AnalyzerPool): Promise<boolean> {
  const settings = repositorySettings(repository);
  let contents;
  try {
    contents = await readTag(mirror, tag.name, { cacheDir, ignore: repository.ignore });
  } catch (error) {
    if (!(error instanceof IngestError)) throw error;
    // Keep the reason where the snapshots are listed (the label stays taken until the next import retries it).
    const snapshot = { repositoryId: repository.id, label: tag.name, source: 'git', commitSha: tag.commit, settings: snapshotSettings(settings) };
    await insertFailedSnapshot(snapshot, error.message).catch(() => undefined);
    throw new Error(`Tag ${tag.name} could not be read: ${error.message}`);
  }
  const progress = new TagProgress(repository.id, tag.name);
  try {
    await loadSnapshot(
      { repository: settings, label: tag.name, source: 'git', commitSha: tag.commit, files: contents.files, skipped: contents.skipped },
      { pool, onProgress: progress.report },
    );
    return true;
  } catch (error) {
    if (error instanceof ConflictError) return false;
    throw new Error(`Tag ${tag.name} failed to load: ${error instanceof Error ? error.message : String(error)}`);
  } finally {
    await progress.stop();
  }
}

/** How often a tag's load writes its progress at most (a change of phase is written at once). */
const PROGRESS_INTERVAL_MS = 500;

/**
 * Writes a tag's load progress to its snapshot row (found by label once the load has inserted it),
 * so the snapshot list shows the phase and counts as for an upload. A failed write is ignored.
 */
class TagProgress {
  private snapshotId: number | undefined;
  private phase: string | undefined;
  private lastWrite = 0;
  private chain: Promise<void> = Promise.resolve();

  constructor(
    private readonly repositoryId: number,
    private readonly label: string,
  ) {}

  readonly report = (progress: LoadProgressDTO): void => {
    if (progress.phase === this.phase && Date.now() - this.lastWrite < PROGRESS_INTERVAL_MS) return;
    this.phase = progress.phase;
    this.lastWrite = Date.now();
    this.chain = this.chain.then(async () => {
      try {
        this.snapshotId ??= (await findSnapshotByLabel(this.repositoryId, this.label))?.id;
        // Rows a git import inserts run as attempt 0 (they are not queued jobs of their own).
        if (this.snapshotId !== undefined) await writeLoadProgress(this.snapshotId, 0, progress);
      } catch {
        // Progress is for show: a failed write (the database restarting) does not stop the load.
      }
    });
  };

  /** Waits for the writes in flight. */
  stop(): Promise<void> {
    return this.chain;
  }
}

function snapshotSettings(settings: ReturnType<typeof repositorySettings>) {
  return { threshold: Number(settings.threshold), minTokens: settings.minTokens, shingleSize: settings.shingleSize, ignore: settings.ignore };
}
