import type { User } from '../models/User';
import { sameOrganisation, type PolicyRules } from './types';

/** The fields a task record needs for its rules. */
export interface TaskRecord {
  organisationId: string;
  assigneeId: string | null;
}

/**
 * Leads create and assign refactor tasks and may work on any of them; an engineer works only on
 * the tasks assigned to them; engineers and up comment.
 */
export const taskRules: PolicyRules = {
  'tasks.read': sameOrganisation,
  'tasks.assign': sameOrganisation,
  'tasks.comment': sameOrganisation,
  'tasks.work': (actor: User, task) =>
    sameOrganisation(actor, task) &&
    (actor.role !== 'engineer' || (task as TaskRecord).assigneeId === actor.id),
};
