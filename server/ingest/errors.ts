import { HttpError } from '../errors';

/** Why an archive, a git tree or a remote was refused; one code a problem, stable for the API. */
export type IngestErrorCode =
  | 'archive_too_large'
  | 'unpacked_too_large'
  | 'expansion_too_large'
  | 'too_many_entries'
  | 'path_escapes_root'
  | 'corrupt_archive'
  | 'encrypted_archive'
  | 'unsupported_archive'
  | 'not_an_archive'
  | 'unsafe_remote'
  | 'git_failed';

/** Limits are 413 (the content is too big), a refused remote is 400, every other problem 422. */
function statusFor(code: IngestErrorCode): number {
  if (code === 'archive_too_large' || code === 'unpacked_too_large' || code === 'expansion_too_large' || code === 'too_many_entries') return 413;
  if (code === 'unsafe_remote') return 400;
  return 422;
}

/**
 * A refused upload or git import. The message names the problem and, when there is one, the entry
 * (a path inside the archive, never file content); `unpackedBytes` is how far unpacking got, so a
 * caller (and the tests) can see that a bomb was stopped early.
 *
 * @example throw new IngestError('path_escapes_root', 'Entry "../x.js" points outside the archive.', { entry: '../x.js' })
 */
export class IngestError extends HttpError {
  readonly entry?: string;
  readonly unpackedBytes?: number;

  constructor(readonly code: IngestErrorCode, message: string, details: { entry?: string; unpackedBytes?: number } = {}) {
    super(statusFor(code), code, message, code === 'unsafe_remote' ? 'remote' : 'archive');
    this.name = 'IngestError';
    this.entry = details.entry;
    this.unpackedBytes = details.unpackedBytes;
  }
}

/** An entry name as it may appear in a message: quoted, control characters escaped, at most 200 characters. */
export function quoteEntry(name: string): string {
  return JSON.stringify(name.length > 200 ? `${name.slice(0, 200)}…` : name);
}
