import { createHash } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';
import ignore from 'ignore';
import * as tar from 'tar';
import { directorySkipReason } from '../../analyzers/skip';
import type { SkippedFile } from '../../analyzers/types';

/** Options of packFolder. */
export interface PackOptions {
  /** The repository's ignore list, in gitignore syntax: matching files and folders are left out. */
  ignore?: string[];
  /**
   * Also leave out the folders the analyzers never read (node_modules, dist, vendor…). Default
   * true: the server would skip them anyway, and they are often most of a checkout's bytes.
   */
  leaveOutDefaultIgnored?: boolean;
}

/** What packFolder wrote. */
export interface PackResult {
  /** Paths packed, relative to the folder, sorted. */
  files: string[];
  /** What was left out and why (folders once, with a trailing `/`). */
  leftOut: SkippedFile[];
  bytes: number;
  /** sha-256 of the archive: the same tree packs to the same bytes, so a re-push is recognised. */
  sha256: string;
}

/**
 * A link cache that never remembers: tar would otherwise write the second path of a hard-linked
 * file as a hard-link entry, which the server skips, losing that path's content.
 */
class NoLinkCache extends Map<`${number}:${number}`, string> {
  override set(): this {
    return this;
  }
}

/**
 * Packs a folder into a gzip-compressed tar for `doublet push`: `.git` (folder or file), the
 * ignore list's matches and, by default, the analyzers' ignored folders are left out; symbolic
 * links are left out and never followed; sockets and other special files too. Entries are sorted
 * and carry a fixed time, so packing an unchanged tree twice gives the same bytes.
 *
 * @example const packed = await packFolder('.', '/tmp/push-1234.tgz', { ignore: ['fixtures/'] });
 */
export async function packFolder(root: string, out: string, options: PackOptions = {}): Promise<PackResult> {
  const rootStat = await fs.lstat(root).catch(() => undefined);
  if (!rootStat?.isDirectory()) throw new Error(`packFolder: ${root} is not a folder`);
  const rules = ignore().add(options.ignore ?? []);
  const leaveOutDefaults = options.leaveOutDefaultIgnored !== false;
  const files: string[] = [];
  const leftOut: SkippedFile[] = [];
  const pending: string[] = [''];
  while (pending.length > 0) {
    const dir = pending.pop()!;
    for (const entry of await fs.readdir(path.join(root, dir), { withFileTypes: true })) {
      const relative = dir ? `${dir}/${entry.name}` : entry.name;
      if (entry.name === '.git') leftOut.push({ path: entry.isDirectory() ? `${relative}/` : relative, reason: 'version control data' });
      else if (entry.isSymbolicLink()) leftOut.push({ path: relative, reason: 'symbolic link (not followed)' });
      else if (entry.isDirectory()) {
        const byRule = rules.test(`${relative}/`);
        const reason = byRule.ignored ? `ignored by rule "${byRule.rule?.pattern ?? '?'}"` : leaveOutDefaults ? directorySkipReason(relative) : undefined;
        if (reason) leftOut.push({ path: `${relative}/`, reason });
        else pending.push(relative);
      } else if (entry.isFile()) {
        const byRule = rules.test(relative);
        if (byRule.ignored) leftOut.push({ path: relative, reason: `ignored by rule "${byRule.rule?.pattern ?? '?'}"` });
        else files.push(relative);
      } else leftOut.push({ path: relative, reason: 'not a regular file' });
    }
  }
  const byPath = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
  files.sort(byPath);
  leftOut.sort((a, b) => byPath(a.path, b.path));
  try {
    await tar.c(
      { gzip: true, file: out, cwd: root, portable: true, mtime: new Date(0), noDirRecurse: true, follow: false, linkCache: new NoLinkCache() },
      files,
    );
  } catch (error) {
    // A half-written archive must not be mistaken for a whole one (or left behind).
    await fs.rm(out, { force: true });
    throw error;
  }
  const bytes = await fs.readFile(out);
  return { files, leftOut, bytes: bytes.length, sha256: createHash('sha256').update(bytes).digest('hex') };
}
