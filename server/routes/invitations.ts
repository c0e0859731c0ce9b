import { Op } from 'sequelize';
import {
  acceptInvitationSchema,
  invitationParamsSchema,
  invitationTokenParamsSchema,
  inviteUserSchema,
  type InvitationListDTO,
} from '../../shared/api/invitations';
import type { Request } from 'express';
import { clientAddress, credentialLimiterOf } from '../auth/credential-limit';
import { currentUser } from '../auth/current-user';
import { acceptInvitation, findUsableInvitation, UnusableInvitationError } from '../commands/acceptInvitation';
import { inviteUser } from '../commands/inviteUser';
import { NotFoundError } from '../errors';
import { Invitation } from '../models/Invitation';
import { Organisation } from '../models/Organisation';
import { authorize } from '../policies';
import { presentInvitation, presentInvitationPreview } from '../presenters/invitation';
import { presentUser } from '../presenters/user';
import { defineRoutes } from './define';
import { parse } from './validate';

/** Runs a look-up of a one-time link under the sign-in limits: an unusable link counts as a failed check. */
function limitedLinkCheck<T>(req: Request, check: () => Promise<T>): Promise<T> {
  const limiter = credentialLimiterOf(req);
  return limiter.guard(limiter.addressKeys(clientAddress(req)), check, (error) => error instanceof UnusableInvitationError);
}

/**
 * /api/invitations: admins invite people and see or revoke pending invitations; the one-time
 * link routes under /token/:token are public (the token is the credential).
 */
export const invitationRoutes = defineRoutes('/invitations', [
  {
    method: 'get',
    path: '/',
    guard: 'users.manage',
    handler: async (req, res) => {
      const actor = currentUser(req);
      const invitations = await Invitation.findAll({
        where: { organisationId: actor.organisationId, acceptedAt: null, expiresAt: { [Op.gt]: new Date() } },
        include: [{ association: 'invitedBy' }],
        order: [['createdAt', 'DESC']],
      });
      const answer: InvitationListDTO = { invitations: invitations.map(presentInvitation) };
      res.json(answer);
    },
  },
  {
    method: 'post',
    path: '/',
    guard: 'users.manage',
    handler: async (req, res) => {
      const invitee = parse(inviteUserSchema, req.body);
      const actor = currentUser(req);
      const invitation = await inviteUser({ actor, invitee });
      invitation.invitedBy = actor;
      res.status(201).json(presentInvitation(invitation));
    },
  },
  {
    method: 'delete',
    path: '/:id',
    guard: 'users.manage',
    handler: async (req, res) => {
      const { id } = parse(invitationParamsSchema, req.params);
      const actor = currentUser(req);
      const invitation = await Invitation.findOne({ where: { id, organisationId: actor.organisationId } });
      if (!invitation) throw new NotFoundError('Invitation');
      authorize(actor, 'users.manage', invitation);
      // Revoking is expiring now: the link stops working and the row stays as a record.
      if (invitation.isUsable()) await invitation.update({ expiresAt: new Date() });
      res.status(204).end();
    },
  },
  {
    method: 'get',
    path: '/token/:token',
    guard: 'public',
    handler: async (req, res) => {
      const { token } = parse(invitationTokenParamsSchema, req.params);
      const invitation = await limitedLinkCheck(req, () => findUsableInvitation(token));
      const organisation = await Organisation.findByPk(invitation.organisationId, { rejectOnEmpty: true });
      res.json(presentInvitationPreview(invitation, organisation));
    },
  },
  {
    method: 'post',
    path: '/token/:token/accept',
    guard: 'public',
    handler: async (req, res) => {
      const { token } = parse(invitationTokenParamsSchema, req.params);
      const body = parse(acceptInvitationSchema, req.body);
      const user = await limitedLinkCheck(req, () => acceptInvitation({ token, ...body }));
      res.status(201).json(presentUser(user));
    },
  },
]);
