import { describe, expect, it } from 'vitest';
import { LANGUAGES } from '../../../analyzers';
import { findCopiesSchema, SNIPPET_LANGUAGES } from '../../../shared/api/find-copies';

describe('SNIPPET_LANGUAGES', () => {
  it('names exactly the languages the analyzers register', () => {
    expect([...SNIPPET_LANGUAGES].sort()).toEqual(LANGUAGES.map((l) => l.id).sort());
  });
});

describe('findCopiesSchema', () => {
  it('accepts a snippet in a known language and refuses a threshold under the index threshold', () => {
    expect(findCopiesSchema.safeParse({ language: 'go', text: 'func f() {}' }).success).toBe(true);
    expect(findCopiesSchema.safeParse({ language: 'go', text: 'func f() {}', threshold: 0.59 }).success).toBe(false);
  });

  describe('edge cases', () => {
    it('refuses an empty snippet and an unknown language', () => {
      expect(findCopiesSchema.safeParse({ language: 'go', text: '' }).success).toBe(false);
      expect(findCopiesSchema.safeParse({ language: 'fortran', text: 'x' }).success).toBe(false);
    });
  });
});
