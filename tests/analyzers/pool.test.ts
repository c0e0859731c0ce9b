import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { analyzeFile, analyzeFiles } from '../../analyzers';
import { readFixture } from './languages/fixture';
import { PATHOLOGICAL_TS } from '../support/cpu';

const encode = (s: string) => new TextEncoder().encode(s);
const here = path.dirname(fileURLToPath(import.meta.url));

describe('analyzeFiles', () => {
  it('returns results in input order, equal to analyzeFile, with skipped files listed apart', async () => {
    const names = ['shipments.js', 'dockside.py', 'Ledger.java', 'routes.go', 'Invoice.cs', 'pallet.c', 'hold.cpp'];
    const input = [
      ...names.map((name) => ({ path: `src/${name}`, content: encode(readFixture(name)) })),
      { path: 'docs/readme.xyz', content: encode('hello') },
      { path: 'node_modules/x/index.js', content: encode('function a() {}') },
    ];
    const { files, skipped } = await analyzeFiles(input, { minTokens: 1, workers: 2 });
    expect(files.map((f) => f.path)).toEqual(names.map((n) => `src/${n}`));
    for (const file of files) {
      const name = file.path.slice(4);
      expect(file).toEqual(await analyzeFile(file.path, readFixture(name), { minTokens: 1 }));
    }
    expect(skipped).toEqual([
      { path: 'docs/readme.xyz', reason: 'no analyzer for .xyz' },
      { path: 'node_modules/x/index.js', reason: 'default ignore: node_modules/ directory' },
    ]);
  });

  it('cuts off a pathological file at the time limit, terminates its thread, and goes on with the rest', async () => {
    const input = [
      { path: 'slow.ts', content: encode(PATHOLOGICAL_TS) },
      { path: 'a.py', content: encode('def crates(n):\n    return n * 2\n') },
      { path: 'b.js', content: encode('function fee(kg) { return kg * 3; }\n') },
    ];
    const started = Date.now();
    const { files } = await analyzeFiles(input, { minTokens: 1, workers: 1, timeoutMs: 3000 });
    expect(Date.now() - started).toBeLessThan(25_000);
    expect(files[0]).toEqual({ path: 'slow.ts', language: 'typescript', fragments: [], error: 'cut off after 3000 ms (time limit per file)' });
    expect(files[1]!.fragments.map((f) => f.name)).toEqual(['crates']);
    expect(files[2]!.fragments.map((f) => f.name)).toEqual(['fee']);
  }, 60_000);

  it('works under `node --import tsx` and lets the process exit when done', () => {
    const script = path.join(here, '../fixtures/analyzers/pool-script.ts');
    const run = spawnSync(process.execPath, ['--import', 'tsx', script], { encoding: 'utf8', timeout: 60_000 });
    expect(run.status).toBe(0);
    expect(JSON.parse(run.stdout)).toEqual({
      names: [['crates'], ['fee']],
      skipped: [{ path: 'c.txt', reason: 'no analyzer for .txt' }],
    });
  }, 70_000);

  describe('edge cases', () => {
    it('returns at once for no files, and for files that are all skipped', async () => {
      expect(await analyzeFiles([])).toEqual({ files: [], skipped: [] });
      expect(await analyzeFiles([{ path: 'a.bin', content: new Uint8Array([0, 1, 2, 0]) }])).toEqual({
        files: [],
        skipped: [{ path: 'a.bin', reason: 'binary file' }],
      });
    });

    it('rejects bad pool options with a clear message', async () => {
      await expect(analyzeFiles([], { workers: 0 })).rejects.toThrow(/options.workers must be a positive integer, got 0/);
      await expect(analyzeFiles([], { timeoutMs: -1 })).rejects.toThrow(/options.timeoutMs/);
    });

    it('reports a file that fails to parse as an error record among good ones', async () => {
      const input = [
        { path: 'broken.js', content: encode(readFixture('broken.js')) },
        { path: 'ok.js', content: encode('function ok() { return 1; }') },
      ];
      const { files } = await analyzeFiles(input, { minTokens: 1, workers: 1 });
      expect(files[0]!.error).toMatch(/Unexpected token/);
      expect(files[1]!.fragments).toHaveLength(1);
    });
  });
});
