import { sameOrganisation, type PolicyRules } from './types';

/** Anyone reads snapshots, engineers upload them, to repositories of their organisation. */
export const snapshotRules: PolicyRules = {
  'snapshots.read': sameOrganisation,
  'snapshots.upload': sameOrganisation,
};
