import type { Action } from '../../shared/permissions';
import { Repository } from '../models/Repository';
import type { User } from '../models/User';
import { sameOrganisation, type PolicyRules } from './types';

/** Leads manage the tokens of their own organisation's repositories only. */
export const apiTokenRules: PolicyRules = {
  'apiTokens.manage': sameOrganisation,
};

/** What a route may let a token do (its opt-in in defineRoutes). */
export type TokenUse = 'read' | 'upload';

/**
 * The actions each kind of token use covers. A route that opts in must be guarded by one of them
 * (defineRoutes checks), and a token actor is allowed these actions and no other.
 */
export const TOKEN_USES: Readonly<Record<TokenUse, readonly Action[]>> = {
  read: ['repositories.read', 'snapshots.read', 'cloneClasses.read'],
  upload: ['snapshots.upload'],
};

/** What a request authenticated by an API token may reach: one repository of one organisation. */
export interface TokenScope {
  tokenId: number;
  repositoryId: number;
}

// The actor of a token request is a User built for the request (never saved); the scope rides
// beside it here rather than on the model, so nothing can persist or serialise it by accident.
const scopes = new WeakMap<User, TokenScope>();

/** Marks `actor` as acting for an API token limited to `scope`. */
export function scopeToToken(actor: User, scope: TokenScope): User {
  scopes.set(actor, scope);
  return actor;
}

/** The token scope of an actor, or undefined for a person signed in with a session. */
export function tokenScopeOf(actor: User): TokenScope | undefined {
  return scopes.get(actor);
}

/** The repository a record belongs to: a Repository itself, or anything with `repositoryId`. */
function repositoryOf(record: unknown): number | undefined {
  if (record instanceof Repository) return record.id;
  if (typeof record === 'object' && record !== null && 'repositoryId' in record) {
    const id = (record as { repositoryId: unknown }).repositoryId;
    return typeof id === 'number' ? id : undefined;
  }
  return undefined;
}

/**
 * Whether a token actor may perform the action (on the record): the action must be one a token
 * use covers, and the record must be the token's repository or belong to it, in its organisation.
 * Roles play no part: a token's powers are the routes that opt in, not its creator's role.
 */
export function tokenAllows(actor: User, scope: TokenScope, action: Action, record?: unknown): boolean {
  if (!Object.values(TOKEN_USES).some((actions) => actions.includes(action))) return false;
  if (record === undefined) return true;
  return sameOrganisation(actor, record) && repositoryOf(record) === scope.repositoryId;
}
