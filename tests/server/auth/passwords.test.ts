import bcrypt from 'bcryptjs';
import { describe, expect, it } from 'vitest';
import { hashPassword, verifyPassword } from '../../../server/auth/passwords';
import { hashToken, oneTimeToken } from '../../../server/auth/tokens';

describe('hashPassword / verifyPassword', () => {
  it('produces a bcrypt hash that bcryptjs itself verifies', async () => {
    const hash = await hashPassword('timetable-for-tuesday');
    // The modular crypt format of bcrypt: $2b$ (or $2a$), the cost, 53 characters of salt+hash (common practice).
    expect(hash).toMatch(/^\$2[ab]\$10\$[./A-Za-z0-9]{53}$/);
    expect(await bcrypt.compare('timetable-for-tuesday', hash)).toBe(true);
    expect(await verifyPassword('timetable-for-tuesday', hash)).toBe(true);
    expect(await verifyPassword('timetable-for-wednesday', hash)).toBe(false);
  });

  describe('edge cases', () => {
    it('answers false without a hash (unknown user)', async () => {
      expect(await verifyPassword('anything-at-all', undefined)).toBe(false);
    });

    it('salts: the same password hashes differently twice', async () => {
      expect(await hashPassword('same-password-twice')).not.toBe(await hashPassword('same-password-twice'));
    });
  });
});

describe('oneTimeToken / hashToken', () => {
  it('gives 43 URL-safe characters and a SHA-256 hex digest', () => {
    const token = oneTimeToken();
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(oneTimeToken()).not.toBe(token);
    // SHA-256 of "abc" is a published test vector (FIPS 180-2, appendix B.1), quoted from memory.
    expect(hashToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
});
