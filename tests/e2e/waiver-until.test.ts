import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { select } from '../../server/clone-index/sql';
import type { Repository } from '../../server/models/Repository';
import { RELEASES, buildRepository, buildTeam, loadFolder, useDatabase } from '../support';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';
import { seriousViolations } from './axe';

useDatabase();

let session: BrowserSession;
let team: Awaited<ReturnType<typeof buildTeam>>;
let repository: Repository;
let inspectionClassId: number;

/** The class of a snapshot that has tools/inspect.py as a member. */
async function inspectionClass(snapshotId: number): Promise<number> {
  const [row] = await select<{ id: number }>(
    undefined,
    `select c.id from clone_classes c join clone_class_members m on m.class_id = c.id join snapshot_files sf on sf.id = m.snapshot_file_id
      where c.snapshot_id = $1 and sf.path = 'tools/inspect.py'`,
    [snapshotId],
  );
  return row.id;
}

beforeAll(async () => {
  team = await buildTeam();
  repository = await buildRepository({ organisationId: team.organisation.id, name: 'depot-tools' });
  const v1 = await loadFolder(repository, `${RELEASES}/v1`, '2026.09');
  inspectionClassId = await inspectionClass(v1.snapshotId);
  session = await startBrowserSession({ width: 1440, height: 900 });
}, 180_000);

afterAll(async () => {
  await session?.close();
});


describe('a waiver until a release, in Chromium', () => {
  it('is refused for a release already loaded, holds until its release, then shows that it ended and why', async () => {
    const page = await session.context.newPage();
    try {
      await signInThroughForm(page, session.baseUrl, team.lead);
      await page.goto(`${session.baseUrl}/clone-classes/${inspectionClassId}`);
      await page.getByRole('button', { name: 'Waive…' }).click();
      const form = page.getByRole('form', { name: 'Waive this clone class' });
      await form.getByLabel('Reason').fill('Depot tools retire in 2026.10');
      const until = form.getByLabel('Until release (optional)');
      expect(await form.getByText('The waiver ends by itself when this release, or a later version of it, is loaded.').count()).toBe(1);
      await until.fill('2026.09');
      await form.getByRole('button', { name: 'Waive', exact: true }).click();
      await page.getByRole('alert').filter({ hasText: 'Until release: "2026.09" is already loaded' }).waitFor();
      await page.screenshot({ path: path.join(SCREENSHOTS, 'waiver-until-refused.png'), fullPage: true });
      expect(await seriousViolations(page)).toEqual([]);

      await until.fill('2026.10');
      await form.getByRole('button', { name: 'Waive', exact: true }).click();
      await page.getByRole('button', { name: 'Lift waiver' }).waitFor();
      await expect(page.getByLabel('Waiver').textContent()).resolves.toContain('until release 2026.10');

      const v2 = await loadFolder(repository, `${RELEASES}/v2`, '2026.10');
      const laterClassId = await inspectionClass(v2.snapshotId);
      for (const who of ['lead', 'viewer'] as const) {
        if (who === 'viewer') {
          await session.context.clearCookies();
          await signInThroughForm(page, session.baseUrl, team.viewer);
        }
        await page.goto(`${session.baseUrl}/clone-classes/${laterClassId}`);
        await page.getByText('Its waiver ended in 2026.10: it was waived until release 2026.10.').waitFor();
        expect(await page.getByRole('button', { name: 'Lift waiver' }).count()).toBe(0);
        expect(await page.getByRole('button', { name: 'Waive…' }).count()).toBe(who === 'lead' ? 1 : 0);
        await page.screenshot({ path: path.join(SCREENSHOTS, `waiver-until-ended-${who}.png`), fullPage: true });
        expect(await seriousViolations(page)).toEqual([]);
      }
    } finally {
      await page.close();
    }
  }, 180_000);
});
