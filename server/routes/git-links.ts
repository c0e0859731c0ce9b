import { gitLinkSchema, type GitImportAnswerDTO, type GitLinkAnswerDTO } from '../../shared/api/git-links';
import { repositoryParamsSchema } from '../../shared/api/repositories';
import { currentUser } from '../auth/current-user';
import { linkGitRemote, requestGitImport, unlinkGitRemote } from '../commands/gitLinks';
import { found } from '../errors';
import { authorize } from '../policies';
import { presentGitLink } from '../presenters/gitLink';
import { findGitLink } from '../queries/gitLinks';
import { findRepository } from '../queries/repositories';
import { defineRoutes } from './define';
import { parse } from './validate';

async function answer(repositoryId: number): Promise<GitLinkAnswerDTO> {
  const link = await findGitLink(repositoryId);
  return { gitLink: link ? presentGitLink(link) : null };
}

/**
 * /api/repositories/:id/git: the repository's link to a git remote (leads set and remove it),
 * and "Import releases" / "Check for new tags", which queues a git.import job. CI may start an
 * import with an upload token after pushing a tag.
 */
export const gitLinkRoutes = defineRoutes('/repositories', [
  {
    method: 'get',
    path: '/:id/git',
    guard: 'repositories.read',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const repository = found(await findRepository(currentUser(req).organisationId, id), 'Repository');
      authorize(currentUser(req), 'repositories.read', repository);
      res.json(await answer(id));
    },
  },
  {
    method: 'put',
    path: '/:id/git',
    guard: 'repositories.update',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const input = parse(gitLinkSchema, req.body);
      const repository = found(await findRepository(currentUser(req).organisationId, id), 'Repository');
      authorize(currentUser(req), 'repositories.update', repository);
      await linkGitRemote(repository, input, currentUser(req).id);
      res.json(await answer(id));
    },
  },
  {
    method: 'delete',
    path: '/:id/git',
    guard: 'repositories.update',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const repository = found(await findRepository(currentUser(req).organisationId, id), 'Repository');
      authorize(currentUser(req), 'repositories.update', repository);
      await unlinkGitRemote(repository);
      res.status(204).end();
    },
  },
  {
    method: 'post',
    path: '/:id/git/import',
    guard: 'snapshots.upload',
    token: 'upload',
    handler: async (req, res) => {
      const { id } = parse(repositoryParamsSchema, req.params);
      const repository = found(await findRepository(currentUser(req).organisationId, id), 'Repository');
      authorize(currentUser(req), 'snapshots.upload', repository);
      const queued = await requestGitImport(repository);
      const body: GitImportAnswerDTO = { ...(await answer(id)), queued };
      res.status(202).json(body);
    },
  },
]);
