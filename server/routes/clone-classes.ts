import { idParamsSchema } from '../../shared/api/snapshots';
import { currentUser } from '../auth/current-user';
import { found } from '../errors';
import { authorize } from '../policies';
import { presentCloneClassDetail } from '../presenters/snapshot';
import { classMembers, findClass } from '../queries/classes';
import { defineRoutes } from './define';
import { parse } from './validate';

/** /api/clone-classes: one class with its members' code, for the side-by-side view. */
export const cloneClassRoutes = defineRoutes('/clone-classes', [
  {
    method: 'get',
    path: '/:id',
    guard: 'cloneClasses.read',
    token: 'read',
    handler: async (req, res) => {
      const { id } = parse(idParamsSchema, req.params);
      const row = found(await findClass(currentUser(req).organisationId, id), 'Clone class');
      authorize(currentUser(req), 'cloneClasses.read', row);
      const { members, pairs } = await classMembers(id, row.threshold);
      res.json(presentCloneClassDetail(row, members, pairs));
    },
  },
]);
