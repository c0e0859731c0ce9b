import { can, type Action } from '../../shared/permissions';
import { AuthenticationError, AuthorizationError } from '../errors';
import type { User } from '../models/User';
import { apiTokenRules, tokenAllows, tokenScopeOf } from './api-tokens';
import { cloneClassRules } from './clone-classes';
import { organisationRules } from './organisation';
import { repositoryRules } from './repositories';
import { snapshotRules } from './snapshots';
import { taskRules } from './tasks';
import type { PolicyRules, RecordRule } from './types';
import { userRules } from './users';

export type { PolicyRules, RecordRule } from './types';
export { sameOrganisation } from './types';

/** Every record rule, by action. Add a resource's rules here when you add its file. */
const RULES: PolicyRules = {
  ...userRules,
  ...organisationRules,
  ...repositoryRules,
  ...snapshotRules,
  ...cloneClassRules,
  ...taskRules,
  ...apiTokenRules,
};

/**
 * Whether the user may perform the action, on the record when one is given. The role must be
 * allowed by the matrix in shared/permissions.ts; with a record, the action's record rule (if any)
 * must hold too. Without a record only the role is checked (what route guards do before a handler
 * loads the record). An API token's actor is judged by its scope instead (server/policies/api-tokens.ts):
 * only the actions token uses cover, only on its own repository.
 *
 * @example
 * allows(engineer, 'tasks.work', { organisationId, assigneeId: engineer.id }) // true
 */
export function allows(user: User, action: Action, record?: unknown): boolean {
  if (!user.isActive) return false;
  const scope = tokenScopeOf(user);
  if (scope) return tokenAllows(user, scope, action, record);
  if (!can(user.role, action)) return false;
  if (record === undefined) return true;
  const rule: RecordRule | undefined = RULES[action];
  return rule ? rule(user, record) : true;
}

/**
 * Throws AuthorizationError (403) unless `allows(user, action, record)`; 401 without a user.
 * Handlers call it with the loaded record after the route guard has checked the role.
 *
 * @example
 * authorize(actor, 'users.manage', target);
 */
export function authorize(user: User | null | undefined, action: Action, record?: unknown): void {
  if (!user) throw new AuthenticationError();
  if (!allows(user, action, record)) throw new AuthorizationError();
}
