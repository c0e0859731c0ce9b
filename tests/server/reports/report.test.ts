import { describe, expect, it } from 'vitest';
import { buildReport, type ReportFragmentInput } from '../../../server/reports/build';
import { exceedsBudget, parseBudget } from '../../../server/reports/budget';
import { writeCsv } from '../../../server/reports/csv';
import { toSarif } from '../../../server/reports/sarif';
import { writeText } from '../../../server/reports/text';
import { writeReport } from '../../../server/reports/write';
import { cloneReportSchema } from '../../../shared/api/clone-report';

/** Four invented fragments: 0 and 2 identical, 2 and 3 renamed, 1 alone. */
const FRAGMENTS: ReportFragmentInput[] = [
  { file: 'src/quote.ts', name: 'quoteRate', startLine: 3, endLine: 20, tokens: 100, tokenStart: 12, tokenEnd: 112, rawHash: 'r1', normalizedHash: 'n1' },
  { file: 'src/other.ts', name: 'unrelated', startLine: 1, endLine: 9, tokens: 60, tokenStart: 0, tokenEnd: 60, rawHash: 'r9', normalizedHash: 'n9' },
  { file: 'src/copy, of "quote".ts', name: '=quoteRate', startLine: 5, endLine: 22, tokens: 100, tokenStart: 30, tokenEnd: 130, rawHash: 'r1', normalizedHash: 'n1' },
  { file: 'src/renamed.ts', name: 'priceLane', startLine: 10, endLine: 27, tokens: 40, tokenStart: 7, tokenEnd: 47, rawHash: 'r3', normalizedHash: 'n1' },
];
const SETTINGS = { threshold: 0.8, minTokens: 50, shingleSize: 3 };

function sample() {
  return buildReport({
    settings: SETTINGS,
    fragments: FRAGMENTS,
    pairs: [
      { a: 2, b: 0, similarity: 1 },
      { a: 2, b: 3, similarity: 0.85 },
    ],
  });
}

describe('buildReport', () => {
  it('orders pairs a < b, types them by hash, groups classes and computes the clone ratio', () => {
    const report = sample();
    expect(cloneReportSchema.parse(report)).toEqual(report);
    expect(report.pairs).toEqual([
      { a: 0, b: 2, similarity: 1, type: 1 },
      { a: 2, b: 3, similarity: 0.85, type: 2 },
    ]);
    expect(report.classes).toEqual([{ id: 1, members: [0, 2, 3], minSimilarity: 0.85, maxSimilarity: 1 }]);
    expect(report.stats).toMatchObject({ fragmentCount: 4, fragmentTokens: 300, clonedTokens: 240, cloneRatio: 0.8, pairCount: 2, classCount: 1, files: 4 });
  });

  it('uses the ids it is given', () => {
    const report = buildReport({
      settings: SETTINGS,
      fragments: FRAGMENTS.map((f, i) => ({ ...f, id: 100 - i })),
      pairs: [{ a: 0, b: 2, similarity: 1 }],
    });
    expect(report.pairs).toEqual([{ a: 98, b: 100, similarity: 1, type: 1 }]);
    expect(report.classes[0].members).toEqual([98, 100]);
  });

  describe('edge cases', () => {
    it('gives an empty report for no fragments', () => {
      const report = buildReport({ settings: SETTINGS, fragments: [], pairs: [] });
      expect(report.stats.cloneRatio).toBe(0);
      expect(writeText(report)).toContain('No clone pairs at this threshold.');
    });

    it('refuses repeated ids and pairs outside the list', () => {
      expect(() => buildReport({ settings: SETTINGS, fragments: FRAGMENTS.map((f) => ({ ...f, id: 1 })), pairs: [] })).toThrow(/unique/);
      expect(() => buildReport({ settings: SETTINGS, fragments: FRAGMENTS, pairs: [{ a: 0, b: 9, similarity: 1 }] })).toThrow(/fragment 9/);
    });
  });
});

describe('clone budget', () => {
  it('compares exactly: a ratio right at the budget passes', () => {
    const report = sample(); // 240 / 300 = 0.8
    expect(exceedsBudget(report.stats, parseBudget('0.8'))).toBe(false);
    expect(exceedsBudget(report.stats, parseBudget('80%'))).toBe(false);
    expect(exceedsBudget(report.stats, parseBudget('0.799999'))).toBe(true);
    expect(exceedsBudget(report.stats, parseBudget('79.5%'))).toBe(true);
  });

  describe('edge cases', () => {
    it('refuses budgets that are not ratios', () => {
      for (const text of ['1.5', '-0.1', 'five', '120%', '0.1234567']) expect(() => parseBudget(text), text).toThrow(/budget/);
      expect(parseBudget('0')).toMatchObject({ numerator: 0 });
    });
  });
});

describe('writers', () => {
  it('writes CSV with quoting and formula-safe fields', () => {
    const lines = writeCsv(sample()).trimEnd().split('\r\n');
    expect(lines).toHaveLength(3);
    expect(lines[1]).toBe(`1,1,1,src/quote.ts,quoteRate,3,20,"src/copy, of ""quote"".ts",'=quoteRate,5,22`);
  });

  it('writes SARIF with one result per class member and partners as related locations', () => {
    const sarif = toSarif(sample(), { toolVersion: '9.9.9' });
    expect(sarif.runs[0].tool.driver.version).toBe('9.9.9');
    const results = sarif.runs[0].results;
    expect(results.map((r) => r.locations[0].physicalLocation.artifactLocation.uri)).toEqual([
      'src/quote.ts',
      'src/copy%2C%20of%20%22quote%22.ts',
      'src/renamed.ts',
    ]);
    expect(results.map((r) => r.relatedLocations.length)).toEqual([1, 2, 1]);
  });

  it('writes JSON that round-trips through the schema', () => {
    const report = sample();
    expect(cloneReportSchema.parse(JSON.parse(writeReport(report, 'json')))).toEqual(report);
  });

  describe('edge cases', () => {
    it('writes a text summary listing every member of every class', () => {
      const text = writeText(sample());
      expect(text).toContain('clone ratio 80.0%: 240 tokens in 2 clone pairs, 1 clone classes');
      expect(text).toContain('src/renamed.ts:10-27  priceLane  (40 tokens)');
      expect(text).not.toContain('unrelated');
    });
  });
});
