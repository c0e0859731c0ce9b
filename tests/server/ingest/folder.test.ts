import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFolder } from '../../../server/ingest/folder';

let root: string;
let outside: string;

function write(relative: string, content: string | Uint8Array) {
  const file = path.join(root, relative);
  fs.mkdirSync(path.dirname(file), { recursive: true });
  fs.writeFileSync(file, content);
}

beforeAll(() => {
  root = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-folder-'));
  outside = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-outside-'));
  fs.writeFileSync(path.join(outside, 'secret.js'), 'function secret() {}\n');
  write('src/quote.js', 'export function quote() { return 1; }\n');
  write('src/deep/ledger.py', 'def total(xs):\n    return sum(xs)\n');
  write('README.md', '# Tidewater\n');
  write('node_modules/pkg/index.js', 'module.exports = 1;\n');
  write('src/generated/api.ts', 'export const a = 1;\n');
  write('big.js', 'x'.repeat(2000));
  write('logo.js', new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0, 0, 0, 0, 1, 2, 3]));
  fs.symlinkSync(path.join(outside, 'secret.js'), path.join(root, 'src/link.js'));
  fs.symlinkSync(outside, path.join(root, 'linked-dir'));
});

afterAll(() => {
  fs.rmSync(root, { recursive: true, force: true });
  fs.rmSync(outside, { recursive: true, force: true });
});

describe('readFolder', () => {
  it('returns kept files sorted with / paths and every skipped entry with its reason', async () => {
    const { files, skipped } = await readFolder(root, { ignore: ['generated/'], maxFileBytes: 1000 });
    expect(files.map((f) => f.path)).toEqual(['README.md', 'src/deep/ledger.py', 'src/quote.js']);
    expect(new TextDecoder().decode(files[2]!.content)).toBe('export function quote() { return 1; }\n');
    expect(skipped).toEqual([
      { path: 'big.js', reason: 'larger than the size cap (2000 > 1000 bytes)' },
      { path: 'linked-dir', reason: 'symbolic link (not followed)' },
      { path: 'logo.js', reason: 'binary file' },
      { path: 'node_modules/', reason: 'default ignore: node_modules/ directory' },
      { path: 'src/generated/', reason: 'ignored by rule "generated/"' },
      { path: 'src/link.js', reason: 'symbolic link (not followed)' },
    ]);
  });

  it('never reads through a symbolic link', async () => {
    const { files } = await readFolder(root);
    expect(files.some((f) => new TextDecoder().decode(f.content).includes('secret'))).toBe(false);
  });

  describe('edge cases', () => {
    it('rejects a missing root and a root that is a file, saying which', async () => {
      await expect(readFolder(path.join(root, 'nope'))).rejects.toThrow(/does not exist/);
      await expect(readFolder(path.join(root, 'README.md'))).rejects.toThrow(/is not a directory/);
    });

    it('reads an empty folder', async () => {
      const empty = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-empty-'));
      expect(await readFolder(empty)).toEqual({ files: [], skipped: [] });
      fs.rmSync(empty, { recursive: true });
    });
  });
});
