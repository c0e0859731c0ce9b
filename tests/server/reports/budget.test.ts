import { describe, expect, it } from 'vitest';
import { exceedsBudget, parseBudget } from '../../../server/reports/budget';

describe('exceedsBudget', () => {
  it('passes a clone ratio exactly at the budget and fails one token above it', () => {
    expect(exceedsBudget({ clonedTokens: 40, fragmentTokens: 100 }, parseBudget('0.4'))).toBe(false);
    expect(exceedsBudget({ clonedTokens: 40, fragmentTokens: 100 }, parseBudget('0.400000'))).toBe(false);
    expect(exceedsBudget({ clonedTokens: 40, fragmentTokens: 100 }, parseBudget('40%'))).toBe(false);
    expect(exceedsBudget({ clonedTokens: 41, fragmentTokens: 100 }, parseBudget('0.4'))).toBe(true);
    expect(exceedsBudget({ clonedTokens: 40, fragmentTokens: 99 }, parseBudget('0.4'))).toBe(true);
  });

  it('tells apart a ratio that doubles round onto the budget', () => {
    // 900000000000000 / 8999999999999999 is 0.1 + 1.1e-17: above 0.1, yet the division rounds to
    // the double nearest 0.1, so a floating-point comparison calls it "at the budget"
    const counts = { clonedTokens: 900000000000000, fragmentTokens: 8999999999999999 };
    expect(counts.clonedTokens / counts.fragmentTokens > 0.1).toBe(false);
    expect(exceedsBudget(counts, parseBudget('0.1'))).toBe(true);
    expect(exceedsBudget({ clonedTokens: 900000000000000, fragmentTokens: 9000000000000000 }, parseBudget('0.1'))).toBe(false);
  });

  describe('edge cases', () => {
    it('never fails a snapshot without tokens, and a zero budget fails any cloned token', () => {
      expect(exceedsBudget({ clonedTokens: 0, fragmentTokens: 0 }, parseBudget('0'))).toBe(false);
      expect(exceedsBudget({ clonedTokens: 1, fragmentTokens: 1000 }, parseBudget('0'))).toBe(true);
      expect(exceedsBudget({ clonedTokens: 1000, fragmentTokens: 1000 }, parseBudget('1'))).toBe(false);
    });
  });
});
