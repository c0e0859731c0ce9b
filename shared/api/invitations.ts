/**
 * API types and schemas of /api/invitations: an admin invites someone by e-mail with a role; the
 * one-time link in the mail lets them set a password and join.
 */
import { z } from 'zod';
import type { Role } from '../roles';
import { passwordSchema } from './session';
import { emailSchema, nameSchema, roleSchema } from './users';

/** Body of POST /api/invitations. */
export const inviteUserSchema = z.object({
  email: emailSchema,
  name: nameSchema,
  role: roleSchema,
});

/** Body of POST /api/invitations. */
export type InviteUserInput = z.infer<typeof inviteUserSchema>;

/** Path parameters of the one-time link routes: the token is 43 base64url characters (32 bytes). */
export const invitationTokenParamsSchema = z.object({
  token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'Not an invitation token.'),
});

/** Path parameters of /api/invitations/:id. */
export const invitationParamsSchema = z.object({ id: z.uuid({ error: 'Not an invitation id.' }) });

/** Body of POST /api/invitations/token/:token/accept. */
export const acceptInvitationSchema = z.object({
  name: nameSchema,
  password: passwordSchema,
});

/** Body of POST /api/invitations/token/:token/accept. */
export type AcceptInvitationInput = z.infer<typeof acceptInvitationSchema>;

/** An invitation as admins see it (the token itself is never shown again after the mail). */
export interface InvitationDTO {
  id: string;
  email: string;
  name: string;
  role: Role;
  invitedByName: string | null;
  createdAt: string;
  expiresAt: string;
  acceptedAt: string | null;
}

/** Answer of GET /api/invitations: the pending invitations. */
export interface InvitationListDTO {
  invitations: InvitationDTO[];
}

/** What the one-time link shows before the invitee sets a password. */
export interface InvitationPreviewDTO {
  email: string;
  name: string;
  role: Role;
  organisationName: string;
}
