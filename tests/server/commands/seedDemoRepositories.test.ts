import { describe, expect, it } from 'vitest';
import { select } from '../../../server/clone-index/sql';
import { seedDemoRepositories } from '../../../server/commands/seedDemoRepositories';
import { buildOrganisation, useDatabase } from '../../support';

useDatabase();

describe('seedDemoRepositories', () => {
  it('loads both demo repositories with a trend, a drifted class and a match across repositories', async () => {
    const organisation = await buildOrganisation();
    const lines = await seedDemoRepositories(organisation);
    expect(lines).toHaveLength(4);
    const rows = await select<{ name: string; label: string; drifted: number; cross: number }>(
      undefined,
      `select r.name, s.label, m.drifted_class_count as drifted, m.cross_pair_count as cross
         from repositories r join snapshots s on s.repository_id = r.id join snapshot_metrics m on m.snapshot_id = s.id
        where r.organisation_id = $1 order by r.name, s.id`,
      [organisation.id],
    );
    expect(rows.map((r) => `${r.name}@${r.label}`)).toEqual([
      'depot-tools@2026.11',
      'freight-platform@2026.09',
      'freight-platform@2026.10',
      'freight-platform@2026.11',
    ]);
    expect(rows.find((r) => r.label === '2026.10' && r.name === 'freight-platform')?.drifted).toBe(1);
    // the depot's copy of the inspection rule matches the platform's latest snapshot
    expect(rows.find((r) => r.name === 'depot-tools')!.cross).toBeGreaterThan(0);
  });
});
