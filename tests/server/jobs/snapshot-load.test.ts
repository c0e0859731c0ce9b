import { spawn, type ChildProcess } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import { afterAll, describe, expect, it } from 'vitest';
import { languageForPath } from '../../../analyzers';
import type { SourceFile } from '../../../analyzers/types';
import { repositorySettings } from '../../../server/commands/createRepository';
import { loadSnapshot } from '../../../server/commands/loadSnapshot';
import { uploadSnapshot } from '../../../server/commands/uploadSnapshot';
import { select } from '../../../server/clone-index/sql';
import { projectRoot } from '../../../server/config';
import { readFolder, storedArchivePath } from '../../../server/ingest';
import { buildRepository, describedPairs, useDatabase, useJobs, waitForSnapshot } from '../../support';
import { buildTar } from '../ingest/build-archives';

useDatabase();
// A lease long enough for one whole load on a busy machine; a killed worker's job comes back after it.
const LEASE_SECONDS = 60;
process.env.DOUBLET_LOAD_LEASE_SECONDS = String(LEASE_SECONDS);
const jobs = useJobs({ work: false });

const workers: ChildProcess[] = [];
afterAll(() => {
  for (const worker of workers) if (worker.exitCode === null && worker.signalCode === null) worker.kill('SIGKILL');
});

/** `npm run worker` as its own process, on this file's queue schema and upload folder. */
function startWorker(): { process: ChildProcess; output: () => string } {
  let output = '';
  const child = spawn(process.execPath, ['--import', 'tsx', path.join(projectRoot, 'server', 'worker.ts')], {
    cwd: projectRoot,
    env: {
      ...process.env,
      DOUBLET_JOBS_SCHEMA: jobs.schema,
      DOUBLET_UPLOAD_DIR: jobs.uploadDir,
      DOUBLET_JOBS_MAINTENANCE_SECONDS: '1',
      DOUBLET_ANALYZER_THREADS: '1',
      DOUBLET_LOADS_PER_WORKER: '1',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (d: Buffer) => (output += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (output += d.toString()));
  workers.push(child);
  return { process: child, output: () => output };
}

/**
 * Real code, published: sequelize 6.37.8's lib folder from node_modules (116 files, 3.1 MB). Each
 * file gets a last comment line of its own so that no earlier load's analysis of it is reused (a
 * comment changes neither fragments, lines nor shingles).
 */
async function saltedSequelize(salt: string): Promise<SourceFile[]> {
  const { files } = await readFolder(path.join(projectRoot, 'node_modules', 'sequelize', 'lib'));
  return files.map((f) => ({ path: f.path, content: Buffer.concat([Buffer.from(f.content), Buffer.from(`\n// ${salt}\n`)]) }));
}

function tarGz(files: SourceFile[]): Buffer {
  return zlib.gzipSync(buildTar(files.map((f) => ({ name: `sequelize-lib/${f.path}`, data: Buffer.from(f.content) }))));
}

describe('snapshot.load in worker processes', () => {
  it('a worker killed mid-load (SIGKILL) leaves nothing stuck: a second worker finishes it, with the pairs of an uninterrupted load', async () => {
    const repository = await buildRepository();
    const salt = crypto.randomBytes(8).toString('hex');
    const files = await saltedSequelize(salt);
    const tempFile = path.join(os.tmpdir(), `doublet-kill-${salt}.tgz`);
    fs.writeFileSync(tempFile, tarGz(files));
    const { snapshot } = await uploadSnapshot({ repository, label: 'lib-6.37.8', tempFile, startedBy: null });
    expect(snapshot.status).toBe('queued');
    expect(fs.existsSync(tempFile)).toBe(false);
    expect(fs.existsSync(storedArchivePath(snapshot.id))).toBe(true);

    const first = startWorker();
    const analysing = await waitForSnapshot(snapshot.id, (s) => !['queued', 'running'].includes(s.status) || (s.progress?.phase === 'analysing' && s.progress.done >= 1), 120_000);
    first.process.kill('SIGKILL');
    await new Promise((resolve) => first.process.once('exit', resolve));
    expect(analysing.status, first.output()).toBe('running');
    expect(analysing.progress?.phase).toBe('analysing');
    // the files with an analyzer (the rest are skipped before analysis)
    expect(analysing.progress?.total).toBe(files.filter((f) => languageForPath(f.path)).length);
    expect(analysing.progress!.done).toBeLessThan(analysing.progress!.total);
    // Killed mid-load: nothing of the snapshot was written, and it stays running until its lease runs out.
    const [{ count: filesWritten }] = await select<{ count: string }>(undefined, 'select count(*) from snapshot_files where snapshot_id = $1', [snapshot.id]);
    expect(filesWritten).toBe('0');

    const second = startWorker();
    const done = await waitForSnapshot(snapshot.id, undefined, (LEASE_SECONDS + 150) * 1000);
    expect(done.status, `${done.error}\n${second.output()}`).toBe('ready');
    expect(done.loadAttempt).toBeGreaterThanOrEqual(2);
    expect(done.progress).toBeNull();
    expect(done.fileCount).toBe(files.length);
    expect(fs.existsSync(storedArchivePath(snapshot.id))).toBe(false);
    second.process.kill('SIGTERM');

    // The same code loaded without interruption (its own salt, so it is analysed afresh too).
    const reference = await buildRepository();
    const result = await loadSnapshot({ repository: repositorySettings(reference), label: 'lib-6.37.8', files: await saltedSequelize(`${salt}-reference`), source: 'archive' });
    const pairs = await describedPairs(done.id, repository.threshold);
    expect(pairs.length).toBeGreaterThan(0);
    expect(pairs).toEqual(await describedPairs(result.snapshotId, reference.threshold));
    const [counts] = await select<{ classes: string; files: string }>(
      undefined,
      `select (select count(*) from clone_classes where snapshot_id = $1) as classes, (select count(*) from snapshot_files where snapshot_id = $1) as files`,
      [done.id],
    );
    expect(Number(counts.files)).toBe(files.length);
    expect(Number(counts.classes)).toBe(result.classCount);
  }, 420_000);
});
