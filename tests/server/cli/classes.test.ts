import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { cloneReportSchema, type CloneReport } from '../../../shared/api/clone-report';
import { run as classes } from '../../../server/cli/classes';
import { snapshotReport } from '../../../server/reports/snapshot';
import { run as scan } from '../../../server/cli/scan';
import { Snapshot } from '../../../server/models';
import { buildRepository, loadFolder, RELEASES, useDatabase } from '../../support';
import { captureIo } from './io';

useDatabase();

/** A report's pairs in a form that does not depend on fragment ids. */
function describe_(report: CloneReport): string[] {
  const byId = new Map(report.fragments.map((f) => [f.id, f]));
  const name = (id: number) => {
    const f = byId.get(id)!;
    return `${f.repository ? `${f.repository}:` : ''}${f.file}:${f.name}:${f.startLine}-${f.endLine}`;
  };
  return report.pairs.map((p) => `${[name(p.a), name(p.b)].sort().join(' ~ ')} ${p.similarity.toFixed(9)} ${p.type}`).sort();
}

async function scanReport(folder: string, options: string[] = []): Promise<CloneReport> {
  const io = captureIo();
  expect(await scan([folder, '--format', 'json', ...options], io)).toBe(0);
  return cloneReportSchema.parse(JSON.parse(io.stdout()));
}

async function databaseReport(folder: string, threshold: number, cross = false) {
  const repository = await buildRepository({ threshold });
  const loaded = await loadFolder(repository, folder, 'r1');
  return { repository, report: cloneReportSchema.parse(await snapshotReport(repository, (await Snapshot.findByPk(loaded.snapshotId))!, cross)) };
}

describe('doublet classes', () => {
  it('gives exactly the pairs, classes and ratio of the in-memory scan on the invented demo tree', async () => {
    const folder = path.join(RELEASES, 'v3');
    const fromScan = await scanReport(folder);
    const { report } = await databaseReport(folder, 0.8);
    expect(describe_(report)).toEqual(describe_(fromScan));
    expect(report.classes.map((c) => c.members.length)).toEqual(fromScan.classes.map((c) => c.members.length));
    expect(report.stats.cloneRatio).toBe(fromScan.stats.cloneRatio);
  }, 120_000);

  it('gives exactly the pairs of the in-memory scan on real code: sequelize@6.37.8 postgres dialect', async () => {
    // Real code from a published package: sequelize 6.37.8, lib/dialects/postgres under node_modules.
    const folder = path.resolve('node_modules/sequelize/lib/dialects/postgres');
    const fromScan = await scanReport(folder, ['--threshold', '0.7']);
    const { report } = await databaseReport(folder, 0.7);
    expect(describe_(report)).toEqual(describe_(fromScan));
    expect(report.pairs.length).toBeGreaterThan(0);
  }, 120_000);

  it('adds pairs with other repositories of the organisation under --cross, marked with their repository', async () => {
    const first = await buildRepository();
    await loadFolder(first, path.join(RELEASES, 'v1'), 'v1');
    const second = await buildRepository({ organisationId: first.organisationId });
    const loaded = await loadFolder(second, path.join(RELEASES, 'v2'), 'v2');
    const snapshot = (await Snapshot.findByPk(loaded.snapshotId))!;
    const own = await snapshotReport(second, snapshot, false);
    const withCross = cloneReportSchema.parse(await snapshotReport(second, snapshot, true));
    expect(withCross.stats).toEqual(own.stats);
    const crossPairs = withCross.pairs.slice(own.pairs.length);
    expect(crossPairs.length).toBeGreaterThan(0);
    const foreign = new Set(withCross.fragments.filter((f) => f.repository).map((f) => f.id));
    expect(crossPairs.every((p) => foreign.has(p.b) && !foreign.has(p.a))).toBe(true);
    expect([...foreign].every((id) => withCross.fragments.find((f) => f.id === id)!.repository === `${first.name}@v1`)).toBe(true);
  }, 120_000);

  describe('edge cases', () => {
    it('names a missing repository and exits 1 (the command connects and disconnects itself)', async () => {
      const io = captureIo();
      expect(await classes(['--repository', 'no-such-repository-anywhere', '--label', 'x', '--organisation', 'no-such-org'], io)).toBe(1);
      expect(io.stderr()).toMatch(/no organisation named "no-such-org"/);
    });
  });
});
