import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { select } from '../../server/clone-index/sql';
import { seedDemoRepositories } from '../../server/commands/seedDemoRepositories';
import { seedDemoTasks } from '../../server/commands/seedDemoTasks';
import { buildTeam, useDatabase, useMail } from '../support';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';
import { seriousViolations } from './axe';

useDatabase();
useMail();

let session: BrowserSession;
let team: Awaited<ReturnType<typeof buildTeam>>;
/** The release whose load closed the done task, and the last release its class was in. */
let closedBy: string;
let lastSeen: string;

beforeAll(async () => {
  team = await buildTeam();
  // the demo's repositories and tasks, seeded into this file's own organisation
  await seedDemoRepositories(team.organisation);
  await seedDemoTasks(team.organisation);
  [{ closedBy, lastSeen }] = await select<{ closedBy: string; lastSeen: string }>(
    undefined,
    `select cs.label as "closedBy",
            (select s.label from clone_classes c join snapshots s on s.id = c.snapshot_id where c.lineage_id = t.lineage_id order by s.id desc limit 1) as "lastSeen"
       from tasks t join snapshots cs on cs.id = t.closed_by_snapshot_id
      where t.organisation_id = $1 and t.status = 'done'`,
    [team.organisation.id],
  );
  session = await startBrowserSession({ width: 1440, height: 900 });
}, 600_000);

afterAll(async () => {
  await session?.close();
});

describe("the demo's tasks in Chromium", () => {
  it('shows the engineer a task in progress and one the automatic check closed, naming the snapshot', async () => {
    const page = await session.context.newPage();
    try {
      await signInThroughForm(page, session.baseUrl, team.engineer);
      await page.goto(`${session.baseUrl}/tasks?assignee=me`);
      const rows = page.getByRole('table', { name: 'Refactor tasks' }).locator('tbody tr');
      await expect.poll(() => rows.count()).toBe(2);
      await expect(rows.allTextContents()).resolves.toEqual([expect.stringContaining('Done'), expect.stringContaining('In progress')]);
      await page.getByLabel('Status').selectOption('active');
      await expect.poll(() => rows.count()).toBe(1);
      await page.getByLabel('Status').selectOption('done');
      await expect.poll(() => rows.count()).toBe(1);
      await rows.first().getByRole('link').click();
      await page.getByText(`Doublet marked this task done: snapshot ${closedBy} no longer has the copies.`, { exact: false }).waitFor();
      await expect(page.getByRole('list', { name: 'History' }).textContent()).resolves.toContain('Doublet moved it from In progress to Done');
      // the class shown is the last one the lineage had
      await page.getByText(`in ${lastSeen}`).waitFor();
      await page.getByRole('article').first().waitFor();
      expect(await seriousViolations(page)).toEqual([]);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'tasks-demo-done-automatically.png'), fullPage: true });
    } finally {
      await page.close();
    }
  });
});
