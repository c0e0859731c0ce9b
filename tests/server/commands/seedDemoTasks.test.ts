import { describe, expect, it } from 'vitest';
import { select } from '../../../server/clone-index/sql';
import { seedDemoRepositories } from '../../../server/commands/seedDemoRepositories';
import { seedDemoTasks } from '../../../server/commands/seedDemoTasks';
import { buildOrganisation, buildTeam, mailTo, useDatabase, useMail } from '../../support';

useDatabase();
useMail();

describe('seedDemoTasks', () => {
  it('gives the demo two tasks in different states: one in progress with comments, one the automatic check closed', { timeout: 240_000 }, async () => {
    const team = await buildTeam();
    const lines = await seedDemoRepositories(team.organisation);
    expect(lines.at(-1)).toBe(`  2 refactor tasks assigned to ${team.engineer.name}`);
    const tasks = await select<{ status: string; comments: number; events: string[]; repository: string; createdBy: string; closedBy: string | null }>(
      undefined,
      `select t.status, r.name as repository, t.created_by as "createdBy", cs.label as "closedBy",
              (select count(*)::int from task_comments c where c.task_id = t.id) as comments,
              (select array_agg(e.kind || ':' || coalesce(e.to_value, '') || ':' || e.automatic order by e.id) from task_events e where e.task_id = t.id) as events
         from tasks t join repositories r on r.id = t.repository_id left join snapshots cs on cs.id = t.closed_by_snapshot_id
        where t.organisation_id = $1 order by t.id`,
      [team.organisation.id],
    );
    // the latest snapshots hold one class (the pricing rule, freight-platform 2026.11); the
    // inspection rule's copies are gone from 2026.11, so its task shows the automatic check
    expect(tasks.map((t) => [t.status, t.comments, t.repository, t.closedBy, t.events])).toEqual([
      ['in_progress', 2, 'freight-platform', null, ['created:Open:false', 'status:In progress:false']],
      ['done', 0, 'freight-platform', '2026.11', ['created:Open:false', 'status:In progress:false', 'status:Done:true']],
    ]);
    expect(tasks.every((t) => t.createdBy === team.lead.id)).toBe(true);
    // the assignments were mailed, as they are through the API
    const mails = await mailTo(team.engineer.email, 3);
    expect(mails.map((m) => m.subject.split(':')[0]).sort()).toEqual(['Task assigned to you', 'Task assigned to you', 'Task done by release 2026.11']);
  });

  it('seeds nothing without a lead and an engineer', async () => {
    expect(await seedDemoTasks(await buildOrganisation())).toEqual([]);
  });
});
