import { execFileSync, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatSimilarity, parseSetLines, run } from '../../../server/cli/join';
import { projectRoot } from '../../../server/config';
import { captureIo } from './io';

let dir: string;
beforeAll(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-join-'));
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function inputFile(name: string, text: string): string {
  const file = path.join(dir, name);
  fs.writeFileSync(file, text);
  return file;
}

/** 31 and 32 ids sharing 28 (J = 0.8 exactly), a near copy, a set in nothing, and repeats. */
const SAMPLE = [
  Array.from({ length: 31 }, (_, i) => i).join(' '),
  Array.from({ length: 32 }, (_, i) => (i < 28 ? i : 500 + i)).join(' '),
  '900 901 902',
  '',
  '902 901 900 900 901',
].join('\n');

describe('doublet join', () => {
  it('prints "i j similarity" per pair, 0-based, i < j, counts on stderr', async () => {
    const io = captureIo();
    const code = await run(['--input', inputFile('sample.txt', `${SAMPLE}\n`), '--threshold', '0.8'], io);
    expect(code).toBe(0);
    expect(io.stdout()).toBe('0 1 0.8\n2 4 1\n');
    expect(io.stderr()).toMatch(/candidates \d+, verified \d+, results 2/);
    expect(io.stderr()).toMatch(/join \d+ ms/);
  });

  it('prints the same pairs with every --method (and under its old name --algorithm)', async () => {
    const file = inputFile('same.txt', SAMPLE);
    const outputs = new Set<string>();
    for (const method of ['brute', 'length', 'prefix', 'position', 'bitmap', 'auto']) {
      for (const flag of ['--method', '--algorithm']) {
        const io = captureIo();
        expect(await run(['--input', file, flag, method], io)).toBe(0);
        outputs.add(io.stdout());
      }
    }
    expect([...outputs]).toEqual(['0 1 0.8\n2 4 1\n']);
  });

  it('names the line of a malformed set and prints nothing on stdout', async () => {
    const io = captureIo();
    const code = await run(['--input', inputFile('bad.txt', '1 2 3\n1 2 3\n4 -5 6\n')], io);
    expect(code).toBe(1);
    expect(io.stdout()).toBe('');
    expect(io.stderr()).toContain('bad.txt line 3 (set 2): "-5" is not an integer');
  });

  it('runs through the installed `doublet` shim', () => {
    const file = inputFile('shim.txt', SAMPLE);
    const out = execFileSync(process.execPath, [path.join(projectRoot, 'server/doublet.mjs'), 'join', '--input', file], {
      cwd: os.tmpdir(),
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    expect(out).toBe('0 1 0.8\n2 4 1\n');
    const bad = spawnSync(process.execPath, [path.join(projectRoot, 'server/doublet.mjs'), 'join', '--input', inputFile('x.txt', '1\nx\n')], {
      encoding: 'utf8',
    });
    expect(bad.status).toBe(1);
    expect(bad.stdout).toBe('');
    expect(bad.stderr).toContain('line 2');
  });

  describe('edge cases', () => {
    it('refuses a missing --input, a bad threshold or method with usage (exit 2)', async () => {
      for (const args of [[], ['--input', 'x', '--threshold', '1.5'], ['--input', 'x', '--method', 'quick'], ['--input', 'x', '--algorithm', 'quick'], ['--nope']]) {
        const io = captureIo();
        expect(await run(args, io), args.join(' ')).toBe(2);
        expect(io.stderr()).toMatch(/^error: .*\nusage: doublet join/);
        expect(io.stdout()).toBe('');
      }
    });

    it('reports a file it cannot read (exit 1)', async () => {
      const io = captureIo();
      expect(await run(['--input', path.join(dir, 'missing.txt')], io)).toBe(1);
      expect(io.stderr()).toContain('ENOENT');
    });

    it('reads empty lines as empty sets and ignores one final newline', () => {
      expect(parseSetLines('3 1 3\n\n7\n', 'f')).toEqual([[3, 1, 3], [], [7]]);
      expect(parseSetLines('', 'f')).toEqual([]);
      expect(parseSetLines('1\t 2\r\n', 'f')).toEqual([[1, 2]]);
    });

    it('refuses tokens past 2^31 − 1 and decimals', () => {
      expect(() => parseSetLines('2147483648', 'f')).toThrow(/line 1/);
      expect(() => parseSetLines('1\n1.5', 'f')).toThrow(/line 2 \(set 1\): "1.5"/);
      expect(parseSetLines('2147483647', 'f')).toEqual([[2147483647]]);
    });

    it('formats similarities with at most six decimals', () => {
      expect(formatSimilarity(28 / 35)).toBe('0.8');
      expect(formatSimilarity(5 / 6)).toBe('0.833333');
      expect(formatSimilarity(1)).toBe('1');
    });
  });
});
