import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { run } from '../../../server/cli/scan';
import { projectRoot } from '../../../server/config';
import { cloneReportSchema, type CloneReport } from '../../../shared/api/clone-report';
import { captureIo } from './io';

/**
 * `doublet scan` on the invented Larkspur Freight fixture (tests/fixtures/scan/larkspur-freight,
 * see its README): three planted clone pairs — an exact copy, a copy with renamed identifiers,
 * a copy with a line added — among unrelated functions.
 */
const FIXTURE = path.join(projectRoot, 'tests/fixtures/scan/larkspur-freight');

const PLANTED = [
  ['src/billing/fees.ts:dockFeeFor', 'src/legacy/old-fees.ts:dockFeeFor', 1],
  ['src/legacy/cargo-digest.ts:digestCargoList', 'src/reports/manifest.ts:summariseManifest', 2],
  ['src/legacy/shift-bays.ts:allocateBaysForShift', 'src/yard/bays.ts:assignLoadingBays', 3],
] as const;

/**
 * The fixture was planted for t = 0.8: at 0.8 the three planted pairs are all it holds. The tests
 * of the output formats name that threshold, so they keep testing the formats whatever the
 * default; the default itself has its own test below.
 */
const AT_08 = ['--threshold', '0.8'];

let dir: string;
let report: CloneReport;
let jsonRun: { code: number; stderr: string };

function pairsByName(r: CloneReport) {
  const label = new Map(r.fragments.map((f) => [f.id, `${f.file}:${f.name}`]));
  return r.pairs.map((p) => [label.get(p.a), label.get(p.b), p.type]);
}

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-scan-'));
  const io = captureIo();
  const out = path.join(dir, 'report.json');
  const code = await run([FIXTURE, ...AT_08, '--format', 'json', '--out', out], io);
  jsonRun = { code, stderr: io.stderr() };
  report = JSON.parse(fs.readFileSync(out, 'utf8')) as CloneReport;
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe('doublet scan', () => {
  it('finds each planted clone pair with its clone type, and nothing else', () => {
    expect(jsonRun.code).toBe(0);
    expect(pairsByName(report)).toEqual(PLANTED);
    expect(report.classes.map((c) => c.members.length)).toEqual([2, 2, 2]);
  });

  it('writes JSON that the shared schema accepts, with paths relative to the folder', () => {
    const parsed = cloneReportSchema.safeParse(report);
    expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true);
    expect(report.settings).toMatchObject({ threshold: 0.8, minTokens: 50, shingleSize: 3 });
    for (const fragment of report.fragments) {
      expect(path.isAbsolute(fragment.file)).toBe(false);
      expect(fs.existsSync(path.join(FIXTURE, fragment.file))).toBe(true);
      expect(fragment.tokens).toBeGreaterThanOrEqual(50);
    }
    // the clone ratio is the planted fragments' share of all tokens, each token counted once: a
    // fragment nested in another one of its file (by lines) adds nothing to the total
    const planted = new Set<number>(report.pairs.flatMap((p) => [p.a, p.b]));
    const cloned = report.fragments.filter((f) => planted.has(f.id)).reduce((sum, f) => sum + f.tokens, 0);
    const nested = (f: (typeof report.fragments)[number]) =>
      report.fragments.some((o) => o !== f && o.file === f.file && o.startLine <= f.startLine && o.endLine >= f.endLine && o.tokens > f.tokens);
    const total = report.fragments.filter((f) => !nested(f)).reduce((sum, f) => sum + f.tokens, 0);
    expect(report.fragments.some(nested)).toBe(true);
    expect(report.stats).toMatchObject({ clonedTokens: cloned, fragmentTokens: total, pairCount: 3, classCount: 3 });
    expect(report.stats.cloneRatio).toBeCloseTo(cloned / total, 12);
    expect(jsonRun.stderr).toMatch(/3 clone pairs, 3 clone classes/);
  });

  it('writes SARIF 2.1.0: one result per class member, partners as related locations', async () => {
    const io = captureIo();
    expect(await run([FIXTURE, ...AT_08, '--format', 'sarif'], io)).toBe(0);
    const sarif = JSON.parse(io.stdout());
    expect(sarif.version).toBe('2.1.0');
    expect(sarif.$schema).toMatch(/sarif-schema-2\.1\.0\.json$/);
    expect(sarif.runs).toHaveLength(1);
    const [runLog] = sarif.runs;
    expect(runLog.tool.driver.name).toBe('doublet');
    expect(runLog.tool.driver.rules.map((r: { id: string }) => r.id)).toEqual(['clone-class-member']);
    expect(runLog.results).toHaveLength(6);
    for (const result of runLog.results) {
      expect(result.ruleId).toBe('clone-class-member');
      expect(typeof result.message.text).toBe('string');
      expect(result.locations).toHaveLength(1);
      expect(result.locations[0].physicalLocation.artifactLocation.uri).not.toMatch(/^\//);
      expect(result.locations[0].physicalLocation.region.startLine).toBeGreaterThan(0);
      // the one related location is the planted partner
      const here = result.locations[0].physicalLocation.artifactLocation.uri;
      const partner = PLANTED.map(([a, b]) => [a.split(':')[0], b.split(':')[0]]).find((files) => files.includes(here))!;
      expect(result.relatedLocations).toHaveLength(1);
      expect(result.relatedLocations[0].physicalLocation.artifactLocation.uri).toBe(partner[0] === here ? partner[1] : partner[0]);
    }
    const uris = runLog.results.map((r: { locations: { physicalLocation: { artifactLocation: { uri: string } } }[] }) => r.locations[0].physicalLocation.artifactLocation.uri);
    expect(new Set(uris)).toEqual(new Set(PLANTED.flatMap(([a, b]) => [a.split(':')[0], b.split(':')[0]])));
  });

  it('prints a text summary, largest classes first', async () => {
    const io = captureIo();
    expect(await run([FIXTURE, ...AT_08], io)).toBe(0);
    const text = io.stdout();
    expect(text).toMatch(/clone ratio \d+\.\d%: [\d,]+ tokens in 3 clone pairs, 3 clone classes/);
    expect(text).toContain('src/yard/bays.ts:14-33  assignLoadingBays');
    expect(text.indexOf('Clone class 1')).toBeLessThan(text.indexOf('Clone class 3'));
  });

  it('exits 1 when the clone ratio is above --budget, 0 at or under it', async () => {
    const ratio = report.stats.cloneRatio;
    const over = captureIo();
    expect(await run([FIXTURE, ...AT_08, '--format', 'json', '--budget', (Math.floor(ratio * 100) / 100).toFixed(2)], over)).toBe(1);
    expect(over.stderr()).toMatch(/above the budget/);
    const under = captureIo();
    expect(await run([FIXTURE, ...AT_08, '--format', 'csv', '--budget', `${Math.ceil(ratio * 100)}%`], under)).toBe(0);
    expect(under.stdout().split('\r\n')[0]).toBe('class,similarity,type,file_a,name_a,start_line_a,end_line_a,file_b,name_b,start_line_b,end_line_b');
    expect(under.stdout().trim().split('\r\n')).toHaveLength(4);
  });

  it('uses the default settings without flags: t = 0.7 adds the one pair of a function with the callback it is made of', async () => {
    const io = captureIo();
    expect(await run([FIXTURE, '--format', 'json'], io)).toBe(0);
    const atDefault = cloneReportSchema.parse(JSON.parse(io.stdout()));
    // The default chosen from the detection-quality benchmark (README "Why 0.7").
    expect(atDefault.settings).toMatchObject({ threshold: 0.7, minTokens: 50, shingleSize: 3 });
    // Every pair at 0.8 is a pair at 0.7; the one more is parseGateLog with its forEach callback:
    // the callback's tokens also count in the function around it, so its shingle set is a subset
    // of the outer one and J = (inner tokens − 2) / (outer tokens − 2) for 3-token shingles,
    // between 0.7 and 0.8.
    const pairs = pairsByName(atDefault);
    expect(pairs.slice(0, PLANTED.length)).toEqual(PLANTED);
    expect(pairs).toHaveLength(PLANTED.length + 1);
    const extra = atDefault.pairs[PLANTED.length]!;
    const [outer, inner] = [extra.a, extra.b].map((id) => atDefault.fragments.find((f) => f.id === id)!).sort((x, y) => y.tokens - x.tokens);
    expect([outer!.file, outer!.name, inner!.file]).toEqual(['src/yard/gate.js', 'parseGateLog', 'src/yard/gate.js']);
    expect(inner!.startLine).toBeGreaterThan(outer!.startLine);
    expect(inner!.endLine).toBeLessThan(outer!.endLine);
    expect(extra.similarity).toBeCloseTo((inner!.tokens - 2) / (outer!.tokens - 2), 12);
    expect(extra.similarity).toBeGreaterThanOrEqual(0.7);
    expect(extra.similarity).toBeLessThan(0.8);
  });

  it('scans several folders at once, naming each by its folder', async () => {
    const io = captureIo();
    const code = await run([path.join(FIXTURE, 'src/billing'), path.join(FIXTURE, 'src/legacy'), '--format', 'json'], io);
    expect(code).toBe(0);
    const both = cloneReportSchema.parse(JSON.parse(io.stdout()));
    expect(pairsByName(both)).toEqual([['billing/fees.ts:dockFeeFor', 'legacy/old-fees.ts:dockFeeFor', 1]]);
  });

  describe('edge cases', () => {
    it('reports a missing folder (exit 1) and bad options (exit 2) without output', async () => {
      const missing = captureIo();
      expect(await run([path.join(dir, 'nowhere')], missing)).toBe(1);
      expect(missing.stderr()).toMatch(/cannot scan .*nowhere/);
      expect(missing.stdout()).toBe('');
      for (const args of [[], [FIXTURE, '--format', 'xml'], [FIXTURE, '--budget', '1.5'], [FIXTURE, '--min-tokens', '0'], [FIXTURE, '--threshold', '0']]) {
        const io = captureIo();
        expect(await run(args, io), args.join(' ')).toBe(2);
        expect(io.stdout()).toBe('');
        expect(io.stderr()).toContain('usage: doublet scan');
      }
    });

    it('finds nothing in a folder without clones', async () => {
      const io = captureIo();
      expect(await run([path.join(FIXTURE, 'tools'), '--format', 'json'], io)).toBe(0);
      const alone = cloneReportSchema.parse(JSON.parse(io.stdout()));
      expect(alone.fragments).toHaveLength(1);
      expect(alone.pairs).toEqual([]);
      expect(alone.stats.cloneRatio).toBe(0);
    });
  });
});
