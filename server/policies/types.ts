import type { Action } from '../../shared/permissions';
import type { User } from '../models/User';

/**
 * A record rule: given the actor (whose role the matrix already allows the action) and the record,
 * may they act on it? Rules are short and declarative; one file per resource.
 */
export type RecordRule = (actor: User, record: unknown) => boolean;

/** The record rules of one resource, by action. Actions with no rule need only the role. */
export type PolicyRules = Partial<Record<Action, RecordRule>>;

/** Anything owned by an organisation. */
export interface OrganisationOwned {
  organisationId: string;
}

/** True when the record belongs to the actor's organisation: the rule under every other rule. */
export function sameOrganisation(actor: User, record: unknown): boolean {
  return (
    typeof record === 'object' &&
    record !== null &&
    (record as Partial<OrganisationOwned>).organisationId === actor.organisationId
  );
}
