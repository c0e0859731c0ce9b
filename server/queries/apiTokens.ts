/** Reads of API tokens: the organisation's list, one token, and the token a secret names. */
import { execute, select } from '../clone-index/sql';
import { ApiToken } from '../models/ApiToken';

/** A token with the names the list shows beside it. */
export interface ApiTokenRow {
  id: number;
  organisationId: string;
  repositoryId: number;
  repositoryName: string;
  name: string;
  prefix: string;
  createdAt: Date;
  createdByName: string | null;
  expiresAt: Date | null;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
}

const ROW_COLUMNS = `t.id, t.organisation_id as "organisationId", t.repository_id as "repositoryId", r.name as "repositoryName",
  t.name, t.prefix, t.created_at as "createdAt", u.name as "createdByName", t.expires_at as "expiresAt",
  t.last_used_at as "lastUsedAt", t.revoked_at as "revokedAt"`;
const ROW_FROM = `api_tokens t join repositories r on r.id = t.repository_id left join users u on u.id = t.created_by`;

/** The organisation's tokens, newest first (revoked ones included, marked). */
export function listApiTokens(organisationId: string): Promise<ApiTokenRow[]> {
  return select<ApiTokenRow>(undefined, `select ${ROW_COLUMNS} from ${ROW_FROM} where t.organisation_id = $1 order by t.created_at desc, t.id desc`, [
    organisationId,
  ]);
}

/** One token of the organisation as the list shows it, or undefined. */
export async function findApiTokenRow(organisationId: string, id: number): Promise<ApiTokenRow | undefined> {
  const [row] = await select<ApiTokenRow>(undefined, `select ${ROW_COLUMNS} from ${ROW_FROM} where t.id = $1 and t.organisation_id = $2`, [
    id,
    organisationId,
  ]);
  return row;
}

/** A token of the organisation, or null (other organisations' tokens do not exist for it). */
export function findApiToken(organisationId: string, id: number): Promise<ApiToken | null> {
  return ApiToken.findOne({ where: { id, organisationId } });
}

/** What a usable token grants: the organisation and the one repository. */
export interface UsableApiToken {
  id: number;
  organisationId: string;
  repositoryId: number;
  name: string;
}

/**
 * The token whose secret hashes to `tokenHash`, when it is neither revoked nor expired (by the
 * database's clock), or undefined. Unknown, revoked and expired look the same to the caller.
 */
export async function findUsableApiToken(tokenHash: string): Promise<UsableApiToken | undefined> {
  const [row] = await select<UsableApiToken>(
    undefined,
    `select id, organisation_id as "organisationId", repository_id as "repositoryId", name
       from api_tokens
      where token_hash = $1 and revoked_at is null and (expires_at is null or expires_at > now())`,
    [tokenHash],
  );
  return row;
}

/**
 * Records that the token was used, at most once a minute per token: the condition keeps a busy CI
 * job from writing the row on every request.
 */
export async function touchApiToken(id: number): Promise<void> {
  await execute(
    undefined,
    `update api_tokens set last_used_at = now() where id = $1 and (last_used_at is null or last_used_at < now() - interval '1 minute')`,
    [id],
  );
}
