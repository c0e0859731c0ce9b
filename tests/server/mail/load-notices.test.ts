import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { select } from '../../../server/clone-index/sql';
import { db } from '../../../server/db/connection';
import { budgetNotice, isOverBudget, queueLoadNotices, sendLoadNotices } from '../../../server/mail/load-notices';
import type { LoadNoticeFacts } from '../../../server/queries/notices';
import { saveNoticeSettings } from '../../../server/queries/notices';
import { buildRepository, buildTeam, loadFolder, mailTo, RELEASES, useDatabase, useMail } from '../../support';

useDatabase();
const mail = useMail();

/** load.notices jobs queued for a snapshot in this file's queue. */
async function noticeJobs(snapshotId: number): Promise<number> {
  const [rows] = await db().query(`select count(*)::int as n from "${mail.schema}".job where name = 'load.notices' and (data->>'snapshotId')::int = $1`, {
    bind: [snapshotId],
  });
  return (rows as { n: number }[])[0].n;
}

/** mail.send jobs to an address in this file's queue, whatever their state. */
async function queuedTo(email: string): Promise<string[]> {
  const [rows] = await db().query(`select data->>'subject' as subject from "${mail.schema}".job where name = 'mail.send' and data->>'to' = $1`, { bind: [email] });
  return (rows as { subject: string }[]).map((r) => r.subject);
}

/** Every line of code (12 characters or more, trimmed) of a release's files under `folder`. */
function codeLines(release: string, folder: string): string[] {
  const root = path.join(RELEASES, release, folder);
  return fs
    .readdirSync(root, { recursive: true, encoding: 'utf8' })
    .filter((f) => fs.statSync(path.join(root, f)).isFile())
    .flatMap((f) => fs.readFileSync(path.join(root, f), 'utf8').split('\n'))
    .map((l) => l.trim())
    .filter((l) => l.length >= 12);
}

describe('notices after a load', () => {
  it('mails the leads and admins of a snapshot with drifted classes: figures and links, never code', async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id, name: 'freight-platform' });
    const first = await loadFolder(repository, `${RELEASES}/v1`, '2026.09');
    // A first snapshot has nothing drifted and no budget: nothing to say, no job.
    expect(await noticeJobs(first.snapshotId)).toBe(0);

    const second = await loadFolder(repository, `${RELEASES}/v2`, '2026.10');
    expect(await noticeJobs(second.snapshotId)).toBe(1);
    const [drifted] = await select<{ id: number }>(undefined, `select id from clone_classes where snapshot_id = $1 and status = 'drifted'`, [second.snapshotId]);

    const [toLead] = await mailTo(team.lead.email);
    expect(toLead.subject).toBe('freight-platform 2026.10: 1 drifted clone class');
    expect(toLead.text).toContain('Repository: freight-platform');
    expect(toLead.text).toContain('Release: 2026.10');
    expect(toLead.text).toMatch(/Clone ratio without waived classes: \d+\.\d\d%/);
    expect(toLead.text).toMatch(/Clone classes: \d+ \(\d+ new, 1 drifted\)/);
    expect(toLead.text).toMatch(new RegExp(`/snapshots/${second.snapshotId}\\b`));
    expect(toLead.text).toMatch(new RegExp(`Class #${drifted.id}: \\d+ copies, \\d+ tokens, javascript: http\\S+/clone-classes/${drifted.id}\\b`));
    expect(toLead.html).toContain(`/clone-classes/${drifted.id}"`);
    for (const line of [...codeLines('v2', 'billing'), ...codeLines('v2', 'yard')]) {
      expect(toLead.text, line).not.toContain(line);
      expect(toLead.html ?? '', line).not.toContain(line);
    }
    expect((await mailTo(team.admin.email))[0].subject).toBe(toLead.subject);
    // Engineers and viewers are not told (no open tasks of theirs on the lineage).
    expect(await queuedTo(team.engineer.email)).toEqual([]);
    expect(await queuedTo(team.viewer.email)).toEqual([]);
  }, 120_000);

  it('mails the leads of a snapshot over its clone budget, except one who turned it off, and only once', async () => {
    const team = await buildTeam();
    await saveNoticeSettings(team.lead.id, { budgetExceeded: false });
    const repository = await buildRepository({ organisationId: team.organisation.id, name: 'yard-scheduler', cloneBudget: 0.001 });
    const { snapshotId } = await loadFolder(repository, `${RELEASES}/v1`, '2026.09');
    const [figures] = await select<{ cloned: string; total: string }>(
      undefined,
      'select unwaived_cloned_tokens as cloned, fragment_tokens as total from snapshot_metrics where snapshot_id = $1',
      [snapshotId],
    );
    const ratio = `${((100 * Number(figures.cloned)) / Number(figures.total)).toFixed(2)}%`;

    const [toAdmin] = await mailTo(team.admin.email);
    expect(toAdmin.subject).toBe(`yard-scheduler 2026.09 is over its clone budget: ${ratio} (budget 0.1%)`);
    expect(toAdmin.text).toContain(`Clone ratio without waived classes: ${ratio} (budget 0.1%)`);
    expect(toAdmin.text).toMatch(new RegExp(`Open the snapshot: http\\S+/snapshots/${snapshotId}\\b`));
    expect(toAdmin.text).toContain('Turn it off in your account settings');
    expect(await queuedTo(team.lead.email)).toEqual([]);

    // The job ran once already; running it again (a retry) sends nothing more.
    expect(await sendLoadNotices(snapshotId)).toEqual({ budget: 0, drift: 0 });
    expect(await queuedTo(team.admin.email)).toEqual([toAdmin.subject]);
  }, 120_000);

  it('queues the job inside the load’s transaction: none when it rolls back', async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id, cloneBudget: 0.001 });
    const { snapshotId } = await loadFolder(repository, `${RELEASES}/v1`, '2026.09');
    expect(await noticeJobs(snapshotId)).toBe(1);
    const rolledBack = db().transaction(async (tx) => {
      await queueLoadNotices(tx, snapshotId);
      throw new Error('the load failed after its snapshot was marked ready');
    });
    await expect(rolledBack).rejects.toThrow('the load failed');
    expect(await noticeJobs(snapshotId)).toBe(1);
    await db().transaction((tx) => queueLoadNotices(tx, snapshotId));
    expect(await noticeJobs(snapshotId)).toBe(2);
  }, 120_000);

  it('sends no budget notice for a snapshot within its budget', async () => {
    const team = await buildTeam();
    const repository = await buildRepository({ organisationId: team.organisation.id, cloneBudget: 1 });
    const { snapshotId } = await loadFolder(repository, `${RELEASES}/v1`, '2026.09');
    expect(await noticeJobs(snapshotId)).toBe(0);
    expect(await sendLoadNotices(snapshotId)).toEqual({ budget: 0, drift: 0 });
  }, 120_000);
});

describe('the budget notice’s figures', () => {
  const facts: LoadNoticeFacts = {
    snapshotId: 12,
    label: '2026.10',
    repositoryId: 3,
    repositoryName: 'freight-platform',
    organisationId: '00000000-0000-4000-8000-000000000000',
    cloneBudget: '0.050000',
    fragmentTokens: 10_000_000,
    clonedTokens: 600_000,
    unwaivedClonedTokens: 500_001,
    classCount: 4,
    newClassCount: 1,
    driftedClassCount: 0,
  };
  const lead = { id: 'u', organisationId: facts.organisationId, email: 'ines@brackenfold.example', name: 'Ines Marlow', role: 'lead' };

  it('uses the exact verdict: a ratio right at the budget is not over it', () => {
    expect(isOverBudget({ ...facts, unwaivedClonedTokens: 500_000 })).toBe(false);
    expect(isOverBudget(facts)).toBe(true);
    expect(isOverBudget({ ...facts, cloneBudget: null })).toBe(false);
  });

  it('writes a ratio just over the budget with the decimals that show it is over', () => {
    const notice = budgetNotice(lead, facts);
    expect(notice.subject).toBe('freight-platform 2026.10 is over its clone budget: 5.00001% (budget 5%)');
    expect(notice.text).toContain('Clone ratio without waived classes: 5.00001% (budget 5%)');
    expect(notice.text).toContain('Clone ratio of all clones: 6.00%');
  });
});
