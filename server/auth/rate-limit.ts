import { rateLimit } from 'express-rate-limit';
import { HttpError } from '../errors';

/** Failed sign-ins allowed per client address in one window. */
export const SIGN_IN_ATTEMPTS = 10;

/** Length of the sign-in rate-limit window. */
export const SIGN_IN_WINDOW_MS = 15 * 60 * 1000;

/**
 * Limits failed sign-in attempts per client address (in memory, per app). Successful sign-ins do
 * not count, so a team behind one address is not locked out by its own use. Over the limit: 429.
 */
export function signInRateLimit(options: { attempts?: number; windowMs?: number } = {}) {
  return rateLimit({
    windowMs: options.windowMs ?? SIGN_IN_WINDOW_MS,
    limit: options.attempts ?? SIGN_IN_ATTEMPTS,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) =>
      next(new HttpError(429, 'too_many_attempts', 'Too many failed sign-ins: wait a few minutes and try again.')),
  });
}
