import crypto from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { CredentialLimiter, TooManyAttemptsError } from '../../../server/auth/credential-limit';
import { db } from '../../../server/db/connection';
import { useDatabase } from '../../support';

useDatabase();

class Wrong extends Error {}

const LIMITS = { perAccount: 5, perAddress: 1000, perAccountEverywhere: 1000, windowMs: 60_000 };

function unique(label: string): string {
  return `${label}-${crypto.randomBytes(5).toString('hex')}@test.example`;
}

async function outcome(limiter: CredentialLimiter, email: string, address: string, ok: boolean): Promise<'ok' | 'wrong' | 'limited'> {
  try {
    await limiter.guard(
      limiter.accountKeys(email, address),
      async () => {
        if (!ok) throw new Wrong();
      },
      (error) => error instanceof Wrong,
    );
    return 'ok';
  } catch (error) {
    if (error instanceof Wrong) return 'wrong';
    if (error instanceof TooManyAttemptsError) return 'limited';
    throw error;
  }
}

describe('CredentialLimiter', () => {
  it('lets at most the limit of concurrent wrong attempts through (an attempt is counted before its check)', async () => {
    const limiter = new CredentialLimiter(db(), LIMITS);
    const email = unique('burst');
    const results = await Promise.all(Array.from({ length: 20 }, () => outcome(limiter, email, '2001:db8::1', false)));
    expect(results.filter((r) => r === 'wrong').length).toBe(5);
    expect(results.filter((r) => r === 'limited').length).toBe(15);
  });

  it('does not count refused attempts or errors that are not failed checks', async () => {
    const limiter = new CredentialLimiter(db(), LIMITS);
    const email = unique('refused');
    for (let i = 0; i < 5; i += 1) expect(await outcome(limiter, email, '2001:db8::2', false)).toBe('wrong');
    for (let i = 0; i < 10; i += 1) expect(await outcome(limiter, email, '2001:db8::2', true)).toBe('limited');
    const [rows] = await db().query(`select failures from credential_failures where key = $1`, { bind: [`account:${email}`] });
    expect((rows as { failures: number }[])[0].failures).toBe(5);
    // Another error (say the database failing) takes its attempt back.
    const other = unique('other');
    await expect(limiter.guard(limiter.accountKeys(other, '2001:db8::3'), async () => Promise.reject(new Error('down')), (e) => e instanceof Wrong)).rejects.toThrow('down');
    const [after] = await db().query(`select failures from credential_failures where key = $1`, { bind: [`account:${other}`] });
    expect((after as { failures: number }[])[0].failures).toBe(0);
  });

  it('clears the account-from-this-address counter on success, and starts a new window once the old one has passed', async () => {
    const limiter = new CredentialLimiter(db(), { ...LIMITS, windowMs: 300 });
    const email = unique('window');
    for (let i = 0; i < 4; i += 1) await outcome(limiter, email, '2001:db8::4', false);
    expect(await outcome(limiter, email, '2001:db8::4', true)).toBe('ok');
    for (let i = 0; i < 5; i += 1) expect(await outcome(limiter, email, '2001:db8::4', false)).toBe('wrong');
    expect(await outcome(limiter, email, '2001:db8::4', true)).toBe('limited');
    await new Promise((resolve) => setTimeout(resolve, 350));
    expect(await outcome(limiter, email, '2001:db8::4', true)).toBe('ok');
  });

  it('edge cases: e-mail case does not make a new account, and Retry-After is within the window', async () => {
    const limiter = new CredentialLimiter(db(), LIMITS);
    const email = unique('Case');
    for (let i = 0; i < 5; i += 1) await outcome(limiter, i % 2 ? email.toUpperCase() : email, '2001:db8::5', false);
    const error = await limiter.guard(limiter.accountKeys(email.toUpperCase(), '2001:db8::5'), async () => 1, () => false).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(TooManyAttemptsError);
    expect((error as TooManyAttemptsError).retryAfterSeconds).toBeGreaterThan(0);
    expect((error as TooManyAttemptsError).retryAfterSeconds).toBeLessThanOrEqual(60);
  });
});
