import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { select } from '../../server/clone-index/sql';
import type { TaskStatus } from '../../shared/api/tasks';
import { RELEASES, buildRepository, buildTeam, loadFolder, useDatabase, useMail } from '../support';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';
import { seriousViolations } from './axe';

useDatabase();
useMail();

let session: BrowserSession;
let team: Awaited<ReturnType<typeof buildTeam>>;
let ruleClassId: number;

beforeAll(async () => {
  team = await buildTeam();
  const repository = await buildRepository({ organisationId: team.organisation.id, name: 'freight-platform' });
  const v1 = await loadFolder(repository, `${RELEASES}/v1`, 'v1');
  const [rule] = await select<{ id: number }>(
    undefined,
    `select c.id from clone_classes c join clone_class_members m on m.class_id = c.id join snapshot_files sf on sf.id = m.snapshot_file_id
      where c.snapshot_id = $1 and sf.path = 'billing/tariff.js'`,
    [v1.snapshotId],
  );
  ruleClassId = rule.id;
  session = await startBrowserSession({ width: 1440, height: 900 });
}, 180_000);

afterAll(async () => {
  await session?.close();
});


async function storedTask(): Promise<{ id: number; status: TaskStatus; title: string; assigneeId: string } | undefined> {
  const [row] = await select<{ id: number; status: TaskStatus; title: string; assigneeId: string }>(
    undefined,
    `select id, status, title, assignee_id as "assigneeId" from tasks where organisation_id = $1 order by id desc limit 1`,
    [team.organisation.id],
  );
  return row;
}

const TITLE = 'Merge the tariff rule copies';

describe('refactor tasks in Chromium', () => {
  it('a lead creates a task from a class page; the engineer finds it under "mine", comments and moves it to in review; a viewer only reads', async () => {
    const page = await session.context.newPage();
    try {
      // the lead, on the class page
      await session.context.clearCookies();
      await signInThroughForm(page, session.baseUrl, team.lead);
      await page.goto(`${session.baseUrl}/clone-classes/${ruleClassId}`);
      await page.getByRole('heading', { name: `Clone class #${ruleClassId}` }).waitFor();
      await page.getByRole('button', { name: 'Create refactor task' }).click();
      const form = page.getByRole('form', { name: 'Create refactor task' });
      const title = form.getByLabel('Title');
      await expect(title.inputValue()).resolves.toMatch(/^Merge the 2 copies of /);
      await title.fill(TITLE);
      await form.getByLabel('Description (optional)').fill('Keep the billing copy; the yard calls it.');
      await expect.poll(() => form.getByLabel('Assignee').locator('option').count()).toBeGreaterThan(1);
      await form.getByLabel('Assignee').selectOption({ label: `${team.engineer.name} (engineer)` });
      await form.getByLabel('Due date (optional)').fill('2031-06-30');
      await form.getByRole('button', { name: 'Create task' }).click();
      const taskLine = page.getByRole('group', { name: 'Refactor task' });
      await taskLine.waitFor();
      await expect(taskLine.textContent()).resolves.toContain(TITLE);
      await expect(taskLine.textContent()).resolves.toContain(`assigned to ${team.engineer.name}`);
      const created = (await storedTask())!;
      expect(created).toMatchObject({ status: 'open', title: TITLE, assigneeId: team.engineer.id });
      expect(await seriousViolations(page)).toEqual([]);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'tasks-class-lead.png'), fullPage: true });
      await page.goto(`${session.baseUrl}/tasks/${created.id}`);
      await page.getByRole('heading', { name: `#${created.id} ${TITLE}` }).waitFor();
      await page.getByRole('article').first().waitFor();
      await page.getByRole('button', { name: "Won't do…" }).waitFor();
      // the lead edits the description; the history says so
      await page.getByRole('button', { name: 'Edit title and description' }).click();
      await page.getByRole('form', { name: 'Edit task' }).getByLabel('Description').fill('Keep the billing copy; the yard calls it. Delete the yard copy.');
      await page.getByRole('form', { name: 'Edit task' }).getByRole('button', { name: 'Save' }).click();
      await expect.poll(() => page.getByRole('list', { name: 'History' }).textContent()).toContain('edited the description');
      expect(await seriousViolations(page)).toEqual([]);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'tasks-task-lead.png'), fullPage: true });

      // the engineer finds it under "mine"
      await session.context.clearCookies();
      await signInThroughForm(page, session.baseUrl, team.engineer);
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Tasks' }).click();
      await page.getByRole('heading', { name: 'Tasks', level: 1 }).waitFor();
      await page.getByLabel('Assignee').selectOption('me');
      await expect.poll(() => page.url()).toContain('assignee=me');
      const rows = page.getByRole('table', { name: 'Refactor tasks' }).locator('tbody tr');
      await expect.poll(() => rows.count()).toBe(1);
      expect(await seriousViolations(page)).toEqual([]);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'tasks-list-engineer.png'), fullPage: true });
      await rows.first().getByRole('link').click();
      await page.getByRole('heading', { name: `#${created.id} ${TITLE}` }).waitFor();

      // comments, then moves it along to in review
      await page.getByLabel('Comment', { exact: true }).fill('Both copies now call billing/tariff.js; ready for a look.');
      await page.getByRole('button', { name: 'Comment', exact: true }).click();
      await page.getByRole('list', { name: 'Comments' }).getByText('ready for a look').waitFor();
      await page.getByRole('button', { name: 'Start work' }).click();
      await page.getByRole('button', { name: 'Ready for review' }).click();
      await page.getByRole('button', { name: 'Back to in progress' }).waitFor();
      await expect.poll(async () => (await storedTask())?.status).toBe('in_review');
      const history = page.getByRole('list', { name: 'History' });
      await expect.poll(() => history.textContent()).toContain('moved it from In progress to In review');
      // an engineer has no lead's controls
      expect(await page.getByRole('button', { name: "Won't do…" }).count()).toBe(0);
      expect(await page.getByRole('form', { name: 'Assignment' }).count()).toBe(0);
      await page.getByRole('article').first().waitFor();
      expect(await seriousViolations(page)).toEqual([]);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'tasks-task-engineer.png'), fullPage: true });

      // the overview lists it among the engineer's open tasks
      await page.goto(`${session.baseUrl}/`);
      const card = page.getByRole('region', { name: 'Your open tasks' });
      await card.getByRole('link', { name: `#${created.id} ${TITLE}` }).waitFor();
      await page.screenshot({ path: path.join(SCREENSHOTS, 'tasks-overview-engineer.png'), fullPage: true });

      // a viewer reads the task, its comment and history, with no button to change it
      await session.context.clearCookies();
      await signInThroughForm(page, session.baseUrl, team.viewer);
      await page.goto(`${session.baseUrl}/tasks/${created.id}`);
      await page.getByRole('heading', { name: `#${created.id} ${TITLE}` }).waitFor();
      await page.getByRole('list', { name: 'Comments' }).getByText('ready for a look').waitFor();
      await page.getByRole('article').first().waitFor();
      expect(await page.getByRole('group', { name: 'Change status' }).count()).toBe(0);
      expect(await page.getByRole('form', { name: 'Add a comment' }).count()).toBe(0);
      expect(await seriousViolations(page)).toEqual([]);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'tasks-task-viewer.png'), fullPage: true });
      await page.goto(`${session.baseUrl}/tasks`);
      await expect.poll(() => page.getByRole('table', { name: 'Refactor tasks' }).locator('tbody tr').count()).toBe(1);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'tasks-list-viewer.png'), fullPage: true });
    } finally {
      await page.close();
    }
  });
});
