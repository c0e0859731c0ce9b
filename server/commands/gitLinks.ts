import type { GitLinkInput } from '../../shared/api/git-links';
import { execute } from '../clone-index/sql';
import { db } from '../db/connection';
import { ConflictError } from '../errors';
import { send, waitingJobs } from '../jobs';
import type { GitLink } from '../models/GitLink';
import type { Repository } from '../models/Repository';
import { deleteGitLink, findGitLink, markImportQueued, saveGitLink } from '../queries/gitLinks';
import { checkRemote, deleteGitMirror } from './gitRemotes';

/**
 * Links a repository to a remote (or changes its link). The URL is stored as given, since it
 * carries no credentials; a changed remote drops the old mirror.
 *
 * @example await linkGitRemote(repository, { remoteUrl: '/srv/git/freight-platform.git', tagPattern: 'v*' }, actor.id);
 */
export async function linkGitRemote(repository: Repository, { remoteUrl, tagPattern }: GitLinkInput, actorId: string | null): Promise<GitLink> {
  checkRemote(remoteUrl);
  const previous = await findGitLink(repository.id);
  const link = await saveGitLink({ repositoryId: repository.id, remoteUrl, tagPattern, createdBy: previous?.createdBy ?? actorId });
  if (previous && previous.remoteUrl !== remoteUrl) await deleteGitMirror(repository.id);
  return link;
}

/** Removes a repository's link and its mirror; its snapshots stay. */
export async function unlinkGitRemote(repository: Repository): Promise<void> {
  await deleteGitLink(repository.id);
  await deleteGitMirror(repository.id);
}

/** Key of the advisory lock that makes two import requests for one repository queue one job. */
const IMPORT_REQUEST_LOCK = 0x67697469;

/**
 * Queues a `git.import` job for the repository ("Import releases", "Check for new tags"), unless
 * one is already waiting or running (then nothing is queued: that one picks up the tags). The
 * link's status turns `queued` in the same transaction that stores the job.
 *
 * @returns whether a job was queued
 * @throws ConflictError when the repository has no git link
 */
export async function requestGitImport(repository: Repository): Promise<boolean> {
  return db().transaction(async (transaction) => {
    await execute(transaction, 'select pg_advisory_xact_lock($1, $2)', [IMPORT_REQUEST_LOCK, repository.id]);
    const link = await findGitLink(repository.id, transaction);
    if (!link) throw new ConflictError('This repository has no git link yet: link it to a remote first (PUT /api/repositories/:id/git).');
    if ((await waitingJobs('git.import', { repositoryId: repository.id })) > 0) return false;
    await markImportQueued(repository.id, transaction);
    await send('git.import', { repositoryId: repository.id }, { transaction });
    return true;
  });
}
