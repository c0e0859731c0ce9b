import { changeRoleSchema, userParamsSchema, type UserListDTO } from '../../shared/api/users';
import { currentUser } from '../auth/current-user';
import { changeRole } from '../commands/changeRole';
import { deactivateUser } from '../commands/deactivateUser';
import { NotFoundError } from '../errors';
import { User } from '../models/User';
import { authorize } from '../policies';
import { presentUser } from '../presenters/user';
import { defineRoutes } from './define';
import { parse } from './validate';

/** A user of the actor's organisation by id, or 404 (other organisations' users do not exist for them). */
async function loadUser(actor: User, id: string): Promise<User> {
  const user = await User.findOne({ where: { id, organisationId: actor.organisationId } });
  if (!user) throw new NotFoundError('User');
  return user;
}

/** /api/users: admins list the organisation's users, change roles, deactivate. */
export const userRoutes = defineRoutes('/users', [
  {
    method: 'get',
    path: '/',
    guard: 'users.manage',
    handler: async (req, res) => {
      const actor = currentUser(req);
      const users = await User.findAll({
        where: { organisationId: actor.organisationId },
        order: [['name', 'ASC'], ['email', 'ASC']],
      });
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
      const user = await loadUser(actor, id);
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
      const user = await loadUser(actor, id);
      authorize(actor, 'users.manage', user);
      res.json(presentUser(await deactivateUser({ actor, user })));
    },
  },
]);
