import type { ApiTokenDTO } from '../../shared/api/tokens';
import type { ApiTokenRow } from '../queries/apiTokens';

/** A token as the API shows it: an explicit field list, so neither the secret's hash nor any later column leaks. */
export function presentApiToken(row: ApiTokenRow): ApiTokenDTO {
  const iso = (date: Date | null) => (date ? new Date(date).toISOString() : null);
  return {
    id: row.id,
    name: row.name,
    repositoryId: row.repositoryId,
    repositoryName: row.repositoryName,
    prefix: row.prefix,
    createdAt: new Date(row.createdAt).toISOString(),
    createdByName: row.createdByName,
    expiresAt: iso(row.expiresAt),
    lastUsedAt: iso(row.lastUsedAt),
    revokedAt: iso(row.revokedAt),
  };
}
