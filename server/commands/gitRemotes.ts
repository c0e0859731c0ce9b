import fs from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadConfig } from '../config';
import { ValidationError } from '../errors';
import { IngestError } from '../ingest/errors';
import { parseGitRemote, type GitRemote } from '../ingest/git';

/**
 * Where a repository's git mirror lives: a folder of its own under the cache, so repositories
 * (and organisations) never share fetched objects, and deleting one deletes its mirror.
 */
export function repositoryGitCacheDir(repositoryId: number): string {
  return path.join(loadConfig().ingest.gitCacheDir, `repository-${repositoryId}`);
}

/** Deletes a repository's mirror (nothing happens when there is none). */
export async function deleteGitMirror(repositoryId: number): Promise<void> {
  await fs.rm(repositoryGitCacheDir(repositoryId), { recursive: true, force: true });
}

function refuse(message: string): ValidationError {
  return new ValidationError(`remoteUrl: ${message}`, 'remoteUrl');
}

const NO_CREDENTIALS =
  'Doublet does not store credentials. Give the URL without them and let the server authenticate: ' +
  'a git credential helper or a read-only deploy token in its configuration for https://, a deploy ssh key for ssh://.';

/**
 * Checks a remote a repository may be linked to, and returns it parsed. On top of the transport
 * rules of parseGitRemote: no credentials anywhere in the URL (user name or password in an
 * https:// URL, a password in an ssh:// one, a query string that could hold a token), and a local
 * path only inside a folder the operator listed in DOUBLET_GIT_LOCAL_ROOTS (outside the data
 * directory, so one repository cannot read another's mirror). Throws a 400 on `remoteUrl`.
 *
 * @example checkRemote('https://git.brackenfold.example/freight-platform.git').kind // 'https'
 */
export function checkRemote(url: string): GitRemote {
  let remote: GitRemote;
  try {
    remote = parseGitRemote(url);
  } catch (error) {
    if (error instanceof IngestError) throw refuse(error.message);
    throw error;
  }
  const text = url.trim();
  if (remote.kind === 'https' || (remote.kind === 'ssh' && text.toLowerCase().startsWith('ssh://'))) {
    const parsed = new URL(text);
    if (parsed.password !== '' || (remote.kind === 'https' && parsed.username !== '')) {
      throw refuse(`the URL carries credentials (shown here as ${remote.display}). ${NO_CREDENTIALS}`);
    }
    if (parsed.search !== '' || parsed.hash !== '') throw refuse(`a remote URL has no query string or fragment (they can carry tokens). ${NO_CREDENTIALS}`);
  } else if (remote.kind === 'ssh' && /@.*:.*@|^[^@]*:[^/]*@/.test(text)) {
    // user:password@host:path reads as host "user" with a path holding "@": refuse it.
    throw refuse(`the address looks like it holds a password. ${NO_CREDENTIALS}`);
  }
  if (remote.kind === 'local') checkLocalPath(text.toLowerCase().startsWith('file:') ? fileURLToPath(text) : text);
  return remote;
}

function inside(folder: string, candidate: string): boolean {
  const relative = path.relative(folder, candidate);
  return relative === '' || (!relative.startsWith('..') && !path.isAbsolute(relative));
}

function checkLocalPath(local: string, real?: { roots: string[]; dataDir: string; cacheDir: string }): void {
  const config = loadConfig();
  const { ingest } = config;
  const { roots, dataDir, cacheDir } = real ?? { roots: ingest.gitLocalRoots, dataDir: config.dataDir, cacheDir: ingest.gitCacheDir };
  const resolved = path.resolve(local);
  if (roots.length === 0) {
    throw refuse('local paths are not enabled on this server. The operator lists the folders that hold git mirrors in DOUBLET_GIT_LOCAL_ROOTS.');
  }
  if (inside(dataDir, resolved) || inside(cacheDir, resolved)) throw refuse("a path inside Doublet's own data folder cannot be linked.");
  if (!roots.some((root) => inside(root, resolved))) {
    throw refuse(`a local path must be inside one of the folders listed in DOUBLET_GIT_LOCAL_ROOTS (${ingest.gitLocalRoots.join(', ')}).`);
  }
}

/**
 * The same check at import time, on the real path (a link made before an operator changed
 * DOUBLET_GIT_LOCAL_ROOTS, or a symbolic link pointing elsewhere, is refused then).
 */
export async function checkRemoteForImport(url: string): Promise<GitRemote> {
  const remote = checkRemote(url);
  if (remote.kind === 'local') {
    const text = url.trim();
    const local = text.toLowerCase().startsWith('file:') ? fileURLToPath(text) : text;
    const real = await fs.realpath(local).catch(() => {
      throw refuse(`there is no folder at ${local} on the server.`);
    });
    // Compare real paths with real paths (a root may itself sit behind a symbolic link).
    const { ingest, dataDir } = loadConfig();
    const realOrSame = (folder: string) => fs.realpath(folder).catch(() => folder);
    checkLocalPath(real, {
      roots: await Promise.all(ingest.gitLocalRoots.map(realOrSame)),
      dataDir: await realOrSame(dataDir),
      cacheDir: await realOrSame(ingest.gitCacheDir),
    });
  }
  return remote;
}
