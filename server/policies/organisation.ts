import type { User } from '../models/User';
import type { PolicyRules } from './types';

/** Admins update their own organisation's settings. */
export const organisationRules: PolicyRules = {
  'organisation.update': (actor: User, organisation) =>
    (organisation as { id?: string } | null)?.id === actor.organisationId,
};
