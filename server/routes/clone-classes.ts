import { organisationClassQuerySchema, type OrganisationClassPageDTO } from '../../shared/api/clone-classes';
import { idParamsSchema, waiveClassSchema, type WaiverCreatedDTO } from '../../shared/api/snapshots';
import { currentUser } from '../auth/current-user';
import { liftLineageWaiver, waiveLineage } from '../commands/waivers';
import { found } from '../errors';
import { authorize } from '../policies';
import { presentOrganisationClass } from '../presenters/clone-classes';
import { presentCloneClassDetail, presentWaiver } from '../presenters/snapshot';
import { classMembers, findClass } from '../queries/classes';
import { listOrganisationClasses, organisationClassChoices } from '../queries/organisation-classes';
import { defineRoutes } from './define';
import { parse } from './validate';

/**
 * /api/clone-classes: the organisation's classes (latest snapshots, within and across repositories),
 * one class with its members' code, for the side-by-side view; a lead's waiver of its lineage.
 */
export const cloneClassRoutes = defineRoutes('/clone-classes', [
  {
    method: 'get',
    path: '/',
    guard: 'cloneClasses.read',
    handler: async (req, res) => {
      const query = parse(organisationClassQuerySchema, req.query);
      const actor = currentUser(req);
      authorize(actor, 'cloneClasses.read', { organisationId: actor.organisationId });
      const { rows, total, waivedCount } = await listOrganisationClasses(actor.organisationId, query);
      const answer: OrganisationClassPageDTO = {
        classes: rows.map(presentOrganisationClass),
        total,
        waivedCount,
        page: query.page,
        pageSize: query.pageSize,
        ...(await organisationClassChoices(actor.organisationId)),
      };
      res.json(answer);
    },
  },
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
  {
    method: 'post',
    path: '/:id/waiver',
    guard: 'cloneClasses.waive',
    handler: async (req, res) => {
      const { id } = parse(idParamsSchema, req.params);
      const input = parse(waiveClassSchema, req.body);
      const row = found(await findClass(currentUser(req).organisationId, id), 'Clone class');
      authorize(currentUser(req), 'cloneClasses.waive', row);
      const waiver = await waiveLineage(row, { reason: input.reason, untilLabel: input.untilLabel ?? null, createdBy: currentUser(req).id });
      const answer: WaiverCreatedDTO = { waiver: presentWaiver(waiver) };
      res.status(201).json(answer);
    },
  },
  {
    method: 'delete',
    path: '/:id/waiver',
    guard: 'cloneClasses.waive',
    handler: async (req, res) => {
      const { id } = parse(idParamsSchema, req.params);
      const row = found(await findClass(currentUser(req).organisationId, id), 'Clone class');
      authorize(currentUser(req), 'cloneClasses.waive', row);
      await liftLineageWaiver(row);
      res.status(204).end();
    },
  },
]);
