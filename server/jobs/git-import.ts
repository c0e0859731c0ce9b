import { importGitReleases } from '../commands/importGitReleases';
import { defineJob } from './definition';
import { loadAnalyzerPool } from './snapshot-load';

/** Data of a `git.import` job. */
export interface GitImportJobData {
  repositoryId: number;
}

/**
 * `git.import`: fetches a linked repository's tags and loads each new one, oldest first
 * (importGitReleases). Its outcome, failure included, is recorded on the link, so an attempt
 * only fails when even that cannot be written (the database is down) or the worker dies; it is
 * then retried, and the retry loads only what is still missing. The lease covers an import of
 * MAX_TAGS_PER_IMPORT releases. Its loads share the process's analyzer pool with uploads.
 */
export const gitImportJob = defineJob<GitImportJobData>({
  queue: 'git.import',
  sendOptions: { retryLimit: 2, retryDelay: 60, retryBackoff: true, expireInSeconds: 3 * 3600, retentionHours: 48 },
  workers: 1,
  handler: async ({ repositoryId }) => {
    await importGitReleases(repositoryId, { pool: loadAnalyzerPool() });
  },
});
