import type { Request } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import { HttpError } from '../errors';

/**
 * How many failed credential checks are allowed in one window, per key:
 *   - perAccount: one account from one address (someone mistyping, or guessing one account);
 *   - perAddress: every account from one address (someone trying many accounts);
 *   - perAccountEverywhere: one account from every address together (guessing spread over many
 *     addresses). It is well above perAccount so that locking an account out from elsewhere takes
 *     that many real wrong passwords, not a burst of junk requests.
 */
export interface CredentialLimits {
  perAccount: number;
  perAddress: number;
  perAccountEverywhere: number;
  windowMs: number;
}

/** One counter and the most failures it may hold in a window. */
export interface LimitKey {
  key: string;
  limit: number;
}

/** 429 with the seconds until the window that blocks the request ends (sent as Retry-After). */
export class TooManyAttemptsError extends HttpError {
  constructor(readonly retryAfterSeconds: number) {
    const minutes = Math.max(1, Math.ceil(retryAfterSeconds / 60));
    super(429, 'too_many_attempts', `Too many failed attempts: try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`);
  }
}

/** How often one process deletes rows whose window has passed. */
const PRUNE_EVERY_MS = 60_000;

/**
 * Limits failed credential checks, with the counts in PostgreSQL (table credential_failures) so
 * that every server process shares them. Only a check that ran and failed counts: requests refused
 * earlier (CSRF, validation, a Bearer header) never reach it, and a success takes its own attempt
 * back and clears the account-from-this-address counter.
 *
 * An attempt is counted before the check runs and taken back when it succeeds, so concurrent
 * guesses cannot all slip under the limit between a read and a write.
 */
export class CredentialLimiter {
  private lastPrune = 0;

  constructor(
    private readonly sequelize: Sequelize,
    readonly limits: CredentialLimits,
  ) {}

  /** The counters of a check against one account (sign-in, change password) from one address. */
  accountKeys(email: string, address: string): LimitKey[] {
    const account = email.trim().toLowerCase();
    return [
      { key: `account:${account}|address:${address}`, limit: this.limits.perAccount },
      { key: `address:${address}`, limit: this.limits.perAddress },
      { key: `account:${account}`, limit: this.limits.perAccountEverywhere },
    ];
  }

  /** The counter of a check that names no account (an invitation link) from one address. */
  addressKeys(address: string): LimitKey[] {
    return [{ key: `address:${address}`, limit: this.limits.perAddress }];
  }

  /**
   * Runs `check` under the limits: 429 (TooManyAttemptsError) without running it when a counter is
   * full; when it throws an error for which `isFailure` is true, the failure stays counted.
   *
   * @example
   * const user = await limiter.guard(limiter.accountKeys(email, req.ip), () => signIn(), (e) => e instanceof WrongCredentials);
   */
  async guard<T>(keys: LimitKey[], check: () => Promise<T>, isFailure: (error: unknown) => boolean): Promise<T> {
    await this.prune();
    const names = [...new Set(keys.map((k) => k.key))].sort();
    const counts = await this.sequelize.query<{ key: string; failures: number; secondsLeft: number }>(
      `insert into credential_failures as f (key, failures, window_started_at)
       select k, 1, now() from unnest($1::text[]) as k order by k
       on conflict (key) do update set
         failures = case when f.window_started_at <= now() - $2::int * interval '1 millisecond' then 1 else f.failures + 1 end,
         window_started_at = case when f.window_started_at <= now() - $2::int * interval '1 millisecond' then now() else f.window_started_at end
       returning key, failures, extract(epoch from f.window_started_at + $2::int * interval '1 millisecond' - now())::float8 as "secondsLeft"`,
      { bind: [names, this.limits.windowMs], type: QueryTypes.SELECT },
    );
    const limitOf = new Map(keys.map((k) => [k.key, k.limit]));
    const over = counts.filter((row) => row.failures > (limitOf.get(row.key) ?? Infinity));
    if (over.length > 0) {
      await this.release(names, []);
      throw new TooManyAttemptsError(Math.max(1, Math.ceil(Math.max(...over.map((row) => row.secondsLeft)))));
    }
    let result: T;
    try {
      result = await check();
    } catch (error) {
      if (!isFailure(error)) await this.release(names, []);
      throw error;
    }
    // Success: take this attempt back, and forget the earlier failures of this account from here.
    await this.release(names, names.filter((name) => name.includes('|')));
    return result;
  }

  private async release(names: string[], reset: string[]): Promise<void> {
    // Rows are locked in key order, the order the counting insert takes them in, so concurrent
    // attempts on the same account cannot deadlock.
    await this.sequelize.query(
      `update credential_failures f set failures = case when f.key = any($2::text[]) then 0 else greatest(f.failures - 1, 0) end
         from (select key from credential_failures where key = any($1::text[]) order by key for update) locked
        where f.key = locked.key`,
      { bind: [names, reset] },
    );
  }

  private async prune(): Promise<void> {
    const now = Date.now();
    if (now - this.lastPrune < PRUNE_EVERY_MS) return;
    this.lastPrune = now;
    await this.sequelize.query(`delete from credential_failures where window_started_at < now() - $1::int * interval '1 millisecond'`, {
      bind: [this.limits.windowMs],
    });
  }
}

/**
 * The app's limiter (createApp keeps one in `app.locals`, so tests can give an app its own limits).
 *
 * @example
 * const limiter = credentialLimiterOf(req);
 */
export function credentialLimiterOf(req: Request): CredentialLimiter {
  const limiter = req.app.locals.credentialLimiter as CredentialLimiter | undefined;
  if (!limiter) throw new Error('createApp() did not install a credential limiter');
  return limiter;
}

/**
 * The client's address for the limits: the socket's, or with TRUST_PROXY the one the trusted
 * proxies report (Express's `req.ip`).
 */
export function clientAddress(req: Request): string {
  return req.ip ?? req.socket.remoteAddress ?? 'unknown';
}
