import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeFiles, languageForPath } from '../../../analyzers';
import { DEMO_SEED, generateDemo, type Demo } from '../../../server/demo/generator/story';

/** One hash over everything a seed loads: every file of every release, the order of the steps and the story. */
function fingerprint(demo: Demo): string {
  const hash = createHash('sha256');
  for (const r of demo.repositories) {
    hash.update(`${r.name}\0${r.cloneBudget}\0`);
    for (const release of r.releases) for (const f of release.files) hash.update(`${release.label}\0${f.path}\0${f.text}\0`);
  }
  hash.update(JSON.stringify(demo.steps));
  hash.update(JSON.stringify(demo.story));
  return hash.digest('hex');
}

const root = path.resolve(import.meta.dirname, '../../..');

describe('the demo generator', () => {
  it('generates the same files byte for byte on every run, in this process and in another', () => {
    const first = fingerprint(generateDemo());
    expect(fingerprint(generateDemo())).toBe(first);
    const script = `import { generateDemo } from './server/demo/generator/story.ts';
      import { createHash } from 'node:crypto';
      const demo = generateDemo();
      const hash = createHash('sha256');
      for (const r of demo.repositories) {
        hash.update(r.name + '\\0' + r.cloneBudget + '\\0');
        for (const release of r.releases) for (const f of release.files) hash.update(release.label + '\\0' + f.path + '\\0' + f.text + '\\0');
      }
      hash.update(JSON.stringify(demo.steps));
      hash.update(JSON.stringify(demo.story));
      console.log(hash.digest('hex'));`;
    const other = execFileSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], { cwd: root, encoding: 'utf8' }).trim();
    expect(other).toBe(first);
    // the seed is what decides: another one writes other code
    expect(fingerprint(generateDemo(DEMO_SEED + 1))).not.toBe(first);
  });

  it('writes four or five repositories in three languages or more, with 8 to 12 releases each, loaded in date order', () => {
    const demo = generateDemo();
    expect(demo.repositories.length).toBeGreaterThanOrEqual(4);
    expect(demo.repositories.length).toBeLessThanOrEqual(5);
    const languages = new Set(demo.repositories.flatMap((r) => r.releases.at(-1)!.files.map((f) => languageForPath(f.path)).filter(Boolean)));
    expect(languages.size).toBeGreaterThanOrEqual(3);
    for (const r of demo.repositories) {
      expect(r.releases.length).toBeGreaterThanOrEqual(8);
      expect(r.releases.length).toBeLessThanOrEqual(12);
      expect(new Set(r.releases.map((x) => x.label)).size).toBe(r.releases.length);
    }
    // every release is loaded once, each repository's in its own order, all of them by date
    const loads = demo.steps.flatMap((s) => ('load' in s ? [s.load] : []));
    expect(loads).toHaveLength(demo.repositories.reduce((n, r) => n + r.releases.length, 0));
    const dateOf = (l: { repository: string; label: string }) => demo.repositories.find((r) => r.name === l.repository)!.releases.find((x) => x.label === l.label)!.date;
    const dates = loads.map(dateOf);
    expect([...dates].sort()).toEqual(dates);
    for (const r of demo.repositories) expect(loads.filter((l) => l.repository === r.name).map((l) => l.label)).toEqual(r.releases.map((x) => x.label));
    // the waiver follows the load of the release it was given after
    const waive = demo.steps.findIndex((s) => 'waive' in s);
    const after = demo.steps[waive - 1];
    expect('load' in after && after.load).toEqual({ repository: demo.story.waived.repository, label: demo.story.waived.afterLabel });
  });

  it('writes code that parses, in the words of a rail-freight company', async () => {
    const demo = generateDemo();
    for (const r of demo.repositories) {
      const latest = r.releases.at(-1)!;
      const files = latest.files.filter((f) => languageForPath(f.path)).map((f) => ({ path: f.path, content: Buffer.from(f.text) }));
      const { files: analysed } = await analyzeFiles(files, { workers: 1 });
      expect(analysed.filter((a) => a.error || a.syntaxErrors).map((a) => `${r.name}/${a.path}`)).toEqual([]);
      const text = latest.files.map((f) => f.text).join('\n').toLowerCase();
      for (const word of ['wagon', 'depot']) expect(text).toContain(word);
    }
    const everything = demo.repositories.flatMap((r) => r.releases.at(-1)!.files.map((f) => f.text)).join('\n').toLowerCase();
    for (const word of ['consignment', 'timetable', 'manifest', 'tariff', 'siding', 'inspection']) expect(everything).toContain(word);
  });
});
