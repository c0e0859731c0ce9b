import crypto from 'node:crypto';

/**
 * A new one-time token: 32 random bytes as 43 base64url characters (URL-safe, no padding).
 *
 * @example
 * oneTimeToken() // 'q3N…' (43 characters)
 */
export function oneTimeToken(): string {
  return crypto.randomBytes(32).toString('base64url');
}

/**
 * What is stored instead of a token: its SHA-256 in hex. Tokens carry 256 random bits, so a fast
 * hash is enough (no salt or slow hash needed: there is nothing to guess).
 *
 * @example
 * hashToken('abc').length // 64
 */
export function hashToken(token: string): string {
  return crypto.createHash('sha256').update(token).digest('hex');
}
