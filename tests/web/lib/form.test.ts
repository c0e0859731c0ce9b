import { describe, expect, it } from 'vitest';
import { inviteUserSchema } from '@shared/api/invitations';
import { signInSchema } from '@shared/api/session';
import { validate } from '@/lib/form';

describe('validate (forms with the shared schemas)', () => {
  it('gives the parsed data, normalised as the server stores it', () => {
    const result = validate(signInSchema, { email: '  Ines.Varga@Brackenfold.Example ', password: 'x' });
    expect(result).toEqual({ ok: true, data: { email: 'ines.varga@brackenfold.example', password: 'x' } });
  });

  it('gives the first message per field', () => {
    const result = validate(inviteUserSchema, { email: 'nope', name: '', role: 'owner' });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(Object.keys(result.errors).sort()).toEqual(['email', 'name', 'role']);
    expect(result.errors.email).toBe('Enter a valid e-mail address.');
  });

  describe('edge cases', () => {
    it('reports missing values (null from FormData.get) on their field', () => {
      const result = validate(signInSchema, { email: null, password: null });
      expect(result.ok ? {} : result.errors).toMatchObject({ email: expect.any(String), password: expect.any(String) });
    });
  });
});
