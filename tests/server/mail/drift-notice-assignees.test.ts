import type { Express } from 'express';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { select } from '../../../server/clone-index/sql';
import { db } from '../../../server/db/connection';
import { openTaskAssigneesOfLineages } from '../../../server/queries/notices';
import type { CloneClassPageDTO } from '../../../shared/api/snapshots';
import { buildRepository, buildTeam, buildUser, loadFolder, mailTo, RELEASES, signedInAgent, useDatabase, useMail } from '../../support';

useDatabase();
const mail = useMail();

let app: Express;
beforeAll(() => {
  app = createApp();
});

/** mail.send jobs to an address in this file's queue, whatever their state. */
async function queuedTo(email: string): Promise<string[]> {
  const [rows] = await db().query(`select data->>'subject' as subject from "${mail.schema}".job where name = 'mail.send' and data->>'to' = $1`, { bind: [email] });
  return (rows as { subject: string }[]).map((r) => r.subject);
}

describe('the drift notice and refactor tasks', () => {
  it('also goes to the assignee of an open task on a drifted lineage, naming only that class', { timeout: 120_000 }, async () => {
    const team = await buildTeam();
    const other = await buildUser({ role: 'engineer', organisation: team.organisation });
    const repository = await buildRepository({ organisationId: team.organisation.id, name: 'freight-platform' });
    const v1 = await loadFolder(repository, `${RELEASES}/v1`, '2026.09');
    const lead = await signedInAgent(app, team.lead);
    const classes = ((await lead.get(`/api/snapshots/${v1.snapshotId}/classes`).expect(200)).body as CloneClassPageDTO).classes;
    const rule = classes.find((c) => c.paths.includes('billing/tariff.js'))!;
    const inspect = classes.find((c) => c.paths.includes('tools/inspect.py'))!;
    await lead.post('/api/tasks').send({ cloneClassId: rule.id, assigneeId: team.engineer.id, title: 'Merge the pricing rule' }).expect(201);
    await lead.post('/api/tasks').send({ cloneClassId: inspect.id, assigneeId: other.id, title: 'Merge the inspection rule' }).expect(201);
    const assignees = await openTaskAssigneesOfLineages(undefined, [rule.lineageId, inspect.lineageId]);
    expect(assignees).toEqual(new Map([[team.engineer.id, new Set([rule.lineageId])], [other.id, new Set([inspect.lineageId])]]));

    // 2026.10 fixes the pricing rule in one copy only: that class drifts, the inspection rule does not
    const v2 = await loadFolder(repository, `${RELEASES}/v2`, '2026.10');
    const [drifted] = await select<{ id: number }>(undefined, `select id from clone_classes where snapshot_id = $1 and status = 'drifted'`, [v2.snapshotId]);
    const toAssignee = (await mailTo(team.engineer.email, 2)).find((m) => m.subject.includes('drifted'));
    expect(toAssignee?.subject).toBe('freight-platform 2026.10: 1 drifted clone class');
    expect(toAssignee?.text).toContain(`/clone-classes/${drifted.id}`);
    await mailTo(team.lead.email);
    expect((await queuedTo(other.email)).filter((s) => s.includes('drifted'))).toEqual([]);
  });
});
