import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import zlib from 'node:zlib';
import AdmZip from 'adm-zip';
import type { UnpackBudget } from './budget';
import { safeEntryPath } from './entry-path';
import { IngestError, quoteEntry } from './errors';
import type { FileBytes, RawEntry } from './file-list';

/** Slices fed to the streaming inflater: small enough that the ratio check reacts quickly. */
const FEED_BYTES = 64 * 1024;

const STORED = 0;
const DEFLATED = 8;

/** Unix file types in the high half of a zip entry's external attributes (common practice of Unix zip tools). */
const S_IFMT = 0o170000;
const UNIX_TYPES: Record<number, string> = {
  0o120000: 'symbolic link (not followed)',
  0o020000: 'device file (not read)',
  0o060000: 'device file (not read)',
  0o010000: 'named pipe (not read)',
  0o140000: 'socket (not read)',
};

function corrupt(message: string, entry?: string): IngestError {
  return new IngestError('corrupt_archive', message, { entry });
}

/** adm-zip's messages start with "ADM-ZIP: "; keep the reason, drop the prefix. */
function admReason(error: unknown): string {
  return (error instanceof Error ? error.message : String(error)).replace(/^ADM-ZIP:\s*/, '');
}

/**
 * Inflates one entry, counting every produced byte against the budget. A file within the cap is
 * inflated in one synchronous call bounded to the cap; one that passes the cap is inflated
 * again as a stream whose bytes are counted and dropped, so memory stays at the cap and the
 * stream stops at the first chunk past a limit. The checksum is verified either way.
 */
async function inflateEntry(entry: AdmZip.IZipEntry, name: string, budget: UnpackBudget): Promise<FileBytes> {
  let raw: Buffer;
  try {
    raw = entry.getCompressedData();
  } catch (error) {
    throw corrupt(`Entry ${quoteEntry(name)} is damaged (${admReason(error)}).`, name);
  }
  const header = entry.header as AdmZip.IZipEntry['header'] & { localHeader?: { flags?: number } };
  if (((header.localHeader?.flags ?? 0) & 1) === 1) {
    throw new IngestError('encrypted_archive', `Entry ${quoteEntry(name)} is encrypted; Doublet reads only unencrypted archives.`, { entry: name });
  }
  const cap = budget.limits.maxFileBytes;
  const checked = (size: number, crc: number, content?: Uint8Array): FileBytes => {
    if (crc >>> 0 !== header.crc >>> 0) throw corrupt(`Entry ${quoteEntry(name)} is damaged (its checksum does not match).`, name);
    return size > cap || content === undefined ? { size } : { content, size };
  };
  const base = budget.compressedBytes;
  if (header.method === STORED) {
    budget.consumedTotal(base + raw.length);
    budget.inflated(raw.length, name);
    return checked(raw.length, zlib.crc32(raw), raw.length > cap ? undefined : new Uint8Array(raw));
  }
  const remaining = budget.limits.maxUnpackedBytes - budget.unpackedBytes;
  try {
    // Throws ERR_BUFFER_TOO_LARGE only when the output would pass the bound, so a result is whole.
    const data = zlib.inflateRawSync(raw, { maxOutputLength: Math.max(1, Math.min(cap, remaining)) });
    budget.consumedTotal(base + raw.length);
    budget.inflated(data.length, name);
    return checked(data.length, zlib.crc32(data), new Uint8Array(data));
  } catch (error) {
    if (error instanceof IngestError) throw error;
    if ((error as { code?: string }).code !== 'ERR_BUFFER_TOO_LARGE') throw corrupt(`Entry ${quoteEntry(name)} is damaged (${(error as Error).message}).`, name);
  }
  let size = 0;
  let crc = 0;
  // pipeline may reject with an AbortError of its own after the sink throws: keep the real reason.
  let refusal: IngestError | undefined;
  try {
    const inflater = zlib.createInflateRaw();
    await pipeline(
      Readable.from(
        (function* () {
          for (let offset = 0; offset < raw.length; offset += FEED_BYTES) yield raw.subarray(offset, offset + FEED_BYTES);
        })(),
      ),
      inflater,
      async function (chunks: AsyncIterable<Buffer>) {
        for await (const chunk of chunks) {
          try {
            budget.consumedTotal(base + inflater.bytesWritten);
            budget.inflated(chunk.length, name);
          } catch (error) {
            refusal = error as IngestError;
            throw error;
          }
          size += chunk.length;
          crc = zlib.crc32(chunk, crc);
        }
      },
    );
  } catch (error) {
    if (refusal) throw refusal;
    if (error instanceof IngestError) throw error;
    throw corrupt(`Entry ${quoteEntry(name)} is damaged (${(error as Error).message}).`, name);
  }
  budget.consumedTotal(base + raw.length);
  return checked(size, crc);
}

/**
 * Lists a zip archive held in memory as checked entries. Everything that can refuse the archive
 * without inflating (entry count, paths, encryption, compression methods) is checked for every
 * entry before any entry is inflated; file bytes are inflated later, on demand, by `read`.
 * Links and special files (Unix modes in the external attributes) become skipped entries.
 *
 * @example const entries = readZipEntries(await fs.readFile(file), new UnpackBudget(ingestLimits()));
 */
export function readZipEntries(buffer: Buffer, budget: UnpackBudget): RawEntry[] {
  let zip: AdmZip;
  let entries: AdmZip.IZipEntry[];
  try {
    zip = new AdmZip(buffer);
    const declared = zip.getEntryCount();
    if (declared > budget.limits.maxEntries) {
      throw new IngestError('too_many_entries', `The archive declares ${declared} entries; the limit is ${budget.limits.maxEntries}.`);
    }
    entries = zip.getEntries().filter((e) => !(e as { temporary?: boolean }).temporary);
  } catch (error) {
    if (error instanceof IngestError) throw error;
    throw corrupt(`The zip archive is corrupt or truncated (${admReason(error)}).`);
  }
  const result: RawEntry[] = [];
  for (const entry of entries) {
    const name = entry.entryName;
    budget.entry(name);
    const path = safeEntryPath(name);
    if (path === undefined) continue;
    const header = entry.header;
    if (header.encrypted || (header.flags & 0x40) !== 0) {
      throw new IngestError('encrypted_archive', `Entry ${quoteEntry(name)} is encrypted; Doublet reads only unencrypted archives.`, { entry: name });
    }
    const unixType = UNIX_TYPES[(header.attr >>> 16) & S_IFMT];
    if (entry.isDirectory) result.push({ kind: 'directory', path });
    else if (unixType) result.push({ kind: 'skipped', path, reason: unixType });
    else if (header.method !== STORED && header.method !== DEFLATED) {
      throw new IngestError('unsupported_archive', `Entry ${quoteEntry(name)} uses compression method ${header.method}; Doublet reads stored and deflated zip entries.`, { entry: name });
    } else result.push({ kind: 'file', path, read: () => inflateEntry(entry, name, budget) });
  }
  return result;
}
