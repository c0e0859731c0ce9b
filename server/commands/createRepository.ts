import type { Transaction } from 'sequelize';
import { DEFAULT_REPOSITORY_SETTINGS, INDEX_MIN_THRESHOLD } from '../../shared/constants';
import { ConflictError, ValidationError } from '../errors';
import { parseThreshold, thresholdValue } from '../matching/threshold';
import { Repository } from '../models/Repository';

/** Settings a repository may be created or updated with; every field optional. */
export interface RepositoryInput {
  name?: string;
  description?: string;
  threshold?: number;
  minTokens?: number;
  shingleSize?: number;
  ignore?: string[];
  cloneBudget?: number | null;
}

/**
 * Checks settings the database cannot check itself: the threshold must be at or above the lowest
 * threshold the prefix index serves, or matches below it would be missed.
 */
export function checkRepositorySettings(input: RepositoryInput): void {
  if (input.threshold !== undefined) {
    const value = thresholdValue(parseThreshold(input.threshold));
    if (value < INDEX_MIN_THRESHOLD) {
      throw new ValidationError(`threshold must be at least ${INDEX_MIN_THRESHOLD} (the index is built for it), got ${input.threshold}`, 'threshold');
    }
  }
}

/** Creates a repository in an organisation; names are unique per organisation. */
export async function createRepository(
  organisationId: string,
  input: RepositoryInput & { name: string },
  transaction?: Transaction,
): Promise<Repository> {
  checkRepositorySettings(input);
  const taken = await Repository.findOne({ where: { organisationId, name: input.name }, transaction });
  if (taken) throw new ConflictError(`A repository named "${input.name}" already exists.`, 'name');
  return Repository.create(
    {
      organisationId,
      name: input.name,
      description: input.description ?? '',
      threshold: String(input.threshold ?? DEFAULT_REPOSITORY_SETTINGS.threshold),
      minTokens: input.minTokens ?? DEFAULT_REPOSITORY_SETTINGS.minTokens,
      shingleSize: input.shingleSize ?? DEFAULT_REPOSITORY_SETTINGS.shingleSize,
      ignore: input.ignore ?? [],
      cloneBudget: input.cloneBudget === undefined || input.cloneBudget === null ? null : String(input.cloneBudget),
    },
    { transaction },
  );
}

/** Updates a repository's settings (the next snapshot is analysed and matched with them). */
export async function updateRepository(repository: Repository, input: RepositoryInput, transaction?: Transaction): Promise<Repository> {
  checkRepositorySettings(input);
  if (input.name !== undefined && input.name !== repository.name) {
    const taken = await Repository.findOne({ where: { organisationId: repository.organisationId, name: input.name }, transaction });
    if (taken) throw new ConflictError(`A repository named "${input.name}" already exists.`, 'name');
  }
  const { threshold, cloneBudget, ...rest } = input;
  repository.set({
    ...rest,
    ...(threshold === undefined ? {} : { threshold: String(threshold) }),
    ...(cloneBudget === undefined ? {} : { cloneBudget: cloneBudget === null ? null : String(cloneBudget) }),
  });
  return repository.save({ transaction });
}

/** The settings of a repository as the clone index uses them. */
export function repositorySettings(repository: Repository) {
  return {
    id: repository.id,
    threshold: repository.threshold,
    minTokens: repository.minTokens,
    shingleSize: repository.shingleSize,
    ignore: repository.ignore,
  };
}
