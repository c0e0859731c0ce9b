/**
 * The four roles of a Doublet organisation, from most to least powerful. Each role may do
 * everything the roles after it may do (see shared/permissions.ts for the actions).
 * Plain data, no zod: the request schema of a role is shared/api/users.ts's roleSchema.
 */

/** Every role, most powerful first. The order is the hierarchy. */
export const ROLES = ['admin', 'lead', 'engineer', 'viewer'] as const;

/** One of the four roles. */
export type Role = (typeof ROLES)[number];

/** Human labels for the UI. */
export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  lead: 'Lead',
  engineer: 'Engineer',
  viewer: 'Viewer',
};

/**
 * How many roles sit below this one: admin 3 … viewer 0.
 *
 * @example
 * roleRank('lead') > roleRank('engineer') // true
 */
export function roleRank(role: Role): number {
  return ROLES.length - 1 - ROLES.indexOf(role);
}
