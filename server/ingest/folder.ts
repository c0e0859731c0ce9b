import fs from 'node:fs/promises';
import path from 'node:path';
import { directorySkipReason, skipReason, DEFAULT_MAX_FILE_BYTES, type SkipOptions } from '../../analyzers';
import type { SkippedFile, SourceFile } from '../../analyzers/types';

/**
 * Reads a local folder into the analyzers' file list. Symbolic links are never followed (each is
 * reported as skipped), default-ignored and rule-ignored directories are pruned before they are
 * entered (reported once, with a trailing `/`), files over the size cap are not read at all.
 * Every other file is read and checked with skipReason; kept files and skipped ones both come
 * back sorted by path, paths relative to `root` with `/` separators.
 *
 * @example const { files, skipped } = await readFolder('/srv/checkouts/billing', { ignore: ['fixtures/'] });
 */
export async function readFolder(root: string, options: SkipOptions = {}): Promise<{ files: SourceFile[]; skipped: SkippedFile[] }> {
  const rootStat = await fs.lstat(root).catch(() => undefined);
  if (!rootStat) throw new Error(`readFolder: ${root} does not exist`);
  if (!rootStat.isDirectory()) throw new Error(`readFolder: ${root} is not a directory${rootStat.isSymbolicLink() ? ' (it is a symbolic link)' : ''}`);
  const cap = options.maxFileBytes ?? DEFAULT_MAX_FILE_BYTES;
  const files: SourceFile[] = [];
  const skipped: SkippedFile[] = [];
  const pending: string[] = [''];
  while (pending.length > 0) {
    const relativeDir = pending.pop()!;
    const entries = await fs.readdir(path.join(root, relativeDir), { withFileTypes: true });
    for (const entry of entries) {
      const relative = relativeDir ? `${relativeDir}/${entry.name}` : entry.name;
      const absolute = path.join(root, relativeDir, entry.name);
      if (entry.isSymbolicLink()) {
        skipped.push({ path: relative, reason: 'symbolic link (not followed)' });
      } else if (entry.isDirectory()) {
        const reason = directorySkipReason(relative, options);
        if (reason) skipped.push({ path: `${relative}/`, reason });
        else pending.push(relative);
      } else if (entry.isFile()) {
        const stat = await fs.stat(absolute);
        if (stat.size > cap) {
          // Same wording as skipReason, without reading a file that is too big to keep.
          const byRule = skipReason(relative, new Uint8Array(0), options);
          skipped.push({ path: relative, reason: byRule ?? `larger than the size cap (${stat.size} > ${cap} bytes)` });
          continue;
        }
        const content = new Uint8Array(await fs.readFile(absolute));
        const reason = skipReason(relative, content, options);
        if (reason) skipped.push({ path: relative, reason });
        else files.push({ path: relative, content });
      } else {
        skipped.push({ path: relative, reason: 'not a regular file' });
      }
    }
  }
  const byPath = (a: { path: string }, b: { path: string }) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0);
  return { files: files.sort(byPath), skipped: skipped.sort(byPath) };
}
