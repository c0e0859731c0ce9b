import { IngestError, quoteEntry } from './errors';
import { EXPANSION_FLOOR_BYTES, type IngestLimits } from './limits';

function mib(bytes: number): string {
  return `${(bytes / 1024 / 1024).toFixed(bytes < 10 * 1024 * 1024 ? 1 : 0)} MiB`;
}

/**
 * Counts what reading one archive has cost so far and throws the moment a limit is passed, so a
 * reader calls it on every inflated chunk and stops there. Counts are of bytes actually produced,
 * never of sizes an archive declares.
 */
export class UnpackBudget {
  entries = 0;
  unpackedBytes = 0;
  compressedBytes = 0;

  constructor(readonly limits: IngestLimits) {}

  /** One more entry (file, folder or link); throws `too_many_entries` past the limit. */
  entry(name: string): void {
    this.entries++;
    if (this.entries > this.limits.maxEntries) {
      throw new IngestError('too_many_entries', `The archive has more than ${this.limits.maxEntries} entries (stopped at ${quoteEntry(name)}).`, {
        entry: name,
        unpackedBytes: this.unpackedBytes,
      });
    }
  }

  /**
   * Compressed bytes an inflater has taken in so far (the denominator of the expansion ratio).
   * Read from the inflater itself (`bytesWritten`), not from what was handed to it: a stream
   * buffers input ahead, and counting that would let a bomb run further before it is judged.
   */
  consumedTotal(bytes: number): void {
    this.compressedBytes = bytes;
  }

  /** Bytes an inflater produced; throws `unpacked_too_large` or `expansion_too_large`. */
  inflated(bytes: number, name: string | undefined): void {
    this.unpackedBytes += bytes;
    const where = name === undefined ? '' : ` (stopped in ${quoteEntry(name)})`;
    if (this.unpackedBytes > this.limits.maxUnpackedBytes) {
      throw new IngestError(
        'unpacked_too_large',
        `The archive unpacks to more than ${mib(this.limits.maxUnpackedBytes)}${where}; it looks like a decompression bomb.`,
        { entry: name, unpackedBytes: this.unpackedBytes },
      );
    }
    if (this.unpackedBytes > EXPANSION_FLOOR_BYTES && this.unpackedBytes > this.compressedBytes * this.limits.maxExpansionRatio) {
      throw new IngestError(
        'expansion_too_large',
        `The archive expands more than ${this.limits.maxExpansionRatio} times its compressed size${where}; it looks like a decompression bomb.`,
        { entry: name, unpackedBytes: this.unpackedBytes },
      );
    }
  }
}
