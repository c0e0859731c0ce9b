import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { select } from '../../../server/clone-index/sql';
import type { Repository } from '../../../server/models/Repository';
import type { CloneClassDetailDTO, CloneClassPageDTO } from '../../../shared/api/snapshots';
import { buildRepository, buildTeam, loadFolder, RELEASES, signedInAgent, useDatabase } from '../../support';

useDatabase();

/** Loads run the parse pool and PostgreSQL; on a busy 2-core machine a few take tens of seconds. */
const SLOW = 120_000;

let app: Express;
const folders: string[] = [];
beforeAll(() => {
  app = createApp();
});
afterAll(() => {
  for (const folder of folders) fs.rmSync(folder, { recursive: true, force: true });
});

/** A snapshot's classes as "paths → lineage", with each lineage's first snapshot. */
async function lineages(snapshotId: number) {
  const rows = await select<{ paths: string[]; lineageId: number; firstSnapshotId: number; repositoryId: number }>(
    undefined,
    `select array_agg(sf.path order by sf.path) as paths, c.lineage_id as "lineageId", l.first_snapshot_id as "firstSnapshotId",
            l.repository_id as "repositoryId"
       from clone_classes c join class_lineages l on l.id = c.lineage_id
       join clone_class_members m on m.class_id = c.id join snapshot_files sf on sf.id = m.snapshot_file_id
      where c.snapshot_id = $1 group by c.id, l.id order by c.ordinal`,
    [snapshotId],
  );
  return new Map(rows.map((r) => [r.paths.join(','), r]));
}

/**
 * Two invented bodies of rail-freight code, each well over the 50-token minimum and unlike each
 * other, so copies of one form a class and copies of both never pair.
 */
const TARIFF = (name: string) => `export function ${name}(consignment, table) {
  let total = 0;
  for (const wagon of consignment.wagons) {
    const band = table.bands.find((b) => wagon.tonnes <= b.upTo) ?? table.bands[table.bands.length - 1];
    total += band.rate * wagon.tonnes + (wagon.hazardous ? table.hazardSurcharge : 0);
  }
  if (consignment.distanceKm > table.longHaulKm) total *= 1 + table.longHaulUplift;
  return Math.round(total * 100) / 100;
}
`;
const ROSTER = (name: string) => `export function ${name}(crews, day) {
  const onDuty = crews.filter((crew) => crew.depot === day.depot && !crew.onLeave.includes(day.date));
  const drivers = onDuty.filter((crew) => crew.grade === 'driver').map((crew) => crew.id);
  const guards = onDuty.filter((crew) => crew.grade === 'guard').map((crew) => crew.id);
  if (drivers.length === 0) throw new Error('no driver for ' + day.depot + ' on ' + day.date);
  return { depot: day.depot, date: day.date, drivers: drivers.sort(), guards: guards.sort(), spare: onDuty.length - drivers.length - guards.length };
}
`;

/** Writes one invented release (path → text) into a temporary folder. */
function release(files: Record<string, string>): string {
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-lineage-'));
  folders.push(folder);
  for (const [file, text] of Object.entries(files)) {
    fs.mkdirSync(path.dirname(path.join(folder, file)), { recursive: true });
    fs.writeFileSync(path.join(folder, file), text);
  }
  return folder;
}

async function loadReleases(repository: Repository, releases: Record<string, string>[]) {
  const ids: number[] = [];
  for (const [i, files] of releases.entries()) ids.push((await loadFolder(repository, release(files), `r${i + 1}`)).snapshotId);
  return ids;
}

describe('class lineage on load', () => {
  it('keeps the pricing rule\'s lineage across the demo releases while a member drifts and a copy joins', async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id });
    const loads = [];
    for (const v of ['v1', 'v2', 'v3']) loads.push(await loadFolder(repository, `${RELEASES}/${v}`, v));
    const [v1, v2, v3] = await Promise.all(loads.map((l) => lineages(l.snapshotId)));

    const rule = v1.get('billing/tariff.js,yard/shunting.js')!;
    expect(rule.firstSnapshotId).toBe(loads[0].snapshotId);
    expect(rule.repositoryId).toBe(repository.id);
    // v2 edited the rule in billing/tariff.js only (the class drifted): same lineage
    expect(v2.get('billing/tariff.js,yard/shunting.js')!.lineageId).toBe(rule.lineageId);
    // v3 added a third copy: still the same lineage
    expect(v3.get('billing/quotes.js,billing/tariff.js,yard/shunting.js')!.lineageId).toBe(rule.lineageId);
    const inspect = v1.get('tools/depot_inspect.py,tools/inspect.py')!;
    expect(inspect.lineageId).not.toBe(rule.lineageId);
    expect(v2.get('tools/depot_inspect.py,tools/inspect.py')!.lineageId).toBe(inspect.lineageId);

    // the API shows the lineage on the list and on the class page
    const viewer = await signedInAgent(app, team.viewer);
    const page = (await viewer.get(`/api/snapshots/${loads[2].snapshotId}/classes`).expect(200)).body as CloneClassPageDTO;
    expect(page.classes.map((c) => c.lineageId)).toEqual([rule.lineageId]);
    const detail = (await viewer.get(`/api/clone-classes/${page.classes[0].id}`).expect(200)).body as CloneClassDetailDTO;
    expect(detail.lineageId).toBe(rule.lineageId);
  }, SLOW);

  it('gives a split lineage to the part with most of its members; the other part starts a new lineage', async () => {
    const repository = await buildRepository();
    const five = ['a', 'b', 'c', 'd', 'e'];
    const [r1, r2] = await loadReleases(repository, [
      Object.fromEntries(five.map((x) => [`depots/${x}.js`, TARIFF('charge')])),
      // d and e were rewritten into another shared routine: the five copies split into three and two
      Object.fromEntries(five.map((x) => [`depots/${x}.js`, ['d', 'e'].includes(x) ? ROSTER('charge') : TARIFF('charge')])),
    ]);
    const before = await lineages(r1);
    expect([...before.keys()]).toEqual(['depots/a.js,depots/b.js,depots/c.js,depots/d.js,depots/e.js']);
    const original = [...before.values()][0].lineageId;
    const after = await lineages(r2);
    expect([...after.keys()].sort()).toEqual(['depots/a.js,depots/b.js,depots/c.js', 'depots/d.js,depots/e.js']);
    expect(after.get('depots/a.js,depots/b.js,depots/c.js')!.lineageId).toBe(original);
    const split = after.get('depots/d.js,depots/e.js')!;
    expect(split.lineageId).toBeGreaterThan(original);
    expect(split.firstSnapshotId).toBe(r2);
  }, SLOW);

  it('keeps the older lineage when two merge, even when the younger brings more members', async () => {
    const repository = await buildRepository();
    const older = { 'yard/a.js': TARIFF('charge'), 'yard/b.js': TARIFF('charge') };
    const younger = { 'crews/p.js': ROSTER('roster'), 'crews/q.js': ROSTER('roster'), 'crews/r.js': ROSTER('roster') };
    const [r1, r2, r3] = await loadReleases(repository, [
      older,
      { ...older, ...younger },
      // the yard's copies were rewritten as the crew routine: one class of five
      { 'yard/a.js': ROSTER('charge'), 'yard/b.js': ROSTER('charge'), ...younger },
    ]);
    const first = (await lineages(r1)).get('yard/a.js,yard/b.js')!.lineageId;
    const second = await lineages(r2);
    expect(second.get('yard/a.js,yard/b.js')!.lineageId).toBe(first);
    const youngerLineage = second.get('crews/p.js,crews/q.js,crews/r.js')!.lineageId;
    expect(youngerLineage).toBeGreaterThan(first);
    const merged = await lineages(r3);
    expect([...merged.keys()]).toEqual(['crews/p.js,crews/q.js,crews/r.js,yard/a.js,yard/b.js']);
    expect([...merged.values()][0].lineageId).toBe(first);
  }, SLOW);

  it('starts a new lineage for a class whose copies were all gone in the previous snapshot', async () => {
    const repository = await buildRepository();
    const pair = { 'yard/a.js': TARIFF('charge'), 'yard/b.js': TARIFF('charge') };
    const [r1, , r3] = await loadReleases(repository, [pair, { 'yard/a.js': TARIFF('charge') }, pair]);
    const first = (await lineages(r1)).get('yard/a.js,yard/b.js')!;
    const back = (await lineages(r3)).get('yard/a.js,yard/b.js')!;
    expect(back.lineageId).not.toBe(first.lineageId);
    expect(back.firstSnapshotId).toBe(r3);
  }, SLOW);
});
