import { sameOrganisation, type PolicyRules } from './types';

/** Anyone reads clone classes; leads waive them, within their organisation. */
export const cloneClassRules: PolicyRules = {
  'cloneClasses.read': sameOrganisation,
  'cloneClasses.waive': sameOrganisation,
};
