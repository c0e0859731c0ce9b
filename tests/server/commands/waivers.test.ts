import { describe, expect, it } from 'vitest';
import { select } from '../../../server/clone-index/sql';
import { liftLineageWaiver, waiveLineage } from '../../../server/commands/waivers';
import { presentRepository } from '../../../server/presenters/repository';
import { latestReadySnapshot } from '../../../server/queries/repositories';
import { buildRepository, buildTeam, loadFolder, RELEASES, useDatabase } from '../../support';

useDatabase();

/** Loads run the parse pool and PostgreSQL; on a busy 2-core machine a few take tens of seconds. */
const SLOW = 120_000;

/** The lineage of a snapshot's class with exactly these member paths. */
async function lineageOf(snapshotId: number, paths: string) {
  const rows = await select<{ lineageId: number; paths: string[] }>(
    undefined,
    `select c.lineage_id as "lineageId", array_agg(sf.path order by sf.path) as paths
       from clone_classes c join clone_class_members m on m.class_id = c.id join snapshot_files sf on sf.id = m.snapshot_file_id
      where c.snapshot_id = $1 group by c.id`,
    [snapshotId],
  );
  return rows.find((r) => r.paths.join(',') === paths)!.lineageId;
}

const figures = async (snapshotId: number) =>
  (
    await select<{ fragmentTokens: string; clonedTokens: string; unwaivedClonedTokens: string }>(
      undefined,
      `select fragment_tokens as "fragmentTokens", cloned_tokens as "clonedTokens", unwaived_cloned_tokens as "unwaivedClonedTokens"
         from snapshot_metrics where snapshot_id = $1`,
      [snapshotId],
    )
  ).map((r) => ({ fragment: Number(r.fragmentTokens), cloned: Number(r.clonedTokens), unwaived: Number(r.unwaivedClonedTokens) }))[0];

const waiverRows = (lineageId: number) =>
  select<{ endedAt: Date | null; endedReason: string | null; endedSnapshotId: number | null }>(
    undefined,
    `select ended_at as "endedAt", ended_reason as "endedReason", ended_snapshot_id as "endedSnapshotId" from waivers where lineage_id = $1 order by id`,
    [lineageId],
  );

describe('waivers and the clone budget', () => {
  it('leaves a waived class out of the verdict until a new member joins it', { timeout: SLOW * 3 }, async () => {
    const team = await buildTeam();
    const probe = await buildRepository({ organisationId: team.organisation.id });
    const v1 = await loadFolder(probe, `${RELEASES}/v1`, 'v1');
    const rule = await lineageOf(v1.snapshotId, 'billing/tariff.js,yard/shunting.js');
    const before = await figures(v1.snapshotId);
    expect(before.unwaived).toBe(before.cloned);

    await waiveLineage({ lineageId: rule, repositoryId: probe.id }, { reason: 'kept apart on purpose until the yard rewrite', untilLabel: 'v4', createdBy: team.lead.id });
    const waived = await figures(v1.snapshotId);
    expect(waived.unwaived).toBeGreaterThan(0);
    expect(waived.unwaived).toBeLessThan(waived.cloned);

    // a budget between the two ratios (6 decimals, as the column keeps it): over without the waiver, under with it
    const budget = Math.floor(((waived.unwaived + waived.cloned) / 2 / waived.fragment) * 1e6) / 1e6;
    expect(budget * waived.fragment).toBeGreaterThan(waived.unwaived);
    expect(budget * waived.fragment).toBeLessThan(waived.cloned);
    await probe.update({ cloneBudget: budget.toFixed(6) });
    expect(presentRepository(probe, await latestReadySnapshot(probe.id)).overBudget).toBe(false);
    await liftLineageWaiver({ lineageId: rule, repositoryId: probe.id });
    expect(presentRepository(probe, await latestReadySnapshot(probe.id)).overBudget).toBe(true);
    expect((await waiverRows(rule))[0].endedReason).toBe('lifted');
    await waiveLineage({ lineageId: rule, repositoryId: probe.id }, { reason: 'kept apart on purpose', untilLabel: null, createdBy: team.lead.id });
    expect(presentRepository(probe, await latestReadySnapshot(probe.id)).overBudget).toBe(false);
    await expect(waiveLineage({ lineageId: rule, repositoryId: probe.id }, { reason: 'again', untilLabel: null, createdBy: team.lead.id })).rejects.toThrow(/already waived/);

    // v2 edits a member but adds none: the waiver holds and the class stays out of the figure
    const v2 = await loadFolder(probe, `${RELEASES}/v2`, 'v2');
    expect(await lineageOf(v2.snapshotId, 'billing/tariff.js,yard/shunting.js')).toBe(rule);
    expect((await waiverRows(rule))[1].endedAt).toBeNull();
    const second = await figures(v2.snapshotId);
    expect(second.unwaived).toBeLessThan(second.cloned);

    // v3 adds billing/quotes.js to the class: the waiver ends by itself, naming the new member and the snapshot
    const v3 = await loadFolder(probe, `${RELEASES}/v3`, 'v3');
    expect(await lineageOf(v3.snapshotId, 'billing/quotes.js,billing/tariff.js,yard/shunting.js')).toBe(rule);
    const [, ended] = await waiverRows(rule);
    expect(ended.endedAt).not.toBeNull();
    expect(ended.endedSnapshotId).toBe(v3.snapshotId);
    expect(ended.endedReason).toMatch(/^a new member joined: billing\/quotes\.js \S+$/);
    const third = await figures(v3.snapshotId);
    expect(third.unwaived).toBe(third.cloned);
    const repository = presentRepository(probe, await latestReadySnapshot(probe.id));
    expect(repository.latestSnapshot!.unwaivedCloneRatio).toBe(repository.latestSnapshot!.cloneRatio);
  });
});
