import { writeFile } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import type { ScanReport } from '../../shared/api/scan-report';
import { repositoryThreshold } from '../clone-index/options';
import { clonePairsAcross, clonePairsWithin, snapshotInstances } from '../clone-index/snapshot-pairs';
import { disconnect } from '../db';
import { Repository, Snapshot } from '../models';
import { guarded, InputError, processIo, UsageError, type CommandIo } from './command';
import { openCliDatabase, resolveOrganisation } from './database';
import { buildReport, REPORT_FORMATS, writeReport, type ReportFormat } from './report';

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
      const repository = await Repository.findOne({ where: { organisationId: organisation.id, name: values.repository } });
      if (!repository) throw new InputError(`no repository named "${values.repository}"`);
      const snapshot = await Snapshot.findOne({ where: { repositoryId: repository.id, label: values.label } });
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

/** The clone report of a snapshot from the database, with cross-repository pairs when asked. */
export async function snapshotReport(repository: Repository, snapshot: Snapshot, cross: boolean): Promise<ScanReport> {
  const settings = snapshot.settings as { threshold: number; minTokens: number; shingleSize: number };
  const threshold = repositoryThreshold({ threshold: settings.threshold });
  const instances = await snapshotInstances(undefined, snapshot.id);
  const pairs = await clonePairsWithin(undefined, instances, threshold);
  const report = buildReport({
    settings: { threshold: settings.threshold, minTokens: settings.minTokens, shingleSize: settings.shingleSize, repository: repository.name, snapshot: snapshot.label },
    fragments: instances.map((x) => ({
      file: x.path,
      name: x.name,
      startLine: x.startLine,
      endLine: x.endLine,
      tokens: x.tokens,
      tokenStart: x.tokenStart,
      tokenEnd: x.tokenEnd,
      rawHash: x.rawHash,
      normalizedHash: x.normalizedHash,
    })),
    pairs,
    files: { analysed: snapshot.fileCount - snapshot.skippedCount, skipped: snapshot.skippedCount, failed: snapshot.failedCount },
  });
  if (!cross) return report;
  const others = new Map<string, number>();
  for (const pair of await clonePairsAcross(undefined, repository.id, instances, threshold)) {
    const o = pair.other;
    const key = `${o.snapshotId}:${o.snapshotFileId}:${o.fragmentId}`;
    let id = others.get(key);
    if (id === undefined) {
      id = instances.length + others.size;
      others.set(key, id);
      report.fragments.push({ id, file: o.path, name: o.name, startLine: o.startLine, endLine: o.endLine, tokens: o.tokens, repository: `${o.repositoryName}@${o.snapshotLabel}` });
    }
    report.pairs.push({ a: pair.a, b: id, similarity: pair.similarity, type: pair.type });
  }
  return report;
}
