import { describe, expect, it } from 'vitest';
import { analyzeFile, languageForPath } from '../../../analyzers';
import { analyzeFixture, outline } from './fixture';

describe('cpp analyzer', () => {
  it('finds constructors, in-class and out-of-class methods, lambdas and namespaced functions', async () => {
    const result = await analyzeFixture('hold.cpp');
    expect(result.language).toBe('cpp');
    expect(outline(result)).toEqual([
      ['Hold.Hold', 'constructor', 6, 5, 6, 35],
      ['Hold.free', 'method', 7, 5, 10, 5],
      ['<anonymous>', 'lambda', 8, 21, 8, 55],
      ['Hold.capacity', 'method', 15, 1, 17, 1],
      ['stack', 'function', 20, 1, 20, 41],
    ]);
  });

  describe('edge cases', () => {
    it('reads headers as C++ and names an out-of-class constructor', async () => {
      expect(languageForPath('include/hold.h')).toBe('cpp');
      const result = await analyzeFile('hold.h', 'Hold::Hold(int b) : bays_(b) {}\nHold::~Hold() {}\n', { minTokens: 1 });
      expect(outline(result).map(([name, kind]) => [name, kind])).toEqual([
        ['Hold.Hold', 'constructor'],
        ['Hold.~Hold', 'method'],
      ]);
    });
  });
});
