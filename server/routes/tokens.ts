import { apiTokenParamsSchema, createApiTokenSchema, type ApiTokenListDTO, type CreatedApiTokenDTO, type CurrentApiTokenDTO } from '../../shared/api/tokens';
import { currentUser } from '../auth/current-user';
import { createApiToken, revokeApiToken } from '../commands/apiTokens';
import { found, HttpError } from '../errors';
import { authorize } from '../policies';
import { tokenScopeOf } from '../policies/api-tokens';
import { presentApiToken } from '../presenters/apiToken';
import { findApiToken, findApiTokenRow, listApiTokens } from '../queries/apiTokens';
import { findRepository } from '../queries/repositories';
import { defineRoutes } from './define';
import { parse } from './validate';

/**
 * /api/tokens: leads create, list and revoke their organisation's repository-scoped API tokens;
 * a token asks which repository it belongs to.
 */
export const apiTokenRoutes = defineRoutes('/tokens', [
  {
    method: 'get',
    path: '/current',
    guard: 'repositories.read',
    token: 'read',
    handler: async (req, res) => {
      const actor = currentUser(req);
      const scope = tokenScopeOf(actor);
      // A person signed in with a session has no current token: nothing to name.
      if (!scope) throw new HttpError(404, 'not_found', 'This request was not made with an API token: GET /api/tokens/current answers Bearer requests only.');
      const repository = found(await findRepository(actor.organisationId, scope.repositoryId), 'Repository');
      authorize(actor, 'repositories.read', repository);
      const row = found(await findApiTokenRow(actor.organisationId, scope.tokenId), 'API token');
      const answer: CurrentApiTokenDTO = { id: row.id, name: row.name, repository: { id: repository.id, name: repository.name } };
      res.json(answer);
    },
  },
  {
    method: 'get',
    path: '/',
    guard: 'apiTokens.manage',
    handler: async (req, res) => {
      const actor = currentUser(req);
      const answer: ApiTokenListDTO = { apiTokens: (await listApiTokens(actor.organisationId)).map(presentApiToken) };
      res.json(answer);
    },
  },
  {
    method: 'post',
    path: '/',
    guard: 'apiTokens.manage',
    handler: async (req, res) => {
      const fields = parse(createApiTokenSchema, req.body);
      const actor = currentUser(req);
      const repository = found(await findRepository(actor.organisationId, fields.repositoryId), 'Repository');
      authorize(actor, 'apiTokens.manage', repository);
      const { secret, apiToken } = await createApiToken({ actor, repository, fields });
      const row = found(await findApiTokenRow(actor.organisationId, apiToken.id), 'API token');
      const answer: CreatedApiTokenDTO = { token: secret, apiToken: presentApiToken(row) };
      res.status(201).json(answer);
    },
  },
  {
    method: 'delete',
    path: '/:id',
    guard: 'apiTokens.manage',
    handler: async (req, res) => {
      const { id } = parse(apiTokenParamsSchema, req.params);
      const actor = currentUser(req);
      const apiToken = found(await findApiToken(actor.organisationId, id), 'API token');
      authorize(actor, 'apiTokens.manage', apiToken);
      await revokeApiToken(apiToken);
      res.status(204).end();
    },
  },
]);
