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
import { revokeInvitation } from '../commands/revokeInvitation';
import { found } from '../errors';
import { authorize } from '../policies';
import { presentInvitation, presentInvitationPreview } from '../presenters/invitation';
import { presentUser } from '../presenters/user';
import { findInvitation, findOrganisation, listPendingInvitations } from '../queries/people';
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
      const invitations = await listPendingInvitations(actor.organisationId);
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
      const invitation = found(await findInvitation(actor.organisationId, id), 'Invitation');
      authorize(actor, 'users.manage', invitation);
      await revokeInvitation(invitation);
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
      const organisation = found(await findOrganisation(invitation.organisationId), 'Organisation');
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
