import { idParamsSchema } from '../../shared/api/snapshots';
import { currentUser } from '../auth/current-user';
import { found } from '../errors';
import { authorize } from '../policies';
import { presentCrossClassDetail } from '../presenters/clone-classes';
import { crossClassMembers, findCrossClass } from '../queries/cross-classes';
import { defineRoutes } from './define';
import { parse } from './validate';

/**
 * /api/cross-classes: one class that spans repositories, with its members' code. Not open to API
 * tokens: a token reads one repository, and such a class shows code of several.
 */
export const crossClassRoutes = defineRoutes('/cross-classes', [
  {
    method: 'get',
    path: '/:id',
    guard: 'cloneClasses.read',
    handler: async (req, res) => {
      const { id } = parse(idParamsSchema, req.params);
      const actor = currentUser(req);
      const row = found(await findCrossClass(actor.organisationId, id), 'Clone class');
      authorize(actor, 'cloneClasses.read', { organisationId: actor.organisationId });
      const { members, pairs } = await crossClassMembers(id);
      res.json(presentCrossClassDetail(row, members, pairs));
    },
  },
]);
