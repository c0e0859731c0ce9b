import { createRequire } from 'node:module';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoRepositories } from '../../server/commands/seedDemoRepositories';
import { buildTeam, useDatabase, useMail } from '../support';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';

useDatabase();
useMail();

let session: BrowserSession;
let team: Awaited<ReturnType<typeof buildTeam>>;

beforeAll(async () => {
  team = await buildTeam();
  // the demo's repositories and tasks, seeded into this file's own organisation
  await seedDemoRepositories(team.organisation);
  session = await startBrowserSession({ width: 1440, height: 900 });
}, 240_000);

afterAll(async () => {
  await session?.close();
});

// axe-core's bundle, evaluated through the DevTools protocol (the page's CSP forbids inline script).
const AXE_SOURCE: string = createRequire(import.meta.url)('axe-core').source;

async function seriousViolations(page: Page): Promise<string[]> {
  await page.evaluate(AXE_SOURCE);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run(ctx: Document): Promise<{ violations: Array<{ id: string; impact: string | null; nodes: Array<{ target: string[] }> }> }> } }).axe;
    return (await axe.run(document)).violations;
  });
  return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.impact} ${v.id} at ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(', ')}`);
}

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
      await page.getByText('Doublet marked this task done: snapshot 2026.11 no longer has the copies.', { exact: false }).waitFor();
      await expect(page.getByRole('list', { name: 'History' }).textContent()).resolves.toContain('Doublet moved it from In progress to Done');
      // the class shown is the last one the lineage had (2026.10)
      await page.getByText('in 2026.10').waitFor();
      await page.getByRole('article').first().waitFor();
      expect(await seriousViolations(page)).toEqual([]);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'tasks-demo-done-automatically.png'), fullPage: true });
    } finally {
      await page.close();
    }
  });
});
