import type { InvitationDTO, InvitationPreviewDTO } from '../../shared/api/invitations';
import type { Invitation } from '../models/Invitation';
import type { Organisation } from '../models/Organisation';

/** An invitation as admins see it; never the token hash. Load with the `invitedBy` association. */
export function presentInvitation(invitation: Invitation): InvitationDTO {
  return {
    id: invitation.id,
    email: invitation.email,
    name: invitation.name,
    role: invitation.role,
    invitedByName: invitation.invitedBy?.name ?? null,
    createdAt: invitation.createdAt.toISOString(),
    expiresAt: invitation.expiresAt.toISOString(),
    acceptedAt: invitation.acceptedAt ? invitation.acceptedAt.toISOString() : null,
  };
}

/** What the invitee sees on the one-time link page. */
export function presentInvitationPreview(invitation: Invitation, organisation: Organisation): InvitationPreviewDTO {
  return {
    email: invitation.email,
    name: invitation.name,
    role: invitation.role,
    organisationName: organisation.name,
  };
}
