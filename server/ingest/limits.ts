import { DEFAULT_MAX_FILE_BYTES } from '../../analyzers/skip';
import { loadConfig } from '../config';

/** Bounds on what one archive or git tree may cost to read. */
export interface IngestLimits {
  /** Size of the archive file itself. */
  maxArchiveBytes: number;
  /** Bytes actually inflated (counted while unpacking, whatever the headers declare). */
  maxUnpackedBytes: number;
  /** Entries of every kind: files, folders, links. */
  maxEntries: number;
  /** Unpacked bytes per compressed byte, judged once more than EXPANSION_FLOOR_BYTES are unpacked. */
  maxExpansionRatio: number;
  /** The analyzers' per-file cap: a bigger file is skipped, its bytes still count as unpacked. */
  maxFileBytes: number;
}

/**
 * Below this many unpacked bytes the expansion ratio is not judged: a small file of repeated
 * lines may legitimately compress a thousand times.
 */
export const EXPANSION_FLOOR_BYTES = 8 * 1024 * 1024;

/**
 * The limits from configuration (`DOUBLET_MAX_*` variables) with the analyzers' per-file cap.
 *
 * @example const limits = { ...ingestLimits(), maxEntries: 10 }; // a test's tighter bound
 */
export function ingestLimits(overrides: Partial<IngestLimits> = {}): IngestLimits {
  const { maxArchiveBytes, maxUnpackedBytes, maxEntries, maxExpansionRatio } = loadConfig().ingest;
  return { maxArchiveBytes, maxUnpackedBytes, maxEntries, maxExpansionRatio, maxFileBytes: DEFAULT_MAX_FILE_BYTES, ...overrides };
}
