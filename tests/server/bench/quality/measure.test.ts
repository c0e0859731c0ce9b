import { describe, expect, it } from 'vitest';
import { loadPackages } from '../../../../server/bench/quality/corpus';
import { measureQuality, type KindResult, type MeasureResult } from '../../../../server/bench/quality/measure';

// A small version of `npm run bench:quality`, so the benchmark cannot rot: about 50 real
// functions, three edit kinds, one shingle size. Outside source: the JavaScript of express 5.3.0
// as published on npm (node_modules/express/lib, pinned in package.json).
const express = loadPackages([{ pkg: 'express', dirs: ['lib'], suffixes: ['.js'] }]);

const sum = (values: Record<string, number>) => Object.values(values).reduce((a, b) => a + b, 0);
const kind = (result: MeasureResult, name: string): KindResult => result.kinds.find((k) => k.kind === name)!;

describe('the quality benchmark, small', () => {
  it('plants, finds and counts copies of real functions (express 5.3.0)', async () => {
    expect(express.sources).toEqual([expect.objectContaining({ name: 'express', version: '5.3.0' })]);
    const result = await measureQuality({
      language: 'js',
      files: express.files,
      kinds: ['layout', 'rename-all', 'delete-1'],
      functions: 50,
      thresholds: [0.6, 0.8],
      shingleSizes: [3],
      seed: 7,
      workers: 1,
    });
    const selected = sum(result.selected);
    expect(selected).toBe(Math.min(50, result.candidates));
    expect(selected).toBeGreaterThanOrEqual(40);

    for (const k of result.kinds) {
      // Counts add up: every function tried is planted, skipped (with a reason) or failed.
      expect(k.tried, k.kind).toBe(selected);
      expect(k.planted + sum(k.skipped) + k.failed, k.kind).toBe(k.tried);
      expect(k.failed, k.kind).toBe(0);
      const low = k.cells['3:0.6']!;
      const high = k.cells['3:0.8']!;
      // A pair at 0.8 is also a pair at 0.6.
      expect(high.found, k.kind).toBeLessThanOrEqual(low.found);
      expect(low.found + (k.belowMinimum[3] ?? 0), k.kind).toBeLessThanOrEqual(k.planted);
      expect(Object.values(k.bySize).reduce((a, [, planted]) => a + planted, 0), k.kind).toBe(k.planted);
    }

    // Layout only: identical token streams, so every copy is found at 0.8 with its original,
    // and brings in no pair its original does not already have.
    const layout = kind(result, 'layout');
    expect(layout.planted).toBe(selected);
    expect(layout.cells['3:0.8']!.found).toBe(layout.planted);
    expect(layout.cells['3:0.8']!.newPairs).toBe(0);

    // Consistent renaming is invisible under identifier normalisation; functions with fewer than
    // two local variables are skipped and counted.
    const renamed = kind(result, 'rename-all');
    expect(renamed.cells['3:0.8']!.found).toBe(renamed.planted);
    expect(renamed.skipped['fewer than two local variables'] ?? 0).toBe(selected - renamed.planted);

    // Deleting a statement is seen by the shingles: some copies fall below 0.8 or below 50 tokens.
    const deleted = kind(result, 'delete-1');
    expect(deleted.planted).toBeGreaterThan(0);
    expect(deleted.cells['3:0.8']!.found).toBeLessThanOrEqual(deleted.planted);
    expect(deleted.cells['3:0.6']!.found).toBeGreaterThan(0);

    // The unedited corpus's own pairs: at least as many at 0.6 as at 0.8, samples drawn from them.
    expect(result.corpusPairs['3:0.6']).toBeGreaterThanOrEqual(result.corpusPairs['3:0.8']!);
    expect(result.corpusSamples['0.8']).toHaveLength(Math.min(10, result.corpusPairs['3:0.8']!));
  }, 60_000);

  describe('edge cases', () => {
    it('the same seed repeats the same counts; a function too small for an edit is skipped, not planted', async () => {
      const options = {
        language: 'js' as const,
        files: express.files,
        kinds: ['reorder-2', 'types'] as const,
        functions: 12,
        thresholds: [0.8],
        shingleSizes: [3],
        seed: 3,
        workers: 1,
      };
      const first = await measureQuality({ ...options, kinds: [...options.kinds] });
      const second = await measureQuality({ ...options, kinds: [...options.kinds] });
      expect(second.kinds).toEqual(first.kinds);
      // express is JavaScript: no copy can carry a type edit.
      expect(kind(first, 'types').skipped).toEqual({ 'not TypeScript': 12 });
      expect(kind(first, 'types').planted).toBe(0);
    }, 60_000);
  });
});
