/**
 * API types and schemas of /api/users: the people of an organisation, their roles, deactivation.
 */
import { z } from 'zod';
import { ROLES } from '../roles';

/**
 * Validates a role name (request bodies, query strings).
 *
 * @example
 * roleSchema.parse('lead') // 'lead'
 */
export const roleSchema = z.enum(ROLES);

/** An e-mail address as the product stores it: trimmed and lower-cased, so sign-in ignores case. */
export const emailSchema = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .max(254, 'An e-mail address has at most 254 characters.')
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }));

/** A person's display name. */
export const nameSchema = z
  .string({ error: 'Enter a name.' })
  .trim()
  .min(1, 'Enter a name.')
  .max(120, 'A name has at most 120 characters.');

/** A user as every API answer shows it (never the password hash). */
export const userSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  active: z.boolean(),
  createdAt: z.string(),
  lastSignedInAt: z.string().nullable(),
});

/** A user as the API returns it. */
export type UserDTO = z.infer<typeof userSchema>;

/** Path parameters of /api/users/:id. */
export const userParamsSchema = z.object({ id: z.uuid({ error: 'Not a user id.' }) });

/** Body of PUT /api/users/:id/role. */
export const changeRoleSchema = z.object({ role: roleSchema });

/** Body of PUT /api/users/:id/role. */
export type ChangeRoleInput = z.infer<typeof changeRoleSchema>;

/** Answer of GET /api/users. */
export interface UserListDTO {
  users: UserDTO[];
}
