import { stat } from 'node:fs/promises';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { readFolder } from '../ingest/folder';
import { createRepository, repositorySettings, updateRepository } from '../commands/createRepository';
import { loadSnapshot } from '../commands/loadSnapshot';
import { disconnect } from '../db';
import { stopJobs } from '../jobs/queue';
import { HttpError } from '../errors';
import { findRepositoryByName } from '../queries/repositories';
import { guarded, InputError, positiveIntegerOption, processIo, UsageError, type CommandIo } from './command';
import { openCliDatabase, resolveOrganisation } from './database';

const USAGE = `usage: doublet import --repository NAME --label LABEL [--min-tokens N] [--threshold T] [--shingle K]
                      [--organisation NAME] [--batch-size N] PATH

Loads the folder PATH as a snapshot of repository NAME (created when it does not exist) with the
release label LABEL, and prints the snapshot id, counts and timings. Settings given here are
saved on the repository. The local PostgreSQL is started when it is not running.
`;

/** `doublet import`: a local folder → a snapshot in the database. */
export function run(args: string[], io: CommandIo = processIo()): Promise<number> {
  return guarded(io, USAGE, async () => {
    const { values, positionals } = parseArgs({
      args,
      allowPositionals: true,
      options: {
        repository: { type: 'string' },
        label: { type: 'string' },
        'min-tokens': { type: 'string' },
        threshold: { type: 'string' },
        shingle: { type: 'string' },
        organisation: { type: 'string' },
        'batch-size': { type: 'string' },
        help: { type: 'boolean' },
      },
    });
    if (values.help) {
      io.out(USAGE);
      return 0;
    }
    if (!values.repository) throw new UsageError('--repository is required');
    if (!values.label) throw new UsageError('--label is required');
    if (positionals.length !== 1) throw new UsageError('give exactly one folder to import');
    const root = path.resolve(positionals[0]);
    const info = await stat(root).catch(() => undefined);
    if (!info?.isDirectory()) throw new InputError(`${positionals[0]} is not a folder`);
    const settings = {
      minTokens: positiveIntegerOption(values['min-tokens'], '--min-tokens'),
      shingleSize: positiveIntegerOption(values.shingle, '--shingle'),
      threshold: values.threshold === undefined ? undefined : Number(values.threshold),
    };
    const given = Object.fromEntries(Object.entries(settings).filter(([, v]) => v !== undefined));

    await openCliDatabase();
    try {
      const organisation = await resolveOrganisation(values.organisation);
      let repository = await findRepositoryByName(organisation.id, values.repository);
      try {
        if (!repository) repository = await createRepository(organisation.id, { name: values.repository, ...given });
        else if (Object.keys(given).length) repository = await updateRepository(repository, given);
      } catch (error) {
        if (error instanceof HttpError) throw new InputError(error.message);
        throw error;
      }
      const started = performance.now();
      const folder = await readFolder(root, { ignore: repository.ignore });
      const readMs = Math.round(performance.now() - started);
      const result = await loadSnapshot({
        repository: repositorySettings(repository),
        label: values.label,
        source: 'folder',
        files: folder.files,
        skipped: folder.skipped,
        batchSize: positiveIntegerOption(values['batch-size'], '--batch-size'),
      }).catch((error: unknown) => {
        if (error instanceof HttpError) throw new InputError(error.message);
        throw error;
      });
      io.out(
        [
          `snapshot ${result.snapshotId}: ${values.repository} @ ${values.label}`,
          `files ${result.fileCount} (skipped ${result.skippedCount}, failed ${result.failedCount}, analysed now ${result.analyzedFileCount})`,
          `fragments ${result.fragmentCount}, new shingle sets ${result.newSetCount}`,
          `clone pairs ${result.pairCount}, clone classes ${result.classCount}, clone ratio ${(result.cloneRatio * 100).toFixed(2)}%`,
          `timings (ms): read ${readMs}, ${Object.entries(result.timings).map(([k, v]) => `${k.replace(/_/g, ' ')} ${v}`).join(', ')}, total ${Math.round(performance.now() - started)}`,
          '',
        ].join('\n'),
      );
      return 0;
    } finally {
      // A load over budget or with drifted classes queued its notices: close the queue it opened.
      await stopJobs();
      await disconnect();
    }
  });
}
