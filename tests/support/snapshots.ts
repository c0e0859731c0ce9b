import path from 'node:path';
import crypto from 'node:crypto';
import type { UpdateRepositoryInput } from '../../shared/api/repositories';
import { repositorySettings, createRepository } from '../../server/commands/createRepository';
import { loadSnapshot } from '../../server/commands/loadSnapshot';
import { snapshotFragments, clonePairsWithin } from '../../server/clone-index/snapshot-pairs';
import { readFolder } from '../../server/ingest/folder';
import { parseThreshold } from '../../server/matching/threshold';
import type { Repository } from '../../server/models/Repository';
import { buildOrganisation } from './factories';

/** Folder of small invented releases (v1, v2, v3 of a rail-freight codebase) with a few planted copies, for tests. */
export const RELEASES = path.resolve(import.meta.dirname, '../fixtures/releases/freight-platform');

/** A repository in a new organisation (or the one given), with a unique name. */
export async function buildRepository(input: UpdateRepositoryInput & { organisationId?: string } = {}): Promise<Repository> {
  const organisationId = input.organisationId ?? (await buildOrganisation()).id;
  return createRepository(organisationId, { ...input, name: input.name ?? `repo-${crypto.randomBytes(4).toString('hex')}` });
}

/** Loads a local folder as a snapshot of the repository. */
export async function loadFolder(repository: Repository, folder: string, label: string, batchSize?: number) {
  const { files, skipped } = await readFolder(folder, { ignore: repository.ignore });
  return loadSnapshot({ repository: repositorySettings(repository), label, files, skipped, batchSize });
}

/**
 * A snapshot's clone pairs as sorted "path:name:line ~ path:name:line similarity type" lines, a
 * form that does not depend on ids, so loads in different repositories can be compared.
 */
export async function describedPairs(snapshotId: number, threshold: string | number): Promise<string[]> {
  const fragments = await snapshotFragments(undefined, snapshotId);
  const pairs = await clonePairsWithin(undefined, fragments, parseThreshold(threshold));
  const name = (i: number) => `${fragments[i].path}:${fragments[i].name}:${fragments[i].startLine}`;
  return pairs
    .map((p) => [name(p.a), name(p.b)].sort().join(' ~ ') + ` ${p.similarity.toFixed(6)} ${p.type}`)
    .sort();
}
