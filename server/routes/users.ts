import { changeRoleSchema, userParamsSchema, type UserListDTO } from '../../shared/api/users';
import { currentUser } from '../auth/current-user';
import { changeRole } from '../commands/changeRole';
import { deactivateUser } from '../commands/deactivateUser';
import { found } from '../errors';
import { authorize } from '../policies';
import { presentUser } from '../presenters/user';
import { findUser, listUsers } from '../queries/people';
import { defineRoutes } from './define';
import { parse } from './validate';

/** /api/users: admins list the organisation's users, change roles, deactivate. */
export const userRoutes = defineRoutes('/users', [
  {
    method: 'get',
    path: '/',
    guard: 'users.manage',
    handler: async (req, res) => {
      const actor = currentUser(req);
      const users = await listUsers(actor.organisationId);
      const answer: UserListDTO = { users: users.map(presentUser) };
      res.json(answer);
    },
  },
  {
    method: 'put',
    path: '/:id/role',
    guard: 'users.manage',
    handler: async (req, res) => {
      const { id } = parse(userParamsSchema, req.params);
      const { role } = parse(changeRoleSchema, req.body);
      const actor = currentUser(req);
      const user = found(await findUser(actor.organisationId, id), 'User');
      authorize(actor, 'users.manage', user);
      res.json(presentUser(await changeRole({ actor, user, role })));
    },
  },
  {
    method: 'post',
    path: '/:id/deactivate',
    guard: 'users.manage',
    handler: async (req, res) => {
      const { id } = parse(userParamsSchema, req.params);
      const actor = currentUser(req);
      const user = found(await findUser(actor.organisationId, id), 'User');
      authorize(actor, 'users.manage', user);
      res.json(presentUser(await deactivateUser({ actor, user })));
    },
  },
]);
