import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll } from 'vitest';
import { db } from '../../server/db/connection';
import { startJobs, stopJobs, type StartJobsOptions } from '../../server/jobs';
import { Snapshot } from '../../server/models/Snapshot';
import type { SnapshotStatus } from '../../shared/api/snapshots';

/** What useJobs() gives a test file. */
export interface JobsHarness {
  /** The file's pg-boss schema. */
  readonly schema: string;
  /** The file's upload folder (DOUBLET_UPLOAD_DIR), where kept archives and incoming files live. */
  readonly uploadDir: string;
}

/**
 * The job queue for one test file, in a pg-boss schema of its own (files run in parallel on one
 * database: no other file's worker takes this file's jobs), and an upload folder of its own. With
 * `work`, this process works the queue (as `npm start`'s embedded worker); without, it only
 * sends, and a test starts worker processes. Call after useDatabase().
 */
export function useJobs(options: { work: boolean; sendOptions?: StartJobsOptions['sendOptions'] }): JobsHarness {
  const harness = {
    schema: `pgboss_test_${process.pid}_${crypto.randomBytes(3).toString('hex')}`,
    uploadDir: fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-uploads-')),
  };
  const previous = process.env.DOUBLET_UPLOAD_DIR;
  beforeAll(async () => {
    process.env.DOUBLET_UPLOAD_DIR = harness.uploadDir;
    await startJobs({ connectionString: process.env.DATABASE_URL, schema: harness.schema, work: options.work, pollingIntervalSeconds: 0.5, sendOptions: options.sendOptions });
  });
  afterAll(async () => {
    await stopJobs({ timeoutMs: 2000 });
    await db().query(`drop schema if exists "${harness.schema}" cascade`);
    if (previous === undefined) delete process.env.DOUBLET_UPLOAD_DIR;
    else process.env.DOUBLET_UPLOAD_DIR = previous;
    fs.rmSync(harness.uploadDir, { recursive: true, force: true });
  });
  return harness;
}

/**
 * Polls a snapshot until `done` says so (by default: its load has ended) and returns it; throws
 * after `timeoutMs` with the last state seen.
 */
export async function waitForSnapshot(
  id: number,
  done: (snapshot: Snapshot) => boolean = (s) => !(['queued', 'running'] as SnapshotStatus[]).includes(s.status),
  timeoutMs = 120_000,
): Promise<Snapshot> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const snapshot = await Snapshot.findByPk(id);
    if (!snapshot) throw new Error(`snapshot ${id} is gone`);
    if (done(snapshot)) return snapshot;
    if (Date.now() > deadline) throw new Error(`snapshot ${id} still ${snapshot.status} ${JSON.stringify(snapshot.progress)} after ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}
