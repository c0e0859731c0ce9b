import { describe, expect, it } from 'vitest';
import { formatLocation, formatPercent, formatSimilarity } from '@/lib/format';

describe('formatPercent', () => {
  it('shows a share as a percentage with one decimal', () => {
    expect(formatPercent(0.1234)).toBe('12.3 %');
    expect(formatPercent(0.4464)).toBe('44.6 %');
    expect(formatPercent(1)).toBe('100.0 %');
  });

  describe('edge cases', () => {
    it('shows a dash where there is no figure', () => {
      expect(formatPercent(null)).toBe('—');
      expect(formatPercent(undefined)).toBe('—');
      expect(formatPercent(Number.NaN)).toBe('—');
    });

    it('shows zero as a figure, not as missing', () => {
      expect(formatPercent(0)).toBe('0.0 %');
    });
  });
});

describe('formatSimilarity and formatLocation', () => {
  it('give three decimals and path:start–end', () => {
    expect(formatSimilarity(0.8)).toBe('0.800');
    expect(formatSimilarity(12 / 13)).toBe('0.923');
    expect(formatLocation('billing/tariff.js', 2, 13)).toBe('billing/tariff.js:2–13');
  });

  describe('edge cases', () => {
    it('gives one line number for a one-line fragment', () => {
      expect(formatLocation('a.py', 7, 7)).toBe('a.py:7');
    });
  });
});
