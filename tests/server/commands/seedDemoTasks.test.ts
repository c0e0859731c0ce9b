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
    await seedDemoRepositories(team.organisation);
    const lines = await seedDemoTasks(team.organisation);
    expect(lines).toEqual([`  2 refactor tasks assigned to ${team.engineer.name}`]);
    const tasks = await select<{ status: string; comments: number; events: string[]; repository: string; createdBy: string; closedBy: string | null; latest: string }>(
      undefined,
      `select t.status, r.name as repository, t.created_by as "createdBy", cs.label as "closedBy",
              (select s.label from snapshots s where s.repository_id = r.id order by s.id desc limit 1) as latest,
              (select count(*)::int from task_comments c where c.task_id = t.id) as comments,
              (select array_agg(e.kind || ':' || coalesce(e.to_value, '') || ':' || e.automatic order by e.id) from task_events e where e.task_id = t.id) as events
         from tasks t join repositories r on r.id = t.repository_id left join snapshots cs on cs.id = t.closed_by_snapshot_id
        where t.organisation_id = $1 order by t.id`,
      [team.organisation.id],
    );
    // the demo's refactor (consignment-billing 2025.08) leaves classes whose copies are gone, so
    // the second task shows the automatic check, closed by the latest release of its repository
    expect(tasks).toHaveLength(2);
    expect([tasks[0].status, tasks[0].comments, tasks[0].closedBy, tasks[0].events]).toEqual(['in_progress', 2, null, ['created:Open:false', 'status:In progress:false']]);
    expect([tasks[1].status, tasks[1].comments, tasks[1].closedBy, tasks[1].events]).toEqual([
      'done',
      0,
      tasks[1].latest,
      ['created:Open:false', 'status:In progress:false', 'status:Done:true'],
    ]);
    expect(tasks.every((t) => t.createdBy === team.lead.id)).toBe(true);
    // the assignments were mailed, as they are through the API (the engineer also gets the
    // drift notices of the lineages their open task is on)
    const taskMails = (all: { subject: string }[]) => all.filter((m) => m.subject.startsWith('Task '));
    let arrived = await mailTo(team.engineer.email, 3);
    for (let count = 4; taskMails(arrived).length < 3; count += 1) arrived = await mailTo(team.engineer.email, count);
    const mails = taskMails(arrived);
    expect(mails.map((m) => m.subject.split(':')[0]).sort()).toEqual(['Task assigned to you', 'Task assigned to you', `Task done by release ${tasks[1].latest}`]);
  });

  it('seeds nothing without a lead and an engineer', async () => {
    expect(await seedDemoTasks(await buildOrganisation())).toEqual([]);
  });
});
