import { pipeline } from 'node:stream/promises';
import zlib from 'node:zlib';
import { Parser, type ReadEntry } from 'tar';
import type { UnpackBudget } from './budget';
import { isTarHeader } from './detect';
import { safeEntryPath } from './entry-path';
import { IngestError } from './errors';
import { prunedWhateverTheTop, type RawEntry } from './file-list';

const FILE_TYPES = new Set(['File', 'OldFile', 'ContiguousFile']);
const DIRECTORY_TYPES = new Set(['Directory', 'GNUDumpDir']);
const SKIPPED_TYPES: Record<string, string> = {
  SymbolicLink: 'symbolic link (not followed)',
  Link: 'hard link (not followed)',
  CharacterDevice: 'device file (not read)',
  BlockDevice: 'device file (not read)',
  FIFO: 'named pipe (not read)',
};

/** Options of readTarEntries. */
export interface TarReadOptions {
  /** The stream is gzip-compressed (a .tar.gz or .tgz); inflated bytes are what the budget counts. */
  gzip: boolean;
  budget: UnpackBudget;
}

function corrupt(reason: string): IngestError {
  return new IngestError('corrupt_archive', `The tar archive is corrupt or truncated (${reason}).`);
}

/**
 * Reads a tar stream (plain or gzip) into checked entries in one pass. Every inflated byte is
 * counted before the parser sees it, so the pass stops at the first chunk past a limit, whatever
 * the headers declare. A file's bytes are kept only up to the per-file cap (and not at all below
 * a default-ignored folder); links, devices and FIFOs become skipped entries; a path that escapes
 * the root refuses the archive. The parser is strict (a bad header checksum is an error) and an
 * archive without its end-of-archive blocks counts as truncated.
 *
 * @example const entries = await readTarEntries(fs.createReadStream(file), { gzip: true, budget });
 */
export async function readTarEntries(chunks: AsyncIterable<Buffer>, options: TarReadOptions): Promise<RawEntry[]> {
  const { budget, gzip } = options;
  const cap = budget.limits.maxFileBytes;
  // Decompression is ours (to count it): the parser must not sniff and inflate a second layer.
  const parser = new Parser({ strict: true, brotli: false, zstd: false });
  const result: RawEntry[] = [];
  let failure: unknown;
  let sawEnd = false;
  let current: string | undefined;
  parser.on('nullBlock', () => (sawEnd = true));
  parser.on('eof', () => (sawEnd = true));
  parser.on('error', (error: Error) => (failure ??= corrupt(error.message)));
  parser.on('entry', (entry: ReadEntry) => {
    if (failure !== undefined) return void entry.resume();
    try {
      current = entry.path;
      budget.entry(entry.path);
      const path = safeEntryPath(entry.path);
      if (path === undefined || DIRECTORY_TYPES.has(entry.type)) {
        if (path !== undefined) result.push({ kind: 'directory', path });
        return void entry.resume();
      }
      if (!FILE_TYPES.has(entry.type)) {
        result.push({ kind: 'skipped', path, reason: SKIPPED_TYPES[entry.type] ?? `unsupported tar entry type ${entry.type} (not read)` });
        return void entry.resume();
      }
      const keep = !prunedWhateverTheTop(path);
      const parts: Uint8Array[] = [];
      let size = 0;
      // Copies, so a kept file does not pin the much larger chunk it was cut from.
      entry.on('data', (chunk: Buffer) => {
        size += chunk.length;
        if (keep && size <= cap) parts.push(new Uint8Array(chunk));
      });
      result.push({
        kind: 'file',
        path,
        read: async () => (keep && size <= cap ? { content: new Uint8Array(Buffer.concat(parts)), size } : { size }),
      });
    } catch (error) {
      failure ??= error;
      entry.resume();
    }
  });

  let head: Buffer | undefined = gzip ? Buffer.alloc(0) : undefined;
  // pipeline may reject with an AbortError of its own after the sink throws: keep the real reason.
  let refusal: unknown;
  const feed = (chunk: Buffer) => {
    if (head !== undefined) {
      // A gzip file must hold a tar: check its first block before the parser reads anything.
      head = Buffer.concat([head, chunk]);
      if (head.length < 512) return;
      if (!isTarHeader(head.subarray(0, 512))) throw new IngestError('not_an_archive', 'The file is gzip-compressed but does not hold a tar archive.');
      chunk = head;
      head = undefined;
    }
    parser.write(chunk);
    if (failure !== undefined) throw failure;
  };
  try {
    if (gzip) {
      const gunzip = zlib.createGunzip();
      await pipeline(chunks, gunzip, async function (inflated: AsyncIterable<Buffer>) {
        for await (const chunk of inflated) {
          try {
            budget.consumedTotal(gunzip.bytesWritten);
            budget.inflated(chunk.length, current);
            feed(chunk);
          } catch (error) {
            refusal = error;
            throw error;
          }
        }
      });
    } else {
      let read = 0;
      for await (const chunk of chunks) {
        read += chunk.length;
        budget.consumedTotal(read);
        budget.inflated(chunk.length, current);
        feed(chunk);
      }
    }
  } catch (error) {
    if (refusal !== undefined) throw refusal;
    if (error instanceof IngestError) throw error;
    throw corrupt((error as Error).message);
  }
  if (head !== undefined) throw new IngestError('not_an_archive', 'The file is gzip-compressed but does not hold a tar archive.');
  await new Promise<void>((resolve) => {
    parser.once('end', resolve);
    parser.once('error', () => resolve());
    parser.end();
  });
  if (failure !== undefined) throw failure;
  if (!sawEnd) throw corrupt('it ends without the end-of-archive blocks');
  return result;
}
