import { afterEach, describe, expect, it } from 'vitest';
import { loadConfig } from '../../../server/config';

/** The security settings read from the environment (server/config.ts). */
const NAMES = ['TRUST_PROXY', 'SESSION_MAX_DAYS', 'SESSION_IDLE_HOURS', 'SIGN_IN_LIMIT_ACCOUNT', 'SIGN_IN_WINDOW_MINUTES', 'SESSION_SECRET', 'NODE_ENV'];
const saved = Object.fromEntries(NAMES.map((name) => [name, process.env[name]]));

afterEach(() => {
  for (const name of NAMES) {
    if (saved[name] === undefined) delete process.env[name];
    else process.env[name] = saved[name];
  }
});

describe('security settings', () => {
  it('read TRUST_PROXY as Express takes it: off, on, a hop count, or a list of addresses and names', () => {
    delete process.env.TRUST_PROXY;
    expect(loadConfig().trustProxy).toBe(false);
    for (const [raw, expected] of [
      ['false', false],
      ['true', true],
      ['2', 2],
      ['loopback, 10.0.0.0/8', ['loopback', '10.0.0.0/8']],
    ] as const) {
      process.env.TRUST_PROXY = raw;
      expect(loadConfig().trustProxy).toEqual(expected);
    }
  });

  it('default to a 12-hour idle and 7-day absolute session, 10 failures per account and address in 15 minutes', () => {
    for (const name of NAMES) delete process.env[name];
    const config = loadConfig();
    expect(config.sessionIdleMs).toBe(12 * 3600_000);
    expect(config.sessionMaxAgeMs).toBe(7 * 24 * 3600_000);
    expect(config.credentialLimits).toEqual({ perAccount: 10, perAddress: 50, perAccountEverywhere: 100, windowMs: 15 * 60_000 });
    expect(config.sessionSecret).toBeUndefined();
    expect(config.production).toBe(false);
  });

  it('edge cases: a limit that is not a positive whole number is refused at start', () => {
    process.env.SIGN_IN_LIMIT_ACCOUNT = '0';
    expect(() => loadConfig()).toThrow(/SIGN_IN_LIMIT_ACCOUNT/);
    process.env.SIGN_IN_LIMIT_ACCOUNT = '1e3';
    expect(() => loadConfig()).toThrow(/SIGN_IN_LIMIT_ACCOUNT/);
  });
});
