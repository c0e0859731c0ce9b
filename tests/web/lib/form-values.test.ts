import { describe, expect, it } from 'vitest';
import { updateRepositorySchema } from '@shared/api/repositories';
import { nonEmptyLines, optionalNumber, validate } from '@/lib/form';

describe('optionalNumber and nonEmptyLines (form values for the shared schemas)', () => {
  it('turn repository settings fields into what PATCH /api/repositories/:id accepts', () => {
    const result = validate(updateRepositorySchema, {
      threshold: optionalNumber('0.85'),
      minTokens: optionalNumber(' 40 '),
      ignore: nonEmptyLines('vendor/\r\n\n  **/*.min.js  \n'),
      cloneBudget: optionalNumber('') ?? null,
    });
    expect(result).toEqual({ ok: true, data: { threshold: 0.85, minTokens: 40, ignore: ['vendor/', '**/*.min.js'], cloneBudget: null } });
  });

  describe('edge cases', () => {
    it('leaves an empty field out and lets the schema judge what is not a number', () => {
      expect(optionalNumber('')).toBeUndefined();
      expect(optionalNumber('   ')).toBeUndefined();
      expect(optionalNumber(null)).toBeUndefined();
      const result = validate(updateRepositorySchema, { minTokens: optionalNumber('4.5') });
      expect(result.ok ? null : result.errors.minTokens).toBe('Whole tokens only.');
    });

    it('gives no lines for an empty or missing textarea', () => {
      expect(nonEmptyLines('')).toEqual([]);
      expect(nonEmptyLines(null)).toEqual([]);
      expect(nonEmptyLines('\n \n')).toEqual([]);
    });
  });
});
