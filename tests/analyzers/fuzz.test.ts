import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyzeFile, skipReason } from '../../analyzers';
import { readFixture } from './languages/fixture';

const FIXTURES: Array<[string, string]> = [
  ['shipments.js', 'shipments.js'],
  ['tariffs.ts.txt', 'tariffs.ts'],
  ['dockside.py', 'dockside.py'],
  ['Ledger.java', 'Ledger.java'],
  ['routes.go', 'routes.go'],
  ['Invoice.cs', 'Invoice.cs'],
  ['pallet.c', 'pallet.c'],
  ['hold.cpp', 'hold.cpp'],
];
const PATHS = ['x.js', 'x.tsx', 'x.py', 'x.java', 'x.go', 'x.cs', 'x.c', 'x.cpp'];
const lossy = new TextDecoder('utf-8', { fatal: false });

/** The invariants of any result: never thrown, well-formed fragments. */
function checkWellFormed(result: Awaited<ReturnType<typeof analyzeFile>>, text: string) {
  const lines = text.split(/\r\n|\r|\n/).length;
  for (const f of result.fragments) {
    expect(f.startLine).toBeGreaterThanOrEqual(1);
    expect(f.endLine).toBeLessThanOrEqual(lines);
    expect(f.endLine * 1e6 + f.endColumn).toBeGreaterThanOrEqual(f.startLine * 1e6 + f.startColumn);
    expect(f.tokens).toBeGreaterThan(0);
    expect(new Set(f.shingles).size).toBe(f.shingles.length);
  }
  if (result.error !== undefined) expect(result.fragments).toEqual([]);
}

describe('analyzeFile under fuzzing', () => {
  it('never throws on random bytes, in any language', async () => {
    await fc.assert(
      fc.asyncProperty(fc.uint8Array({ maxLength: 400 }), fc.constantFrom(...PATHS), async (bytes, path) => {
        const text = lossy.decode(bytes);
        checkWellFormed(await analyzeFile(path, text, { minTokens: 1 }), text);
        skipReason(path, bytes);
      }),
      { numRuns: 300 },
    );
  }, 120_000);

  it('never throws on truncated real files', async () => {
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...FIXTURES), fc.double({ min: 0, max: 1, noNaN: true }), async ([name, path], cut) => {
        const full = readFixture(name);
        const text = full.slice(0, Math.floor(full.length * cut));
        checkWellFormed(await analyzeFile(path, text, { minTokens: 1 }), text);
      }),
      { numRuns: 200 },
    );
  }, 120_000);

  it('never throws on real files with their lines shuffled', async () => {
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...FIXTURES), fc.integer(), async ([name, path], seed) => {
        const lines = readFixture(name).split('\n');
        let s = seed >>> 0;
        for (let i = lines.length - 1; i > 0; i--) {
          s = (s * 1664525 + 1013904223) >>> 0;
          const j = s % (i + 1);
          [lines[i], lines[j]] = [lines[j]!, lines[i]!];
        }
        const text = lines.join('\n');
        checkWellFormed(await analyzeFile(path, text, { minTokens: 1 }), text);
      }),
      { numRuns: 200 },
    );
  }, 120_000);

  describe('edge cases', () => {
    it('turns nesting too deep for the parser into an error record', async () => {
      const deep = `function f() { x = ${'['.repeat(200_000)}${']'.repeat(200_000)}; }`;
      const result = await analyzeFile('deep.js', deep);
      expect(result).toEqual({ path: 'deep.js', language: 'javascript', fragments: [], error: 'nesting too deep to parse' });
    });

    it('survives deep nesting in a tree-sitter language', async () => {
      const deep = `x = ${'('.repeat(20_000)}1${')'.repeat(20_000)}\n`;
      const result = await analyzeFile('deep.py', deep);
      expect(result.fragments).toEqual([]);
    });
  });
});
