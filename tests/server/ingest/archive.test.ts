import { createHash } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import * as tar from 'tar';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readArchive, readUploadedArchive } from '../../../server/ingest/archive';
import { IngestError } from '../../../server/ingest/errors';
import { readFolder } from '../../../server/ingest/folder';
import { ingestLimits } from '../../../server/ingest/limits';
import { buildTar, buildZip, deflatedZeros, gzipAround, tarHeader } from './build-archives';

const MIB = 1024 * 1024;
let work: string;

beforeAll(() => {
  work = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-archive-'));
});

afterAll(() => {
  fs.rmSync(work, { recursive: true, force: true });
});

/** Writes bytes as an "upload": a temp file alone in a fresh folder, so the test can see it go. */
function upload(name: string, bytes: Buffer): { file: string; dir: string } {
  const dir = fs.mkdtempSync(path.join(work, 'upload-'));
  const file = path.join(dir, name);
  fs.writeFileSync(file, bytes);
  return { file, dir };
}

/** Reads an upload that must be refused; returns the error after checking the temp file is gone. */
async function refused(name: string, bytes: Buffer, limits = ingestLimits()): Promise<IngestError> {
  const { file, dir } = upload(name, bytes);
  const error = await readUploadedArchive(file, { limits }).then(
    () => undefined,
    (e: unknown) => e,
  );
  expect(fs.readdirSync(dir)).toEqual([]);
  expect(error).toBeInstanceOf(IngestError);
  return error as IngestError;
}

const text = (s: string) => Buffer.from(s, 'utf8');
const quote = text('export function quote(weight) {\n  return weight * 3;\n}\n');

describe('readArchive', () => {
  it('reads a zip by its content, strips the single top folder and applies the skip rules', async () => {
    const bytes = buildZip([
      { name: 'freight-2026.09/' },
      { name: 'freight-2026.09/src/quote.js', data: quote },
      { name: 'freight-2026.09/src/stored.py', data: text('def total(xs):\n    return sum(xs)\n'), method: 0 },
      { name: 'freight-2026.09/node_modules/pkg/index.js', data: text('module.exports = 1;\n') },
      { name: 'freight-2026.09/generated/api.ts', data: text('export const a = 1;\n') },
      { name: 'freight-2026.09/logo.js', data: Buffer.from([0x89, 0x50, 0x4e, 0x47, 0, 0, 0, 0, 1]) },
      { name: 'freight-2026.09/big.js', data: Buffer.alloc(3000, 0x61) },
      { name: '__MACOSX/freight-2026.09/._quote.js', data: Buffer.from([0, 5, 22, 7]) },
    ]);
    // Named .tar on purpose: the format comes from the bytes.
    const { file } = upload('release.tar', bytes);
    const result = await readArchive(file, { ignore: ['generated/'], limits: ingestLimits({ maxFileBytes: 2000 }) });
    expect(result.format).toBe('zip');
    expect(result.strippedFolder).toBe('freight-2026.09');
    expect(result.files.map((f) => f.path)).toEqual(['src/quote.js', 'src/stored.py']);
    expect(Buffer.from(result.files[0]!.content).equals(quote)).toBe(true);
    expect(result.skipped).toEqual([
      { path: '__MACOSX/', reason: 'macOS resource data' },
      { path: 'big.js', reason: 'larger than the size cap (3000 > 2000 bytes)' },
      { path: 'generated/', reason: 'ignored by rule "generated/"' },
      { path: 'logo.js', reason: 'binary file' },
      { path: 'node_modules/', reason: 'default ignore: node_modules/ directory' },
    ]);
    expect(result.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
    expect(result.entryCount).toBe(8);
    expect(result.archiveBytes).toBe(bytes.length);
  });

  it('checks an archive without keeping its bytes (checkOnly): the same list, skips and hash, every file empty', async () => {
    const bytes = zlib.gzipSync(buildTar([{ name: 'r/src/quote.js', data: quote }, { name: 'r/logo.js', data: Buffer.from([0x89, 0x50, 0x4e, 0x47, 0, 0, 1]) }]));
    const { file } = upload('release.tgz', bytes);
    const full = await readArchive(file);
    const checked = await readArchive(file, { checkOnly: true });
    expect(checked.files.map((f) => f.path)).toEqual(full.files.map((f) => f.path));
    expect(checked.files.map((f) => f.content.byteLength)).toEqual([0]);
    expect(full.files[0]!.content.byteLength).toBe(quote.length);
    expect(checked.skipped).toEqual(full.skipped);
    expect(checked.sha256).toBe(full.sha256);
    expect(checked.unpackedBytes).toBe(full.unpackedBytes);
  });

  it('gives the same file list for a tar.gz of a folder as readFolder gives for the folder', async () => {
    const root = path.join(work, 'checkout', 'depot-tools-2026.11');
    const put = (rel: string, content: string | Buffer) => {
      fs.mkdirSync(path.dirname(path.join(root, rel)), { recursive: true });
      fs.writeFileSync(path.join(root, rel), content);
    };
    put('checks/wagons.py', 'def axle_load(w):\n    return w / 4\n');
    put('checks/brakes.ts', 'export const brake = (p: number) => p * 2;\n');
    put('build/out.js', 'var x = 1;\n');
    put('data.bin', Buffer.from([0, 1, 2, 3, 0, 0]));
    fs.symlinkSync('/etc/hostname', path.join(root, 'checks/host.txt'));
    const archive = path.join(work, 'depot-tools.tgz');
    await tar.c({ gzip: true, file: archive, cwd: path.dirname(root) }, ['depot-tools-2026.11']);
    const fromArchive = await readArchive(archive);
    const fromFolder = await readFolder(root);
    expect(fromArchive.format).toBe('tar.gz');
    expect(fromArchive.strippedFolder).toBe('depot-tools-2026.11');
    expect(fromArchive.files).toEqual(fromFolder.files);
    expect(fromArchive.skipped).toEqual(fromFolder.skipped);
    expect(fromArchive.files.map((f) => f.path)).toEqual(['checks/brakes.ts', 'checks/wagons.py']);
  });

  it('skips links, devices and FIFOs with their reasons and never follows them', async () => {
    const outside = path.join(work, 'outside-secret.js');
    fs.writeFileSync(outside, 'function secretTariff() { return 42; }\n');
    const bytes = buildTar([
      { name: 'src/quote.js', data: quote },
      { name: 'src/secret.js', type: '2', linkname: outside },
      { name: 'src/again.js', type: '1', linkname: 'src/quote.js' },
      { name: 'dev/tty', type: '3' },
      { name: 'dev/disk', type: '4' },
      { name: 'queue', type: '6' },
    ]);
    const { file } = upload('links.tar', bytes);
    const result = await readArchive(file);
    expect(result.format).toBe('tar');
    expect(result.files.map((f) => f.path)).toEqual(['src/quote.js']);
    expect(result.skipped).toEqual([
      { path: 'dev/disk', reason: 'device file (not read)' },
      { path: 'dev/tty', reason: 'device file (not read)' },
      { path: 'queue', reason: 'named pipe (not read)' },
      { path: 'src/again.js', reason: 'hard link (not followed)' },
      { path: 'src/secret.js', reason: 'symbolic link (not followed)' },
    ]);
    expect(result.files.some((f) => Buffer.from(f.content).toString().includes('secretTariff'))).toBe(false);
  });

  it('skips a zip symbolic link (Unix mode in the external attributes) without reading its target', async () => {
    const bytes = buildZip([
      { name: 'a.js', data: quote },
      { name: 'passwd.js', data: text('/etc/passwd'), mode: 0o120777 },
    ]);
    const { file } = upload('links.zip', bytes);
    const result = await readArchive(file);
    expect(result.files.map((f) => f.path)).toEqual(['a.js']);
    expect(result.skipped).toEqual([{ path: 'passwd.js', reason: 'symbolic link (not followed)' }]);
  });

  it('deletes the uploaded file after a successful read too', async () => {
    const { file, dir } = upload('ok.zip', buildZip([{ name: 'a.js', data: quote }]));
    const result = await readUploadedArchive(file);
    expect(result.files.map((f) => f.path)).toEqual(['a.js']);
    expect(fs.readdirSync(dir)).toEqual([]);
  });
});

describe('readUploadedArchive refuses the attack corpus and leaves no file behind', () => {
  it('a zip entry that climbs out with ../', async () => {
    const error = await refused('evil.zip', buildZip([{ name: 'ok.js', data: quote }, { name: '../../etc/cron.d/evil.js', data: quote }]));
    expect(error.code).toBe('path_escapes_root');
    expect(error.message).toBe('Entry "../../etc/cron.d/evil.js" climbs out of the archive with ".."; the archive was refused.');
    expect(error.status).toBe(422);
  });

  it('a zip entry that climbs out with a backslash (..\\x)', async () => {
    const error = await refused('evil.zip', buildZip([{ name: 'src\\..\\..\\x.js', data: quote }]));
    expect(error.code).toBe('path_escapes_root');
    expect(error.message).toContain('"src\\\\..\\\\..\\\\x.js" climbs out');
  });

  it('a tar entry with an absolute path, and one with a drive letter', async () => {
    const absolute = await refused('evil.tar', buildTar([{ name: '/etc/profile.d/evil.sh', data: text('echo\n') }]));
    expect(absolute.code).toBe('path_escapes_root');
    expect(absolute.message).toBe('Entry "/etc/profile.d/evil.sh" is an absolute path; the archive was refused.');
    const drive = await refused('evil.tar', buildTar([{ name: 'C:/Windows/evil.js', data: quote }]));
    expect(drive.message).toBe('Entry "C:/Windows/evil.js" starts with a drive letter; the archive was refused.');
  });

  it('a 100,000-entry zip over a lowered entry limit, before any entry is inflated', async () => {
    const specs = Array.from({ length: 100_000 }, (_, i) => ({ name: `f/${i}.js`, data: Buffer.alloc(0), method: 0 as const }));
    const error = await refused('many.zip', buildZip(specs), ingestLimits({ maxEntries: 50_000 }));
    expect(error.code).toBe('too_many_entries');
    expect(error.message).toBe('The archive declares 100000 entries; the limit is 50000.');
    expect(error.status).toBe(413);
  });

  it('a tar with more entries than the limit, stopped at the first one over', async () => {
    const specs = Array.from({ length: 300 }, (_, i) => ({ name: `f/${i}.js`, data: text('1') }));
    const error = await refused('many.tar', buildTar(specs), ingestLimits({ maxEntries: 100 }));
    expect(error.code).toBe('too_many_entries');
    expect(error.message).toBe('The archive has more than 100 entries (stopped at "f/100.js").');
  });

  it('a 4 MiB zip whose one entry unpacks to 4 GiB of zeros, stopped by the expansion ratio early', async () => {
    // The entry declares 1,000 bytes: the reader must not believe it.
    const bytes = buildZip([{ name: 'zeros.js', deflated: deflatedZeros(4096), size: 1000, crc: 0 }]);
    expect(bytes.length).toBeLessThan(5 * MIB);
    const error = await refused('bomb.zip', bytes);
    expect(error.code).toBe('expansion_too_large');
    expect(error.message).toBe('The archive expands more than 200 times its compressed size (stopped in "zeros.js"); it looks like a decompression bomb.');
    expect(error.unpackedBytes).toBeGreaterThan(8 * MIB);
    expect(error.unpackedBytes).toBeLessThan(9 * MIB);
  });

  it('the same zip bomb against the total unpacked limit alone, stopped within a chunk of it', async () => {
    const limits = ingestLimits({ maxUnpackedBytes: 64 * MIB, maxExpansionRatio: 100_000 });
    const error = await refused('bomb.zip', buildZip([{ name: 'zeros.js', deflated: deflatedZeros(4096), size: 1000 }]), limits);
    expect(error.code).toBe('unpacked_too_large');
    expect(error.message).toBe('The archive unpacks to more than 64 MiB (stopped in "zeros.js"); it looks like a decompression bomb.');
    expect(error.unpackedBytes).toBeGreaterThan(64 * MIB);
    expect(error.unpackedBytes).toBeLessThanOrEqual(64 * MIB + 64 * 1024);
  });

  it('many small zeros files that add up past the total, each within the per-file cap', async () => {
    const entry = deflatedZeros(1);
    const specs = Array.from({ length: 40 }, (_, i) => ({ name: `blob-${i}.bin`, deflated: entry, size: MIB, crc: zlib.crc32(Buffer.alloc(MIB)) }));
    const error = await refused('bomb.zip', buildZip(specs), ingestLimits({ maxUnpackedBytes: 16 * MIB, maxExpansionRatio: 100_000 }));
    expect(error.code).toBe('unpacked_too_large');
    expect(error.message).toContain('(stopped in "blob-16.bin")');
    expect(error.unpackedBytes).toBeLessThanOrEqual(17 * MIB);
  });

  it('a tar.gz that unpacks to gigabytes of zeros, stopped while inflating', async () => {
    const header = tarHeader({ name: 'dump.sql' }, 4096 * MIB);
    const bytes = gzipAround(deflatedZeros(4096, header));
    const ratio = await refused('bomb.tgz', bytes);
    expect(ratio.code).toBe('expansion_too_large');
    expect(ratio.unpackedBytes).toBeLessThan(9 * MIB);
    const total = await refused('bomb.tgz', bytes, ingestLimits({ maxUnpackedBytes: 32 * MIB, maxExpansionRatio: 100_000 }));
    expect(total.code).toBe('unpacked_too_large');
    expect(total.message).toBe('The archive unpacks to more than 32 MiB (stopped in "dump.sql"); it looks like a decompression bomb.');
    expect(total.unpackedBytes).toBeLessThanOrEqual(32 * MIB + 64 * 1024);
  });

  it('truncated archives: zip, tar.gz, tar cut inside a file, tar without its end blocks', async () => {
    const zip = buildZip([{ name: 'a.js', data: quote }, { name: 'b.js', data: Buffer.alloc(5000, 0x62) }]);
    const cutZip = await refused('cut.zip', zip.subarray(0, zip.length - 40));
    expect(cutZip.code).toBe('corrupt_archive');
    expect(cutZip.message).toMatch(/^The zip archive is corrupt or truncated \(.+\)\.$/);

    const tgz = zlib.gzipSync(buildTar([{ name: 'a.js', data: Buffer.alloc(200_000, 0x61) }]));
    const cutTgz = await refused('cut.tgz', tgz.subarray(0, Math.floor(tgz.length / 2)));
    expect(cutTgz.code).toBe('corrupt_archive');
    expect(cutTgz.message).toBe('The tar archive is corrupt or truncated (unexpected end of file).');

    const plain = buildTar([{ name: 'a.js', data: Buffer.alloc(3000, 0x61) }]);
    const cutInside = await refused('cut.tar', plain.subarray(0, 1536));
    expect(cutInside.code).toBe('corrupt_archive');
    expect(cutInside.message).toContain('Truncated input');

    const noEnd = await refused('cut.tar', plain.subarray(0, plain.length - 1024));
    expect(noEnd.message).toBe('The tar archive is corrupt or truncated (it ends without the end-of-archive blocks).');
  });

  it('a zip entry whose bytes do not match its checksum', async () => {
    const error = await refused('bad.zip', buildZip([{ name: 'a.js', data: quote, crc: 12345 }]));
    expect(error.code).toBe('corrupt_archive');
    expect(error.message).toBe('Entry "a.js" is damaged (its checksum does not match).');
  });

  it('a text file named .zip, and one named .tar.gz', async () => {
    const zip = await refused('release.zip', text('this is a release note, not an archive\n'));
    expect(zip.code).toBe('not_an_archive');
    expect(zip.message).toBe('The file is not a zip or tar archive (its first bytes match neither); Doublet reads .zip, .tar, .tar.gz and .tgz.');
    const gz = await refused('release.tar.gz', zlib.gzipSync(text('just some gzip-compressed text\n'.repeat(40))));
    expect(gz.code).toBe('not_an_archive');
    expect(gz.message).toBe('The file is gzip-compressed but does not hold a tar archive.');
  });

  it('an encrypted zip (the encryption flag set in the local and central headers)', async () => {
    const error = await refused('locked.zip', buildZip([{ name: 'a.js', data: quote }, { name: 'secret.js', data: quote, flags: 1 }]));
    expect(error.code).toBe('encrypted_archive');
    expect(error.message).toBe('Entry "secret.js" is encrypted; Doublet reads only unencrypted archives.');
    // The flag only in the local header (the central directory says otherwise) is caught when the entry is read.
    const local = await refused('locked.zip', buildZip([{ name: 'a.js', data: quote, localFlags: 1 }]));
    expect(local.code).toBe('encrypted_archive');
    expect(local.message).toBe('Entry "a.js" is encrypted; Doublet reads only unencrypted archives.');
  });

  it('a format Doublet does not read, and an archive over the size limit', async () => {
    const bz = await refused('release.tar.bz2', Buffer.concat([text('BZh91AY&SY'), Buffer.alloc(100)]));
    expect(bz.code).toBe('unsupported_archive');
    expect(bz.message).toBe('The file is bzip2-compressed; Doublet reads .zip, .tar, .tar.gz and .tgz archives.');
    const big = await refused('big.zip', buildZip([{ name: 'a.js', data: Buffer.alloc(4000, 0x61), method: 0 }]), ingestLimits({ maxArchiveBytes: 1000 }));
    expect(big.code).toBe('archive_too_large');
    expect(big.status).toBe(413);
  });

  describe('edge cases', () => {
    it('an empty zip has no files; a lone file at the root strips nothing', async () => {
      const empty = upload('empty.zip', buildZip([]));
      expect(await readArchive(empty.file)).toMatchObject({ files: [], skipped: [], entryCount: 0 });
      const lone = upload('lone.zip', buildZip([{ name: 'quote.js', data: quote }]));
      const result = await readArchive(lone.file);
      expect(result.strippedFolder).toBeUndefined();
      expect(result.files.map((f) => f.path)).toEqual(['quote.js']);
    });

    it('normalises ./ and duplicate slashes, and keeps the later of two entries with one path', async () => {
      const bytes = buildTar([
        { name: './src//a.js', data: text('export const a = 1;\n') },
        { name: 'src/a.js', data: text('export const a = 2;\n') },
        { name: 'lib/b.js', data: text('export const b = 1;\n') },
      ]);
      const result = await readArchive(upload('dup.tar', bytes).file);
      expect(result.files.map((f) => [f.path, Buffer.from(f.content).toString()])).toEqual([
        ['lib/b.js', 'export const b = 1;\n'],
        ['src/a.js', 'export const a = 2;\n'],
      ]);
    });
  });
});
