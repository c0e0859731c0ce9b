import crypto from 'node:crypto';
import { describe, expect, it } from 'vitest';
import type { SourceFile } from '../../../analyzers/types';
import type { LoadPhase } from '../../../shared/api/snapshots';
import { repositorySettings } from '../../../server/commands/createRepository';
import { deleteRepository } from '../../../server/commands/deleteRepository';
import { loadSnapshot } from '../../../server/commands/loadSnapshot';
import { lockIndex, select } from '../../../server/clone-index/sql';
import { crossPairsOfLatest } from '../../../server/queries/cross-classes';
import { db } from '../../../server/db/connection';
import { lockContents } from '../../../server/queries/files';
import { readFolder } from '../../../server/ingest';
import type { Repository } from '../../../server/models/Repository';
import { buildOrganisation, buildRepository, describedPairs, RELEASES, useDatabase } from '../../support';

useDatabase();

/**
 * A demo release whose every file ends with a comment of its own, so that its texts and analyses
 * are this test's alone (a comment changes no fragment, line or shingle).
 */
async function saltedRelease(version: string, salt: string): Promise<SourceFile[]> {
  const { files } = await readFolder(`${RELEASES}/${version}`);
  return files.map((f) => ({ path: f.path, content: Buffer.concat([Buffer.from(f.content), Buffer.from(`\n// ${salt}\n`)]) }));
}

async function storedTexts(salt: string): Promise<number> {
  const [row] = await select<{ n: string }>(undefined, 'select count(*) as n from file_contents where text like $1', [`%${salt}%`]);
  return Number(row.n);
}

const load = (repository: Repository, label: string, files: SourceFile[], onPhase?: (phase: LoadPhase) => void) =>
  loadSnapshot({ repository: repositorySettings(repository), label, files }, { onProgress: (p) => onPhase?.(p.phase) });

describe('loads at the same time as other work', () => {
  it('finishes a load whose stored texts another repository\'s deletion removed while it was analysing, with the same pairs', async () => {
    const salt = `shared-${crypto.randomBytes(6).toString('hex')}`;
    const files = await saltedRelease('v1', salt);
    const first = await buildRepository();
    const loadedFirst = await load(first, 'v1', files);
    const expected = await describedPairs(loadedFirst.snapshotId, first.threshold);
    expect(expected.length).toBeGreaterThan(0);

    // Hold the index lock, so the second load stops at its index step, after it has found the
    // first repository's texts and analyses and meant to reuse them.
    let release!: () => void;
    const released = new Promise<void>((resolve) => (release = resolve));
    let locked!: () => void;
    const holding = new Promise<void>((resolve) => (locked = resolve));
    const holder = db().transaction(async (tx) => {
      await lockIndex(tx);
      locked();
      await released;
    });
    await holding;

    const second = await buildRepository();
    const phases: LoadPhase[] = [];
    let indexing!: () => void;
    const reachedIndex = new Promise<void>((resolve) => (indexing = resolve));
    const loading = load(second, 'v1', files, (phase) => {
      phases.push(phase);
      if (phase === 'indexing') indexing();
    });
    await reachedIndex;

    // The only repository holding those texts is deleted now: texts and analyses go with it.
    await deleteRepository(first);
    expect(await storedTexts(salt)).toBe(0);
    release();
    await holder;

    const result = await loading;
    const [snapshot] = await select<{ status: string }>(undefined, 'select status from snapshots where id = $1', [result.snapshotId]);
    expect(snapshot.status).toBe('ready');
    // It analysed the files again (they were gone) and stored their texts anew.
    expect(result.analyzedFileCount).toBeGreaterThan(0);
    expect(await storedTexts(salt)).toBe(files.length);
    expect(await describedPairs(result.snapshotId, second.threshold)).toEqual(expected);
  }, 120_000);

  it('gives two loads running at once the pairs each has alone', async () => {
    const salt = crypto.randomBytes(6).toString('hex');
    const [v1, v2, v1Again, v2Again] = await Promise.all([
      saltedRelease('v1', `together-${salt}`),
      saltedRelease('v2', `together-${salt}`),
      saltedRelease('v1', `alone-${salt}`),
      saltedRelease('v2', `alone-${salt}`),
    ]);
    const [a, b, c, d] = await Promise.all([buildRepository(), buildRepository(), buildRepository(), buildRepository()]);
    const [together1, together2] = await Promise.all([load(a, 'v1', v1), load(b, 'v2', v2)]);
    const alone1 = await load(c, 'v1', v1Again);
    const alone2 = await load(d, 'v2', v2Again);
    expect(await describedPairs(together1.snapshotId, a.threshold)).toEqual(await describedPairs(alone1.snapshotId, c.threshold));
    expect(await describedPairs(together2.snapshotId, b.threshold)).toEqual(await describedPairs(alone2.snapshotId, d.threshold));
  }, 120_000);

  it('finds the pairs across two repositories of one organisation loaded at once, as when loaded one after the other', async () => {
    // Each load stores its pairs with the other repositories' latest snapshots: the last step of an
    // organisation's loads takes turns, or each would miss the other's new snapshot.
    const salt = crypto.randomBytes(6).toString('hex');
    const [together, alone] = await Promise.all([buildOrganisation(), buildOrganisation()]);
    const [a, b, c, d] = await Promise.all([
      buildRepository({ organisationId: together.id }),
      buildRepository({ organisationId: together.id }),
      buildRepository({ organisationId: alone.id }),
      buildRepository({ organisationId: alone.id }),
    ]);
    const [first, second] = await Promise.all([saltedRelease('v1', `across-a-${salt}`), saltedRelease('v1', `across-b-${salt}`)]);
    // Hold both loads before their last step (it starts by taking the contents lock shared), then
    // let them go together, so without the organisation's turn their last steps would overlap.
    const hold = await db().transaction();
    await lockContents(hold, 'delete');
    const deriving = new Set<string>();
    const loads = Promise.all([
      load(a, 'v1', first, (phase) => phase === 'deriving' && deriving.add('a')),
      load(b, 'v1', second, (phase) => phase === 'deriving' && deriving.add('b')),
    ]);
    await expect.poll(() => deriving.size, { timeout: 60_000 }).toBe(2);
    await new Promise((resolve) => setTimeout(resolve, 300));
    await hold.commit();
    await loads;
    await load(c, 'v1', first);
    await load(d, 'v1', second);
    const key = (p: { similarity: number; cloneType: number }) => `${p.similarity}:${p.cloneType}`;
    const atOnce = (await crossPairsOfLatest(undefined, together.id)).map(key).sort();
    const oneAfterTheOther = (await crossPairsOfLatest(undefined, alone.id)).map(key).sort();
    expect(oneAfterTheOther.length).toBeGreaterThan(0);
    expect(atOnce).toEqual(oneAfterTheOther);
  }, 120_000);
});
