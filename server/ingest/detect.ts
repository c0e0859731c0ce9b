import fs from 'node:fs/promises';
import { IngestError } from './errors';

/** The archive formats Doublet reads. */
export type ArchiveFormat = 'zip' | 'tar' | 'tar.gz';

const BLOCK = 512;

/**
 * True when a 512-byte block is a tar header: the POSIX `ustar` magic at offset 257, or (for old
 * v7 archives without it) a valid header checksum, the sum of the block's bytes with the checksum
 * field read as spaces (both from the POSIX tar format).
 */
export function isTarHeader(block: Uint8Array): boolean {
  if (block.length < BLOCK) return false;
  if (String.fromCharCode(...block.subarray(257, 262)) === 'ustar') return true;
  const field = String.fromCharCode(...block.subarray(148, 156)).replace(/[\0 ]+$/, '').trim();
  if (!/^[0-7]{1,7}$/.test(field)) return false;
  let sum = 0;
  for (let i = 0; i < BLOCK; i++) sum += i >= 148 && i < 156 ? 0x20 : block[i]!;
  return sum === parseInt(field, 8) && block[0] !== 0;
}

/** Formats recognised by their first bytes only to name them in the refusal (common file signatures). */
const OTHER_FORMATS: Array<[string, number[]]> = [
  ['bzip2', [0x42, 0x5a, 0x68]],
  ['xz', [0xfd, 0x37, 0x7a, 0x58, 0x5a, 0x00]],
  ['zstd', [0x28, 0xb5, 0x2f, 0xfd]],
  ['7-Zip', [0x37, 0x7a, 0xbc, 0xaf, 0x27, 0x1c]],
  ['RAR', [0x52, 0x61, 0x72, 0x21, 0x1a, 0x07]],
];

const startsWith = (head: Uint8Array, magic: number[]) => magic.every((byte, i) => head[i] === byte);

/**
 * The format of an archive by its content, never its name: `PK\3\4` (or `PK\5\6`, an empty zip)
 * is zip, `1f 8b` is gzip (taken to hold a tar; the tar reader checks its first block), a valid
 * tar header is tar. Anything else is refused with `not_an_archive` (or `unsupported_archive` for
 * a compressed format Doublet does not read).
 *
 * @example await detectArchiveFormat('/tmp/upload-1234') // 'tar.gz'
 */
export async function detectArchiveFormat(file: string): Promise<ArchiveFormat> {
  const handle = await fs.open(file, 'r');
  let head: Uint8Array;
  try {
    const buffer = Buffer.alloc(BLOCK);
    const { bytesRead } = await handle.read(buffer, 0, BLOCK, 0);
    head = buffer.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
  if (startsWith(head, [0x50, 0x4b, 0x03, 0x04]) || startsWith(head, [0x50, 0x4b, 0x05, 0x06])) return 'zip';
  if (startsWith(head, [0x1f, 0x8b])) return 'tar.gz';
  if (isTarHeader(head)) return 'tar';
  const other = OTHER_FORMATS.find(([, magic]) => startsWith(head, magic));
  if (other) throw new IngestError('unsupported_archive', `The file is ${other[0]}-compressed; Doublet reads .zip, .tar, .tar.gz and .tgz archives.`);
  throw new IngestError('not_an_archive', 'The file is not a zip or tar archive (its first bytes match neither); Doublet reads .zip, .tar, .tar.gz and .tgz.');
}
