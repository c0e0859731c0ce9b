import { DEFAULT_IGNORED_DIRECTORIES, directorySkipReason, skipReason, type SkipOptions } from '../../analyzers/skip';
import type { SkippedFile, SourceFile } from '../../analyzers/types';

/** A regular file's bytes, or only its size when it is over the per-file cap (the bytes were counted and dropped). */
export type FileBytes = { content: Uint8Array; size: number } | { content?: undefined; size: number };

/**
 * One entry of an archive or git tree after its path was checked (see safeEntryPath). A file's
 * bytes come from `read`, called only for files no folder rule prunes, so a zip never inflates
 * what would be thrown away.
 */
export type RawEntry =
  | { kind: 'file'; path: string; read: () => Promise<FileBytes> }
  | { kind: 'directory'; path: string }
  | { kind: 'skipped'; path: string; reason: string };

/** How to turn entries into a file list. */
export interface FileListOptions extends SkipOptions {
  /** Drop the one folder every entry sits in (archives of a repository usually have one). Default true. */
  stripTopFolder?: boolean;
  /**
   * Read and check every file but keep none of its bytes (the files come back empty): checking an
   * upload before it is queued costs the unpacking, not the memory of the whole release.
   */
  checkOnly?: boolean;
}

/** The reader's result, in the shape readFolder gives: paths relative, `/`-separated, sorted. */
export interface FileList {
  files: SourceFile[];
  skipped: SkippedFile[];
  /** The single top-level folder that was stripped, if any. */
  strippedFolder?: string;
}

const NO_BYTES = new Uint8Array(0);

/** macOS's archiver adds `__MACOSX/` (resource forks) beside the real folder; it is never code. */
const MAC_RESOURCES = '__MACOSX';

function isMacResource(path: string): boolean {
  return path === MAC_RESOURCES || path.startsWith(`${MAC_RESOURCES}/`);
}

/** The folder every entry sits in, when there is exactly one and no file lies beside it. */
function singleTopFolder(entries: readonly RawEntry[]): string | undefined {
  let top: string | undefined;
  for (const entry of entries) {
    if (isMacResource(entry.path)) continue;
    const slash = entry.path.indexOf('/');
    if (slash < 0 && entry.kind !== 'directory') return undefined;
    const name = slash < 0 ? entry.path : entry.path.slice(0, slash);
    if (top === undefined) top = name;
    else if (top !== name) return undefined;
  }
  return top;
}

/**
 * True when a default-ignored folder (node_modules, dist…) sits below the first segment of a path:
 * whether or not the top folder is stripped later, the file will be pruned, so a streaming reader
 * need not keep its bytes.
 */
export function prunedWhateverTheTop(path: string): boolean {
  const segments = path.split('/');
  for (let i = 1; i < segments.length - 1; i++) if (DEFAULT_IGNORED_DIRECTORIES.has(segments[i]!)) return true;
  return false;
}

/**
 * Turns checked entries into the analyzers' file list with the same rules readFolder applies:
 * a pruned folder is reported once (trailing `/`) and nothing below it is read, a file over the
 * size cap is reported with its size, every other file goes through skipReason. A later entry with
 * the same path replaces an earlier one (as unpacking would). `__MACOSX/` is reported and dropped.
 *
 * @example const { files, skipped } = await buildFileList(entries, { ignore: repository.ignore });
 */
export async function buildFileList(entries: readonly RawEntry[], options: FileListOptions = {}): Promise<FileList> {
  const top = options.stripTopFolder === false ? undefined : singleTopFolder(entries);
  const latest = new Map<string, RawEntry>();
  for (const entry of entries) {
    let path = entry.path;
    if (top !== undefined) {
      if (path === top || isMacResource(path)) {
        if (path !== top) latest.set(path, entry);
        continue;
      }
      path = path.slice(top.length + 1);
    }
    latest.set(path, { ...entry, path });
  }
  const files: SourceFile[] = [];
  const skipped = new Map<string, string>();
  const pruned = new Map<string, string | undefined>();
  const prunedAncestor = (path: string): string | undefined => {
    const segments = path.split('/');
    for (let i = 1; i < segments.length; i++) {
      const dir = segments.slice(0, i).join('/');
      if (!pruned.has(dir)) pruned.set(dir, isMacResource(dir) ? 'macOS resource data' : directorySkipReason(dir, options));
      const reason = pruned.get(dir);
      if (reason) {
        skipped.set(`${dir}/`, reason);
        return dir;
      }
    }
    return undefined;
  };
  const cap = options.maxFileBytes;
  for (const [path, entry] of latest) {
    if (entry.kind === 'directory' || prunedAncestor(path) !== undefined) continue;
    if (entry.kind === 'skipped') {
      skipped.set(path, entry.reason);
      continue;
    }
    const bytes = await entry.read();
    if (bytes.content === undefined) {
      // Same wording as readFolder for a file too big to keep.
      skipped.set(path, skipReason(path, new Uint8Array(0), options) ?? `larger than the size cap (${bytes.size} > ${cap} bytes)`);
      continue;
    }
    const reason = skipReason(path, bytes.content, options);
    if (reason) skipped.set(path, reason);
    else files.push({ path, content: options.checkOnly ? NO_BYTES : bytes.content });
  }
  const byPath = (a: { path: string }, b: { path: string }) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0);
  return {
    files: files.sort(byPath),
    skipped: [...skipped].map(([path, reason]) => ({ path, reason })).sort(byPath),
    ...(top === undefined ? {} : { strippedFolder: top }),
  };
}
