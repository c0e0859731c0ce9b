import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { LoadSnapshotResult } from '../../server/commands/loadSnapshot';
import { select } from '../../server/clone-index/sql';
import { RELEASES, buildRepository, buildTeam, loadFolder, useDatabase } from '../support';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';

useDatabase();

let session: BrowserSession;
let team: Awaited<ReturnType<typeof buildTeam>>;
let v1: LoadSnapshotResult;
let ruleClassId: number;

beforeAll(async () => {
  team = await buildTeam();
  const repository = await buildRepository({ organisationId: team.organisation.id, name: 'freight-platform' });
  v1 = await loadFolder(repository, `${RELEASES}/v1`, 'v1');
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

describe('waiving a clone class with Chromium', () => {
  it('lets a lead waive the pricing rule with a reason, lists it apart, and lift the waiver again', async () => {
    const page = await session.context.newPage();
    try {
      await signInThroughForm(page, session.baseUrl, team.lead);
      await page.goto(`${session.baseUrl}/clone-classes/${ruleClassId}`);
      await page.getByRole('heading', { name: `Clone class #${ruleClassId}` }).waitFor();
      await page.getByRole('button', { name: 'Waive…' }).click();
      const form = page.getByRole('form', { name: 'Waive this clone class' });
      await form.getByLabel('Reason').fill('Kept apart until the yard rewrite');
      await form.getByLabel('Until release (optional)').fill('v4');
      await form.getByRole('button', { name: 'Waive', exact: true }).click();
      await page.getByRole('button', { name: 'Lift waiver' }).waitFor();
      await expect(page.getByLabel('Waiver').textContent()).resolves.toContain('until release v4');
      await page.screenshot({ path: path.join(SCREENSHOTS, 'waiver-class.png'), fullPage: true });

      await page.goto(`${session.baseUrl}/snapshots/${v1.snapshotId}`);
      await page.getByRole('table', { name: 'Clone classes' }).waitFor();
      await page.getByLabel('Waived (1)').selectOption('only');
      const rows = page.getByRole('table', { name: 'Clone classes' }).locator('tbody tr');
      await expect.poll(() => rows.count()).toBe(1);
      await expect(rows.first().getByText('waived').getAttribute('title')).resolves.toBe('Kept apart until the yard rewrite');
      await expect(page.getByText('unwaived', { exact: true }).count()).resolves.toBe(1);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'waiver-snapshot.png'), fullPage: true });

      await page.goto(`${session.baseUrl}/clone-classes/${ruleClassId}`);
      await page.getByRole('button', { name: 'Lift waiver' }).click();
      await page.getByRole('button', { name: 'Waive…' }).waitFor();
    } finally {
      await page.close();
    }
  });

  it('shows a viewer neither the waive nor the lift button', async () => {
    const page = await session.context.newPage();
    try {
      await session.context.clearCookies();
      await signInThroughForm(page, session.baseUrl, team.viewer);
      await page.goto(`${session.baseUrl}/clone-classes/${ruleClassId}`);
      await page.getByRole('heading', { name: `Clone class #${ruleClassId}` }).waitFor();
      await page.getByRole('article').first().waitFor();
      expect(await page.getByRole('button', { name: 'Waive…' }).count()).toBe(0);
      expect(await page.getByRole('button', { name: 'Lift waiver' }).count()).toBe(0);
    } finally {
      await page.close();
    }
  });
});
