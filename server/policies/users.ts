import { sameOrganisation, type PolicyRules } from './types';

/** Admins manage the users (and invitations) of their own organisation only. */
export const userRules: PolicyRules = {
  'users.manage': sameOrganisation,
};
