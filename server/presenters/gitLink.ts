import type { GitLinkDTO } from '../../shared/api/git-links';
import type { GitLink } from '../models/GitLink';

const iso = (date: Date | null) => (date ? new Date(date).toISOString() : null);

/** A git link as the API shows it: an explicit field list. */
export function presentGitLink(link: GitLink): GitLinkDTO {
  return {
    repositoryId: link.repositoryId,
    remoteUrl: link.remoteUrl,
    tagPattern: link.tagPattern,
    createdAt: new Date(link.createdAt).toISOString(),
    updatedAt: new Date(link.updatedAt).toISOString(),
    lastImport: link.importStatus
      ? {
          status: link.importStatus,
          requestedAt: iso(link.importRequestedAt),
          startedAt: iso(link.importStartedAt),
          finishedAt: iso(link.importFinishedAt),
          tagCount: link.importTagCount,
          newTagCount: link.importNewTagCount,
          loadedCount: link.importLoadedCount,
          currentTag: link.importCurrentTag,
          error: link.importError,
        }
      : null,
  };
}
