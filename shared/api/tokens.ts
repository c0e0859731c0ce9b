/**
 * API types and schemas of /api/tokens: repository-scoped API tokens for CI. The secret appears in
 * exactly one answer (the one that creates it); lists show only its prefix.
 */
import { z } from 'zod';
import { MAX_SERIAL_ID, serialIdSchema } from './ids';

/** What every secret starts with, so a leaked one is recognisable as Doublet's. */
export const API_TOKEN_PREFIX = 'dblt_';

/** A well-formed secret: the prefix and 32 random bytes as 43 base64url characters. */
export const API_TOKEN_PATTERN = /^dblt_[A-Za-z0-9_-]{43}$/;

/** Characters of the secret kept for display (the prefix and four more). */
export const API_TOKEN_DISPLAY_LENGTH = API_TOKEN_PREFIX.length + 4;

/** How far ahead an expiry may be set (ten years, in days). */
export const API_TOKEN_MAX_DAYS = 3650;

/** Body of POST /api/tokens. */
export const createApiTokenSchema = z
  .object({
    name: z
      .string({ error: 'enter a name for the token.' })
      .trim()
      .min(1, 'enter a name for the token.')
      .max(120, 'a token name has at most 120 characters.'),
    repositoryId: z
      .number({ error: 'choose a repository (a whole number id).' })
      .int('a repository id is a whole number.')
      .min(1, 'a repository id is at least 1.')
      .max(MAX_SERIAL_ID, `a repository id is at most ${MAX_SERIAL_ID}.`),
    expiresAt: z.iso
      .datetime({ offset: true, error: 'give a date and time in ISO 8601, e.g. 2027-06-30T00:00:00Z.' })
      .nullish()
      .refine((value) => value == null || Date.parse(value) > Date.now(), 'the expiry must be in the future.')
      .refine(
        (value) => value == null || Date.parse(value) <= Date.now() + API_TOKEN_MAX_DAYS * 86_400_000,
        `a token expires at most ${API_TOKEN_MAX_DAYS} days from now.`,
      ),
  })
  .strict();

/** Body of POST /api/tokens. */
export type CreateApiTokenInput = z.infer<typeof createApiTokenSchema>;

/** Path parameters of /api/tokens/:id. */
export const apiTokenParamsSchema = z.object({ id: serialIdSchema('API token') });

/** A token as lists show it: never the secret, never its hash. */
export interface ApiTokenDTO {
  id: number;
  name: string;
  repositoryId: number;
  repositoryName: string;
  /** The secret's first characters, to tell tokens apart. */
  prefix: string;
  createdAt: string;
  createdByName: string | null;
  expiresAt: string | null;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

/** Answer of POST /api/tokens: the secret, shown this once, and the stored record. */
export interface CreatedApiTokenDTO {
  token: string;
  apiToken: ApiTokenDTO;
}

/** Answer of GET /api/tokens. */
export interface ApiTokenListDTO {
  apiTokens: ApiTokenDTO[];
}

/**
 * Answer of GET /api/tokens/current: the repository the calling API token is scoped to, so a CI
 * job (`doublet push`) needs only the token, not the repository's id as well.
 */
export interface CurrentApiTokenDTO {
  id: number;
  name: string;
  repository: { id: number; name: string };
}
