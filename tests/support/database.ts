import { afterAll, beforeAll } from 'vitest';
import { connect, disconnect } from '../../server/db/connection';
import { stopJobs } from '../../server/jobs';
import { initModels } from '../../server/models';

/**
 * Connects to the test database for one test file (tests/run.ts has created and migrated it and
 * exported DATABASE_URL) and binds the models. Files run in parallel on the same database, so
 * tests never truncate: they create their own rows with unique e-mails.
 */
export function useDatabase(): void {
  beforeAll(() => {
    const url = process.env.DATABASE_URL;
    if (!url) throw new Error('DATABASE_URL is not set: run the tests with `npm test`, which prepares the database');
    initModels(connect(url));
  });
  afterAll(async () => {
    // A load with notices to send opens the job queue (sending only); close it with the file.
    await stopJobs({ timeoutMs: 1000 });
    await disconnect();
  });
}
