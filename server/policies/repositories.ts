import { sameOrganisation, type PolicyRules } from './types';

/** Anyone reads, leads create, update (settings, budgets) and delete: within their organisation. */
export const repositoryRules: PolicyRules = {
  'repositories.read': sameOrganisation,
  'repositories.update': sameOrganisation,
  'repositories.delete': sameOrganisation,
};
