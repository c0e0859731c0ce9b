import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { loadConfig } from '../config';

/** The value SESSION_SECRET had by default before it was generated: public, so never accepted in production. */
const PUBLIC_DEFAULT = 'doublet-local-development-secret';

/** Shortest SESSION_SECRET accepted in production (32 characters; a generated one has 43). */
const MIN_PRODUCTION_LENGTH = 32;

/** Name of the file in the data directory that keeps a generated secret. */
export const SECRET_FILE = 'session-secret';

/**
 * The secret that signs session cookies and CSRF tokens.
 *   - SESSION_SECRET when set (in production: at least 32 characters, and not the old public default);
 *   - in production without it: an error, so `npm start` refuses to run;
 *   - otherwise a random secret generated once and kept in `<data dir>/session-secret` (mode 0600),
 *     so sessions survive a restart without anyone having to choose a secret on a laptop.
 * Several processes may start at once: the file is written under a temporary name and linked into
 * place, so each reads the same complete secret.
 *
 * @example
 * resolveSessionSecret({ configured: undefined, production: false, dataDir: '.data' }) // 'Qm9…' (43 characters)
 */
export function resolveSessionSecret(input: { configured?: string; production: boolean; dataDir: string }): string {
  const { configured, production, dataDir } = input;
  if (configured !== undefined && configured !== '') {
    if (production && (configured === PUBLIC_DEFAULT || configured.length < MIN_PRODUCTION_LENGTH)) {
      throw new Error(`SESSION_SECRET is too weak for production: use at least ${MIN_PRODUCTION_LENGTH} random characters.`);
    }
    return configured;
  }
  if (production) {
    throw new Error(
      'SESSION_SECRET is not set: with NODE_ENV=production Doublet refuses to start without it (at least 32 random characters, e.g. `openssl rand -base64 32`).',
    );
  }
  const file = path.join(dataDir, SECRET_FILE);
  const existing = readSecret(file);
  if (existing) return existing;
  fs.mkdirSync(dataDir, { recursive: true });
  const temporary = `${file}.${process.pid}.${crypto.randomBytes(4).toString('hex')}`;
  fs.writeFileSync(temporary, crypto.randomBytes(32).toString('base64url'), { mode: 0o600, flag: 'wx' });
  try {
    fs.linkSync(temporary, file);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
  } finally {
    fs.rmSync(temporary, { force: true });
  }
  const secret = readSecret(file);
  if (!secret) throw new Error(`${file} is empty: delete it and start again`);
  return secret;
}

function readSecret(file: string): string | undefined {
  try {
    return fs.readFileSync(file, 'utf8').trim() || undefined;
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return undefined;
    throw error;
  }
}

let cached: { key: string; secret: string } | undefined;

/**
 * The session secret for the current configuration (resolved once per configuration, then cached).
 *
 * @example
 * session({ secret: sessionSecret(), … })
 */
export function sessionSecret(): string {
  const config = loadConfig();
  const key = `${config.sessionSecret ?? ''}\0${config.production}\0${config.dataDir}`;
  if (cached?.key !== key) {
    cached = { key, secret: resolveSessionSecret({ configured: config.sessionSecret, production: config.production, dataDir: config.dataDir }) };
  }
  return cached.secret;
}
