import { API_TOKEN_DISPLAY_LENGTH, API_TOKEN_PREFIX, type CreateApiTokenInput } from '../../shared/api/tokens';
import { hashToken, oneTimeToken } from '../auth/tokens';
import { ApiToken } from '../models/ApiToken';
import type { Repository } from '../models/Repository';
import type { User } from '../models/User';

/**
 * Creates a token for the repository and returns its secret with the stored record. The secret
 * is `dblt_` and 32 random bytes (base64url); only its SHA-256 and first characters are stored, so
 * this is the one moment anyone sees it.
 */
export async function createApiToken(input: {
  actor: User;
  repository: Repository;
  fields: CreateApiTokenInput;
}): Promise<{ secret: string; apiToken: ApiToken }> {
  const { actor, repository, fields } = input;
  const secret = `${API_TOKEN_PREFIX}${oneTimeToken()}`;
  const apiToken = await ApiToken.create({
    organisationId: repository.organisationId,
    repositoryId: repository.id,
    name: fields.name,
    tokenHash: hashToken(secret),
    prefix: secret.slice(0, API_TOKEN_DISPLAY_LENGTH),
    createdBy: actor.id,
    expiresAt: fields.expiresAt ? new Date(fields.expiresAt) : null,
  });
  return { secret, apiToken };
}

/** Revokes a token (it stops working on its next request); revoking twice keeps the first time. */
export async function revokeApiToken(apiToken: ApiToken): Promise<void> {
  if (apiToken.revokedAt) return;
  apiToken.revokedAt = new Date();
  await apiToken.save();
}
