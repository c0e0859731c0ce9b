/**
 * API types and schemas of a repository's git link (/api/repositories/:id/git): the remote its
 * releases come from, the tag pattern that says which tags are releases, and the last import.
 */
import { z } from 'zod';

/** Characters a tag pattern may not hold: controls (git refuses them in ref names anyway). */
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u001f\u007f]/;

/** Body of PUT /api/repositories/:id/git. */
export const gitLinkSchema = z
  .object({
    remoteUrl: z
      .string({ error: 'enter the git remote: https://…, ssh://…, user@host:path or a local path.' })
      .trim()
      .min(1, 'enter the git remote: https://…, ssh://…, user@host:path or a local path.')
      .max(2048, 'a remote has at most 2048 characters.'),
    tagPattern: z
      .string({ error: 'the tag pattern is text, e.g. v* or release-*.' })
      .trim()
      .min(1, 'enter a tag pattern (* for every tag).')
      .max(200, 'a tag pattern has at most 200 characters.')
      .refine((value) => !CONTROL.test(value), 'a tag pattern holds no control characters.')
      .default('*'),
  })
  .strict();

/** Body of PUT /api/repositories/:id/git. */
export type GitLinkInput = z.infer<typeof gitLinkSchema>;

/** Where the last import stands. */
export const GIT_IMPORT_STATUSES = ['queued', 'running', 'succeeded', 'failed'] as const;
/** A git import status. */
export type GitImportStatus = (typeof GIT_IMPORT_STATUSES)[number];

/** The last "Import releases" (or "Check for new tags") of a repository. */
export interface GitImportDTO {
  status: GitImportStatus;
  requestedAt: string | null;
  startedAt: string | null;
  finishedAt: string | null;
  /** tags of the remote matching the pattern (null until fetched) */
  tagCount: number | null;
  /** of those, tags with no snapshot yet, to be loaded oldest first */
  newTagCount: number | null;
  /** new tags loaded so far */
  loadedCount: number | null;
  /** the tag being loaded while running */
  currentTag: string | null;
  /** what went wrong, in words, with any credentials in it replaced by *** */
  error: string | null;
}

/** A repository's git link. */
export interface GitLinkDTO {
  repositoryId: number;
  /** the remote as stored: never with credentials (they come from the server's credential helper or ssh key) */
  remoteUrl: string;
  tagPattern: string;
  createdAt: string;
  updatedAt: string;
  lastImport: GitImportDTO | null;
}

/** GET and PUT /api/repositories/:id/git. */
export interface GitLinkAnswerDTO {
  gitLink: GitLinkDTO | null;
}

/** POST /api/repositories/:id/git/import (202). */
export interface GitImportAnswerDTO extends GitLinkAnswerDTO {
  /** false when an import was already queued or running (it picks up the tags; nothing more was queued) */
  queued: boolean;
}
