import { IngestError, quoteEntry } from './errors';

/**
 * The relative, `/`-separated path of an archive entry, or undefined for the root itself (`./`).
 * Backslashes count as separators (Windows tools write them, and `..\x` must not slip through),
 * `.` and empty segments are dropped. Throws `path_escapes_root` for a NUL byte, an absolute path,
 * a Windows drive letter or UNC prefix, or any `..` segment: such an archive is refused whole
 * rather than repaired, since no honest tool writes one.
 *
 * @example safeEntryPath('./pkg\\src/a.js') // 'pkg/src/a.js'
 * @example safeEntryPath('../etc/passwd')   // throws IngestError('path_escapes_root')
 */
export function safeEntryPath(raw: string): string | undefined {
  const refuse = (why: string) =>
    new IngestError('path_escapes_root', `Entry ${quoteEntry(raw)} ${why}; the archive was refused.`, { entry: raw });
  if (raw.includes('\0')) throw refuse('contains a NUL byte');
  const unified = raw.replace(/\\/g, '/');
  if (unified.startsWith('/')) throw refuse('is an absolute path');
  if (/^[A-Za-z]:/.test(unified)) throw refuse('starts with a drive letter');
  const segments = unified.split('/').filter((s) => s !== '' && s !== '.');
  if (segments.includes('..')) throw refuse('climbs out of the archive with ".."');
  return segments.length === 0 ? undefined : segments.join('/');
}
