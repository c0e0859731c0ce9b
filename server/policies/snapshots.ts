import { can } from '../../shared/permissions';
import type { User } from '../models/User';
import { sameOrganisation, type PolicyRules } from './types';

/** A load as the cancel rule sees it: its repository's organisation and who started it. */
export interface LoadRecord {
  organisationId: string;
  repositoryId: number;
  startedBy: string | null;
}

/** Leads (and above) cancel any load of their organisation; anyone else only the loads they started. */
function leadOrStarter(actor: User, record: unknown): boolean {
  if (!sameOrganisation(actor, record)) return false;
  return can(actor.role, 'repositories.update') || (record as Partial<LoadRecord>).startedBy === actor.id;
}

/** Anyone reads snapshots, engineers upload them, to repositories of their organisation. */
export const snapshotRules: PolicyRules = {
  'snapshots.read': sameOrganisation,
  'snapshots.upload': sameOrganisation,
  'snapshots.cancel': leadOrStarter,
};
