/**
 * Who may do what: the action list and the role → action matrix as plain data. The server's
 * policies (server/policies/) enforce it and add record rules (an engineer works only on tasks
 * assigned to them); the client reads the same table to hide what a role may not use. There is no
 * second copy of this table anywhere.
 */
import { ROLES, roleRank, type Role } from './roles';

/** Every action a route can be guarded by, including those of features still to come. */
export const ACTIONS = [
  'users.manage',
  'organisation.update',
  'repositories.read',
  'repositories.create',
  'repositories.update',
  'repositories.delete',
  'snapshots.read',
  'snapshots.upload',
  'snapshots.cancel',
  'cloneClasses.read',
  'cloneClasses.waive',
  'tasks.read',
  'tasks.create',
  'tasks.assign',
  'tasks.work',
  'tasks.comment',
  'findCopies.use',
  'apiTokens.manage',
  'outbox.read',
] as const;

/** One guarded action. */
export type Action = (typeof ACTIONS)[number];

/**
 * The least powerful role allowed each action. Roles are a hierarchy (admin ⊃ lead ⊃ engineer ⊃
 * viewer), so one role a line is the whole matrix. Budgets and repository settings are
 * `repositories.update`.
 */
export const MINIMUM_ROLE: Readonly<Record<Action, Role>> = {
  'users.manage': 'admin',
  'organisation.update': 'admin',
  'repositories.read': 'viewer',
  'repositories.create': 'lead',
  'repositories.update': 'lead',
  'repositories.delete': 'lead',
  'snapshots.read': 'viewer',
  'snapshots.upload': 'engineer',
  // Leads, or the engineer who started the load: a record rule in server/policies/snapshots.ts.
  'snapshots.cancel': 'engineer',
  'cloneClasses.read': 'viewer',
  'cloneClasses.waive': 'lead',
  'tasks.read': 'viewer',
  'tasks.create': 'lead',
  'tasks.assign': 'lead',
  // Engineers only on the tasks assigned to them: a record rule in server/policies/tasks.ts.
  'tasks.work': 'engineer',
  'tasks.comment': 'engineer',
  'findCopies.use': 'engineer',
  'apiTokens.manage': 'lead',
  'outbox.read': 'admin',
};

/**
 * Whether a role may perform an action at all (record rules aside).
 *
 * @example
 * can('viewer', 'repositories.read') // true
 * can('engineer', 'cloneClasses.waive') // false
 */
export function can(role: Role, action: Action): boolean {
  return roleRank(role) >= roleRank(MINIMUM_ROLE[action]);
}

/**
 * The actions a role may perform, in ACTIONS order.
 *
 * @example
 * actionsOf('viewer').includes('users.manage') // false
 */
export function actionsOf(role: Role): Action[] {
  return ACTIONS.filter((action) => can(role, action));
}

/**
 * The roles allowed an action, most powerful first.
 *
 * @example
 * rolesAllowed('users.manage') // ['admin']
 */
export function rolesAllowed(action: Action): Role[] {
  return ROLES.filter((role) => can(role, action));
}
