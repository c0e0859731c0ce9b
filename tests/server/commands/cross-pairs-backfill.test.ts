import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { execute, select } from '../../../server/clone-index/sql';
import { db } from '../../../server/db/connection';
import { backfillCrossPairs } from '../../../server/migrations/0101-cross-pairs-backfill';
import type { Repository } from '../../../server/models/Repository';
import { buildRepository, buildTeam, loadFolder, useDatabase } from '../../support';

useDatabase();

// Invented Brackenfold code: a demurrage charge, one copy with an exemption added (a type-3 pair).
const DEMURRAGE = (name: string, fix = '') => `export function ${name}(wagons, tariff) {
  let owed = 0;
  for (const wagon of wagons) {${fix}
    const days = Math.max(0, wagon.releasedDay - wagon.arrivedDay - tariff.freeDays);
    const rate = wagon.hazardous ? tariff.perDay * 1.5 : tariff.perDay;
    owed += days * rate + (days > 10 ? 40 : 0);
  }
  return Math.round(owed * 100) / 100;
}
`;

async function loadFiles(repository: Repository, label: string, files: Record<string, string>) {
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'backfill-'));
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

/** The organisation's stored cross pairs and classes across repositories, in a form free of ids. */
async function stored(organisationId: string) {
  const pairs = await select<{ line: string }>(
    undefined,
    `select concat_ws(' ', sa.path, fa.name, sb.path, fb.name, p.similarity, p.clone_type) as line
       from cross_pairs p
       join snapshot_files sa on sa.id = p.snapshot_file_id join fragments fa on fa.id = p.fragment_id
       join snapshot_files sb on sb.id = p.other_snapshot_file_id join fragments fb on fb.id = p.other_fragment_id
       join snapshots s on s.id = p.snapshot_id join repositories r on r.id = s.repository_id
      where r.organisation_id = $1 order by 1`,
    [organisationId],
  );
  const classes = await select<{ line: string }>(
    undefined,
    `select concat_ws(' ', x.size, x.tokens, x.repository_count, x.min_similarity, x.max_similarity, x.clone_type, x.language,
                      (select string_agg(sf.path || ':' || coalesce(m.class_id is not null, false)::text, ',' order by sf.path)
                         from cross_class_members m join snapshot_files sf on sf.id = m.snapshot_file_id where m.cross_class_id = x.id)) as line
       from cross_classes x where x.organisation_id = $1 order by 1`,
    [organisationId],
  );
  return { pairs: pairs.map((p) => p.line), classes: classes.map((c) => c.line) };
}

describe('the backfill of pairs across repositories (migration 0101)', () => {
  it('stores the same pairs and classes the loads stored, and adds nothing when run again', async () => {
    const team = await buildTeam();
    const ledger = await buildRepository({ organisationId: team.organisation.id, name: 'yard-ledger' });
    const billing = await buildRepository({ organisationId: team.organisation.id, name: 'wagon-billing', threshold: 0.9 });
    const depot = await buildRepository({ organisationId: team.organisation.id, name: 'depot-tools' });
    await loadFiles(ledger, '1.0', { 'charges/demurrage.js': DEMURRAGE('demurrageOwed'), 'charges/siding.js': DEMURRAGE('sidingRent') });
    await loadFiles(billing, '7.2', { 'invoices/holding.js': DEMURRAGE('holdingCharge', '\n    if (wagon.exempt) continue;') });
    await loadFiles(depot, '0.3', { 'fees/standing.js': DEMURRAGE('standingFee', '\n    if (wagon.exempt) continue;') });
    const byLoads = await stored(team.organisation.id);
    expect(byLoads.pairs.length).toBeGreaterThan(0);
    expect(byLoads.pairs.some((line) => line.endsWith(' 3'))).toBe(true);
    expect(byLoads.classes).toHaveLength(1);
    // wagon-billing's threshold (0.9) keeps its edited copy apart from yard-ledger's two (0.878): no pair between them
    expect(byLoads.pairs.filter((line) => line.startsWith('invoices/holding.js'))).toEqual([]);

    // As data loaded before migration 0100 stands: no pair, no class across repositories.
    await execute(undefined, 'delete from cross_pairs where snapshot_id in (select s.id from snapshots s join repositories r on r.id = s.repository_id where r.organisation_id = $1)', [team.organisation.id]);
    await execute(undefined, 'delete from cross_classes where organisation_id = $1', [team.organisation.id]);
    expect(await stored(team.organisation.id)).toEqual({ pairs: [], classes: [] });

    await backfillCrossPairs(db(), team.organisation.id);
    expect(await stored(team.organisation.id)).toEqual(byLoads);
    await backfillCrossPairs(db(), team.organisation.id);
    expect(await stored(team.organisation.id)).toEqual(byLoads);
  });
});
