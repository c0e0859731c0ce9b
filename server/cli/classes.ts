import { writeFile } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import { disconnect } from '../db';
import { findRepositoryByName } from '../queries/repositories';
import { findSnapshotByLabel } from '../queries/snapshots';
import { snapshotReport } from '../reports/snapshot';
import { REPORT_FORMATS, writeReport, type ReportFormat } from '../reports/write';
import { guarded, InputError, processIo, UsageError, type CommandIo } from './command';
import { openCliDatabase, resolveOrganisation } from './database';

const USAGE = `usage: doublet classes --repository NAME --label LABEL [--format ${REPORT_FORMATS.join('|')}] [--out FILE]
                       [--cross] [--organisation NAME]

Prints a loaded snapshot's fragments, the clone pairs among them and its clone classes, in the
same report shape as "doublet scan". --cross adds the pairs with fragments of the latest snapshot
of every other repository (those fragments carry a "repository" field; stats and classes cover
the snapshot alone).
`;

/** `doublet classes`: a snapshot in the database → the clone report. */
export function run(args: string[], io: CommandIo = processIo()): Promise<number> {
  return guarded(io, USAGE, async () => {
    const { values } = parseArgs({
      args,
      options: {
        repository: { type: 'string' },
        label: { type: 'string' },
        format: { type: 'string', default: 'text' },
        out: { type: 'string', short: 'o' },
        cross: { type: 'boolean' },
        organisation: { type: 'string' },
        help: { type: 'boolean' },
      },
    });
    if (values.help) {
      io.out(USAGE);
      return 0;
    }
    if (!values.repository) throw new UsageError('--repository is required');
    if (!values.label) throw new UsageError('--label is required');
    if (!(REPORT_FORMATS as readonly string[]).includes(values.format!)) {
      throw new UsageError(`--format must be one of ${REPORT_FORMATS.join(', ')} (got "${values.format}")`);
    }
    await openCliDatabase();
    try {
      const organisation = await resolveOrganisation(values.organisation);
      const repository = await findRepositoryByName(organisation.id, values.repository);
      if (!repository) throw new InputError(`no repository named "${values.repository}"`);
      const snapshot = await findSnapshotByLabel(repository.id, values.label);
      if (!snapshot) throw new InputError(`repository "${values.repository}" has no snapshot "${values.label}"`);
      if (snapshot.status !== 'ready') throw new InputError(`snapshot "${values.label}" is ${snapshot.status}${snapshot.error ? `: ${snapshot.error}` : ''}`);
      const report = await snapshotReport(repository, snapshot, Boolean(values.cross));
      const text = writeReport(report, values.format as ReportFormat);
      if (values.out) await writeFile(values.out, text);
      else io.out(text);
      return 0;
    } finally {
      await disconnect();
    }
  });
}
