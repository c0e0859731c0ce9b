import type { Transaction } from 'sequelize';
import type { CreateRepositoryInput, UpdateRepositoryInput } from '../../shared/api/repositories';
import { DEFAULT_REPOSITORY_SETTINGS } from '../../shared/constants';
import { servedThreshold } from '../clone-index/options';
import { Repository } from '../models/Repository';

/**
 * Creates a repository in an organisation. Names are unique per organisation: the database's
 * constraint decides (a check before the insert could race), and the route answers its
 * violation with 409 (see fromDatabaseError).
 */
export async function createRepository(
  organisationId: string,
  input: CreateRepositoryInput,
  transaction?: Transaction,
): Promise<Repository> {
  if (input.threshold !== undefined) servedThreshold(input.threshold);
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

/** Updates a repository's settings (the next snapshot is analyzed and matched with them). */
export async function updateRepository(repository: Repository, input: UpdateRepositoryInput, transaction?: Transaction): Promise<Repository> {
  if (input.threshold !== undefined) servedThreshold(input.threshold);
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
