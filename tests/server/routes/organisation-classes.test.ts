import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { clonePairsWithin, snapshotFragments, type SnapshotFragment } from '../../../server/clone-index/snapshot-pairs';
import { select } from '../../../server/clone-index/sql';
import { deleteRepository } from '../../../server/commands/deleteRepository';
import { cloneClasses } from '../../../server/matching/classes';
import { parseThreshold } from '../../../server/matching/threshold';
import type { Repository } from '../../../server/models/Repository';
import type { CrossClassDetailDTO, OrganisationClassPageDTO } from '../../../shared/api/clone-classes';
import { buildRepository, buildTeam, loadFolder, signedInAgent, useDatabase } from '../../support';

useDatabase();

let app: Express;
beforeAll(() => {
  app = createApp();
});

// Invented Brackenfold code: a demurrage charge and a brake inspection rule, each long enough to be a fragment.
const DEMURRAGE = (name: string, perDay: string) => `export function ${name}(wagons, tariff) {
  let owed = 0;
  for (const wagon of wagons) {
    const days = Math.max(0, wagon.releasedDay - wagon.arrivedDay - tariff.freeDays);
    const rate = wagon.hazardous ? tariff.perDay * 1.5 : tariff.perDay;
    owed += days * rate + (days > 10 ? ${perDay} : 0);
  }
  return Math.round(owed * 100) / 100;
}
`;
const BRAKES = (name: string) => `export function ${name}(wagon, readings) {
  const faults = [];
  for (const shoe of readings.shoes) {
    if (shoe.thicknessMm < 12) faults.push({ wagon: wagon.number, part: 'shoe', at: shoe.position });
    if (shoe.temperature > 340) faults.push({ wagon: wagon.number, part: 'heat', at: shoe.position });
  }
  if (readings.pipePressure < 4.8) faults.push({ wagon: wagon.number, part: 'pipe', at: 0 });
  return faults;
}
`;

/** A folder of files (path → text), loaded as a release of the repository. */
async function loadFiles(repository: Repository, label: string, files: Record<string, string>) {
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'org-classes-'));
  try {
    for (const [file, text] of Object.entries(files)) {
      fs.mkdirSync(path.dirname(path.join(folder, file)), { recursive: true });
      fs.writeFileSync(path.join(folder, file), text);
    }
    return await loadFolder(repository, folder, label);
  } finally {
    fs.rmSync(folder, { recursive: true, force: true });
  }
}

/**
 * Two repositories: the yard's demurrage charge is copied twice within "yard-ledger" and once into
 * "wagon-billing"; the brake rule is copied once from one into the other.
 */
async function twoRepositories() {
  const team = await buildTeam();
  const ledger = await buildRepository({ organisationId: team.organisation.id, name: 'yard-ledger' });
  const billing = await buildRepository({ organisationId: team.organisation.id, name: 'wagon-billing' });
  const ledgerLoad = await loadFiles(ledger, '1.0', {
    'charges/demurrage.js': DEMURRAGE('demurrageOwed', '40'),
    'charges/siding.js': DEMURRAGE('sidingRent', '45'),
    'safety/brakes.js': BRAKES('inspectBrakes'),
  });
  const billingLoad = await loadFiles(billing, '7.2', {
    'invoices/holding.js': DEMURRAGE('holdingCharge', '40'),
    'checks/brake_check.js': BRAKES('brakeCheck'),
  });
  const viewer = await signedInAgent(app, team.viewer);
  const list = async (query = '') => (await viewer.get(`/api/clone-classes${query}`).expect(200)).body as OrganisationClassPageDTO;
  return { team, ledger, billing, ledgerLoad, billingLoad, viewer, list };
}

describe('GET /api/clone-classes', () => {
  it('lists the classes within each repository and those that span repositories, with every filter', async () => {
    const { ledger, billing, list } = await twoRepositories();
    const all = await list();
    expect(all.total).toBe(3);
    expect(all.repositories.map((r) => r.name)).toEqual(['wagon-billing', 'yard-ledger']);
    expect(all.languages).toEqual(['javascript']);
    const byScope = (scope: string) => all.classes.filter((c) => c.scope === scope);
    expect(byScope('within').map((c) => [c.repositories.map((r) => r.name), c.paths, c.status, c.snapshot?.label])).toEqual([
      [['yard-ledger'], ['charges/demurrage.js', 'charges/siding.js'], 'new', '1.0'],
    ]);
    const across = byScope('across').sort((x, y) => y.size - x.size);
    expect(across.map((c) => [c.size, c.repositories.map((r) => r.name), c.paths])).toEqual([
      [3, ['wagon-billing', 'yard-ledger'], ['charges/demurrage.js', 'charges/siding.js', 'invoices/holding.js']],
      [2, ['wagon-billing', 'yard-ledger'], ['checks/brake_check.js', 'safety/brakes.js']],
    ]);
    // the repository's class is part of the larger class across repositories
    expect(byScope('within')[0].acrossClassId).toBe(across[0].id);

    expect((await list('?scope=across')).classes.map((c) => c.scope)).toEqual(['across', 'across']);
    expect((await list('?scope=within')).total).toBe(1);
    expect((await list(`?repository=${billing.id}`)).classes.map((c) => c.scope)).toEqual(['across', 'across']);
    expect((await list(`?repository=${ledger.id}`)).total).toBe(3);
    expect((await list('?name=BRAKE')).classes.map((c) => c.paths)).toEqual([['checks/brake_check.js', 'safety/brakes.js']]);
    expect((await list('?path=charges/')).total).toBe(2);
    expect((await list('?path=invoices/&scope=within')).total).toBe(0);
    expect((await list('?minMembers=3')).classes.map((c) => [c.scope, c.size])).toEqual([['across', 3]]);
    const minTokens = across[1].tokens + 1;
    expect((await list(`?minTokens=${minTokens}`)).classes.every((c) => c.tokens >= minTokens)).toBe(true);
    expect((await list(`?minTokens=${minTokens}`)).total).toBe(all.classes.filter((c) => c.tokens >= minTokens).length);
    expect((await list(`?minTokens=${minTokens}`)).total).toBeLessThan(3);
    // a status belongs to a repository's class: the status filter leaves the classes across out
    expect((await list('?status=new')).classes.map((c) => c.scope)).toEqual(['within']);
    expect((await list('?status=drifted')).total).toBe(0);
    expect((await list('?type=2')).classes.every((c) => c.cloneType === 2)).toBe(true);
    expect((await list('?language=python')).total).toBe(0);
    expect((await list('?waived=only')).total).toBe(0);
    expect((await list('?waived=exclude')).total).toBe(3);
  });

  it('sorts and pages on the server', async () => {
    const { list } = await twoRepositories();
    const bySize = await list('?sort=size&order=desc');
    expect(bySize.classes.map((c) => c.size)).toEqual([3, 2, 2]);
    const ascending = await list('?sort=tokens&order=asc');
    const tokens = ascending.classes.map((c) => c.tokens);
    expect(tokens).toEqual([...tokens].sort((a, b) => a - b));
    const pages = [await list('?sort=tokens&pageSize=2&page=1'), await list('?sort=tokens&pageSize=2&page=2')];
    expect(pages.map((p) => p.classes.length)).toEqual([2, 1]);
    expect(pages.map((p) => p.total)).toEqual([3, 3]);
    const seen = pages.flatMap((p) => p.classes.map((c) => `${c.scope}${c.id}`));
    expect(new Set(seen).size).toBe(3);
    expect((await list('?sort=repository&order=asc')).classes[0].repositories[0].name).toBe('wagon-billing');
  });

  it('finds exactly the components of all pairs in the latest snapshots that span repositories (checked by brute force)', async () => {
    const { team, ledgerLoad, billingLoad, list } = await twoRepositories();
    // Brute force: every pair among the two snapshots' fragments together, at the shared threshold.
    const fragments: (SnapshotFragment & { snapshotId: number })[] = [];
    for (const snapshotId of [ledgerLoad.snapshotId, billingLoad.snapshotId]) {
      fragments.push(...(await snapshotFragments(undefined, snapshotId)).map((f) => ({ ...f, snapshotId })));
    }
    const pairs = await clonePairsWithin(undefined, fragments, parseThreshold('0.7'));
    const expected = cloneClasses(fragments.length, pairs)
      .filter((members) => new Set(members.map((i) => fragments[i].snapshotId)).size > 1)
      .map((members) => members.map((i) => `${fragments[i].path}:${fragments[i].name}`).sort().join(' '))
      .sort();
    const stored = await select<{ members: string }>(
      undefined,
      `select string_agg(sf.path || ':' || f.name, ' ' order by sf.path || ':' || f.name) as members
         from cross_classes x join cross_class_members m on m.cross_class_id = x.id
         join snapshot_files sf on sf.id = m.snapshot_file_id join fragments f on f.id = m.fragment_id
        where x.organisation_id = $1 group by x.id`,
      [team.organisation.id],
    );
    expect(stored.map((s) => s.members).sort()).toEqual(expected);
    expect(expected).toHaveLength((await list('?scope=across')).total);
  });

  it('follows new releases and a deleted repository', async () => {
    const { billing, list } = await twoRepositories();
    // The brake check is rewritten in wagon-billing: only the demurrage class still spans both.
    await loadFiles(billing, '7.3', { 'invoices/holding.js': DEMURRAGE('holdingCharge', '40') });
    expect((await list('?scope=across')).classes.map((c) => c.size)).toEqual([3]);
    await deleteRepository(billing);
    expect((await list('?scope=across')).total).toBe(0);
    expect((await list()).total).toBe(1);
  });

  it('answers 400 naming a bad filter, and shows nothing of another organisation', async () => {
    const { viewer } = await twoRepositories();
    for (const [query, field] of [
      ['pageSize=500', 'pageSize'],
      ['minMembers=1', 'minMembers'],
      ['repository=0x1', 'repository'],
      ['scope=everywhere', 'scope'],
      ['sort=colour', 'sort'],
      [`name=${'n'.repeat(201)}`, 'name'],
    ]) {
      const res = await viewer.get(`/api/clone-classes?${query}`).expect(400);
      expect(res.body.error.field).toBe(field);
    }
    const stranger = await buildTeam();
    const theirs = (await (await signedInAgent(app, stranger.viewer)).get('/api/clone-classes').expect(200)).body as OrganisationClassPageDTO;
    expect(theirs.total).toBe(0);
    expect(theirs.repositories).toEqual([]);
  });
});

describe('GET /api/cross-classes/:id', () => {
  it("gives each member's repository, release and code, and the pairs within and across repositories", async () => {
    const { viewer, list } = await twoRepositories();
    const largest = (await list('?scope=across&sort=size')).classes[0];
    const detail = (await viewer.get(`/api/cross-classes/${largest.id}`).expect(200)).body as CrossClassDetailDTO;
    expect(detail.members.map((m) => [m.repositoryName, m.snapshotLabel, m.path, m.name])).toEqual([
      ['wagon-billing', '7.2', 'invoices/holding.js', 'holdingCharge'],
      ['yard-ledger', '1.0', 'charges/demurrage.js', 'demurrageOwed'],
      ['yard-ledger', '1.0', 'charges/siding.js', 'sidingRent'],
    ]);
    expect(detail.members[0].code).toContain('export function holdingCharge(wagons, tariff)');
    expect(detail.members[0].classId).toBeNull();
    expect(detail.members[1].classId).toBe(detail.members[2].classId);
    // the copies differ in their names and one literal, both normalised away: type 2, similarity 1
    expect(detail.pairs.map((p) => [p.a, p.b, p.type, p.similarity])).toEqual([
      [0, 1, 2, 1],
      [0, 2, 2, 1],
      [1, 2, 2, 1],
    ]);
    expect(detail.repositories.map((r) => r.name)).toEqual(['wagon-billing', 'yard-ledger']);
    const stranger = await buildTeam();
    await (await signedInAgent(app, stranger.viewer)).get(`/api/cross-classes/${largest.id}`).expect(404);
  });
});
