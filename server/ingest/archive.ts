import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import fs from 'node:fs/promises';
import { UnpackBudget } from './budget';
import { detectArchiveFormat, type ArchiveFormat } from './detect';
import { IngestError } from './errors';
import { buildFileList, type FileList, type FileListOptions } from './file-list';
import { ingestLimits, type IngestLimits } from './limits';
import { readTarEntries } from './tar';
import { readZipEntries } from './zip';

/** Options of readArchive: the repository's ignore list, the limits, whether to strip the top folder. */
export interface ArchiveReadOptions extends Omit<FileListOptions, 'maxFileBytes'> {
  /** Defaults to ingestLimits() (configuration); a test or a caller may tighten any of them. */
  limits?: IngestLimits;
}

/** An archive read into the analyzers' file list, with what it cost. */
export interface ArchiveContents extends FileList {
  format: ArchiveFormat;
  /** sha-256 of the archive file, hex: the same upload twice has the same one. */
  sha256: string;
  archiveBytes: number;
  unpackedBytes: number;
  entryCount: number;
}

/**
 * Reads an archive file (zip, tar, tar.gz; told apart by content, not name) into the file list
 * readFolder gives, under the configured limits, and hashes it on the way. A zip is held in memory
 * whole (adm-zip reads it so; the archive size limit bounds it); a tar is streamed. Never writes a
 * file. Refusals are IngestErrors naming the problem and the entry.
 *
 * @example const { files, skipped, sha256 } = await readArchive('/tmp/upload-1234', { ignore: repository.ignore });
 */
export async function readArchive(file: string, options: ArchiveReadOptions = {}): Promise<ArchiveContents> {
  const limits = options.limits ?? ingestLimits();
  const { size } = await fs.stat(file);
  if (size > limits.maxArchiveBytes) {
    throw new IngestError('archive_too_large', `The archive is ${size} bytes; the limit is ${limits.maxArchiveBytes} bytes.`);
  }
  const format = await detectArchiveFormat(file);
  const budget = new UnpackBudget(limits);
  const hash = createHash('sha256');
  let entries;
  let archiveBytes = 0;
  if (format === 'zip') {
    const buffer = await fs.readFile(file);
    archiveBytes = buffer.length;
    hash.update(buffer);
    entries = readZipEntries(buffer, budget);
  } else {
    const hashed = async function* () {
      for await (const chunk of createReadStream(file, { highWaterMark: 64 * 1024 })) {
        archiveBytes += (chunk as Buffer).length;
        // The file is ours (an upload's temp file), but it is read twice (detect, then here): check again.
        if (archiveBytes > limits.maxArchiveBytes) throw new IngestError('archive_too_large', `The archive is over the limit of ${limits.maxArchiveBytes} bytes.`);
        hash.update(chunk as Buffer);
        yield chunk as Buffer;
      }
    };
    entries = await readTarEntries(hashed(), { gzip: format === 'tar.gz', budget });
  }
  const list = await buildFileList(entries, { ...options, maxFileBytes: limits.maxFileBytes });
  return { ...list, format, sha256: hash.digest('hex'), archiveBytes, unpackedBytes: budget.unpackedBytes, entryCount: budget.entries };
}

/**
 * readArchive for an upload's temporary file, which is deleted afterwards whatever happens
 * (success, refusal or any other error), so a refused upload leaves nothing behind.
 *
 * @example const contents = await readUploadedArchive(req.file.path, { ignore: repository.ignore });
 */
export async function readUploadedArchive(file: string, options: ArchiveReadOptions = {}): Promise<ArchiveContents> {
  try {
    return await readArchive(file, options);
  } finally {
    await fs.rm(file, { force: true });
  }
}
