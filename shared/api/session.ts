/**
 * API types and schemas of /api/session: sign in, sign out, who am I, change password, and the
 * CSRF token the client sends back in the `x-csrf-token` header on every state-changing request.
 */
import { z } from 'zod';
import { emailSchema, type UserDTO } from './users';

/** The header that carries the CSRF token. */
export const CSRF_HEADER = 'x-csrf-token';

/** Shortest password accepted. */
export const PASSWORD_MIN_LENGTH = 10;

/**
 * bcrypt reads at most 72 bytes of a password (common practice: the algorithm's key schedule takes
 * 72 bytes), so longer ones would be silently cut; refuse them instead.
 */
export const PASSWORD_MAX_BYTES = 72;

/** A new password: long enough, and no longer than bcrypt can use. */
export const passwordSchema = z
  .string({ error: 'Enter a password.' })
  .min(PASSWORD_MIN_LENGTH, `A password has at least ${PASSWORD_MIN_LENGTH} characters.`)
  .refine((value) => new TextEncoder().encode(value).length <= PASSWORD_MAX_BYTES, {
    error: `A password has at most ${PASSWORD_MAX_BYTES} bytes.`,
  });

/** Body of POST /api/session (sign in). Any non-empty password is checked; rules apply to new ones. */
export const signInSchema = z.object({
  email: emailSchema,
  password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(1000),
});

/** Body of POST /api/session. */
export type SignInInput = z.infer<typeof signInSchema>;

/** Body of PUT /api/session/password. */
export const changePasswordSchema = z
  .object({
    currentPassword: z.string({ error: 'Enter your current password.' }).min(1, 'Enter your current password.'),
    newPassword: passwordSchema,
  })
  .refine((body) => body.currentPassword !== body.newPassword, {
    error: 'The new password must differ from the current one.',
    path: ['newPassword'],
  });

/** Body of PUT /api/session/password. */
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>;

/** The organisation as the session shows it. */
export interface OrganisationDTO {
  id: string;
  name: string;
}

/** Answer of GET and POST /api/session: the signed-in user (or null) and the CSRF token to send back. */
export interface SessionDTO {
  user: UserDTO | null;
  organisation: OrganisationDTO | null;
  csrfToken: string;
}
