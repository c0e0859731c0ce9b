import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import * as tar from 'tar';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readArchive } from '../../../server/ingest/archive';
import { readFolder } from '../../../server/ingest/folder';
import { packFolder } from '../../../server/ingest/pack';

let work: string;
let root: string;

function write(rel: string, content: string) {
  fs.mkdirSync(path.dirname(path.join(root, rel)), { recursive: true });
  fs.writeFileSync(path.join(root, rel), content);
}

beforeAll(() => {
  work = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-pack-'));
  root = path.join(work, 'freight-platform');
  write('src/tariff.js', 'export function tariff(w) { return w.axles * 120; }\n');
  write('src/routes/yard.py', 'def yard(t):\n    return t.tracks\n');
  write('src/generated/api.ts', 'export const api = 1;\n');
  write('notes.tmp', 'scratch\n');
  write('.git/HEAD', 'ref: refs/heads/main\n');
  write('vendored/lib/.git', 'gitdir: ../../.git/modules/lib\n');
  write('vendored/lib/index.js', 'export const lib = 2;\n');
  write('node_modules/left-pad/index.js', 'module.exports = 1;\n');
  fs.writeFileSync(path.join(work, 'outside.js'), 'function outside() { return "secret"; }\n');
  fs.symlinkSync(path.join(work, 'outside.js'), path.join(root, 'src/outside.js'));
  fs.symlinkSync(work, path.join(root, 'up'));
  fs.linkSync(path.join(root, 'src/tariff.js'), path.join(root, 'src/tariff-copy.js'));
});

afterAll(() => {
  fs.rmSync(work, { recursive: true, force: true });
});

describe('packFolder', () => {
  it('round-trips through the archive reader to the files readFolder reads', async () => {
    const ignore = ['generated/', '*.tmp'];
    const out = path.join(work, 'push.tgz');
    const packed = await packFolder(root, out, { ignore });
    expect(packed.files).toEqual(['src/routes/yard.py', 'src/tariff-copy.js', 'src/tariff.js', 'vendored/lib/index.js']);
    expect(packed.leftOut).toEqual([
      { path: '.git/', reason: 'version control data' },
      { path: 'node_modules/', reason: 'default ignore: node_modules/ directory' },
      { path: 'notes.tmp', reason: 'ignored by rule "*.tmp"' },
      { path: 'src/generated/', reason: 'ignored by rule "generated/"' },
      { path: 'src/outside.js', reason: 'symbolic link (not followed)' },
      { path: 'up', reason: 'symbolic link (not followed)' },
      { path: 'vendored/lib/.git', reason: 'version control data' },
    ]);
    const read = await readArchive(out, { ignore });
    const direct = await readFolder(root, { ignore });
    expect(read.format).toBe('tar.gz');
    expect(read.sha256).toBe(packed.sha256);
    // readFolder keeps a `.git` file (a submodule's pointer); a push leaves it out.
    expect(direct.files.map((f) => f.path)).toContain('vendored/lib/.git');
    expect(read.files).toEqual(direct.files.filter((f) => f.path !== 'vendored/lib/.git'));
    expect(read.skipped).toEqual([]);
  });

  it('stores a hard-linked file as a file and never a link', async () => {
    const out = path.join(work, 'links.tgz');
    await packFolder(root, out);
    const types: Record<string, string> = {};
    await tar.t({ file: out, onReadEntry: (e) => (types[e.path] = e.type) });
    expect(types['src/tariff-copy.js']).toBe('File');
    expect(types['src/tariff.js']).toBe('File');
    expect(Object.values(types).every((t) => t === 'File')).toBe(true);
  });

  it('packs an unchanged tree to the same bytes', async () => {
    const a = await packFolder(root, path.join(work, 'a.tgz'));
    fs.utimesSync(path.join(root, 'src/tariff.js'), new Date(), new Date());
    const b = await packFolder(root, path.join(work, 'b.tgz'));
    expect(b.sha256).toBe(a.sha256);
  });

  describe('edge cases', () => {
    it('packs default-ignored folders when asked, and refuses a root that is not a folder', async () => {
      const packed = await packFolder(root, path.join(work, 'all.tgz'), { leaveOutDefaultIgnored: false });
      expect(packed.files).toContain('node_modules/left-pad/index.js');
      await expect(packFolder(path.join(root, 'up'), path.join(work, 'x.tgz'))).rejects.toThrow(/is not a folder/);
    });
  });
});
