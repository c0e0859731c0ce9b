import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { uploadSnapshot } from '../../../server/commands/uploadSnapshot';
import { select } from '../../../server/clone-index/sql';
import { projectRoot } from '../../../server/config';
import { readFolder, storedArchivePath } from '../../../server/ingest';
import { buildRepository, useDatabase, useJobs, waitForSnapshot } from '../../support';
import { buildTar } from '../ingest/build-archives';

useDatabase();
// A lease far shorter than the load, and no retry: the one attempt is cut off.
process.env.DOUBLET_LOAD_LEASE_SECONDS = '2';
useJobs({ work: true, sendOptions: { 'snapshot.load': { retryLimit: 0 } } });

describe('snapshot.load cut off on every attempt', () => {
  it('ends failed with the reason in words (not stuck in running), its archive deleted and nothing of it written', async () => {
    // Sixteen copies of sequelize 6.37.8's lib from node_modules (50 MB), each salted so it is
    // analysed afresh: far longer than the 2 s lease even on a quiet machine (four copies loaded in
    // under 3 s there). The attempt is stopped at its first checkpoint after the cut-off, so the
    // size costs little time.
    const { files } = await readFolder(path.join(projectRoot, 'node_modules', 'sequelize', 'lib'));
    const salt = crypto.randomBytes(8).toString('hex');
    const tempFile = path.join(os.tmpdir(), `doublet-abandoned-${salt}.tgz`);
    const entries = Array.from({ length: 16 }, (_, copy) => copy).flatMap((copy) =>
      files.map((f) => ({ name: `copy-${copy}/lib/${f.path}`, data: Buffer.concat([Buffer.from(f.content), Buffer.from(`\n// ${salt}-${copy}\n`)]) })),
    );
    fs.writeFileSync(tempFile, zlib.gzipSync(buildTar(entries)));
    const repository = await buildRepository();
    const { snapshot } = await uploadSnapshot({ repository, label: 'too-big-for-its-lease', tempFile, startedBy: null });

    const ended = await waitForSnapshot(snapshot.id, undefined, 120_000);
    expect(ended.status).toBe('failed');
    expect(ended.error).toMatch(/^The load was cut off on every attempt .* lease of 2 seconds/);
    // the handler deletes the archive just after it writes the status
    await expect.poll(() => fs.existsSync(storedArchivePath(snapshot.id)), { timeout: 10_000 }).toBe(false);
    // The attempt that ran past its lease stops at its next checkpoint and writes nothing.
    await new Promise((resolve) => setTimeout(resolve, 3000));
    const [left] = await select<{ files: string; status: string }>(
      undefined,
      'select (select count(*) from snapshot_files where snapshot_id = $1) as files, (select status from snapshots where id = $1) as status',
      [snapshot.id],
    );
    expect(left).toEqual({ files: '0', status: 'failed' });
  }, 180_000);
});
