import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { LoadSnapshotResult } from '../../server/commands/loadSnapshot';
import type { Repository } from '../../server/models/Repository';
import type { User } from '../../server/models/User';
import { PASTED_PRICING_RULE, RELEASES, buildRepository, buildTeam, loadFolder, useDatabase } from '../support';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';

useDatabase();

let session: BrowserSession;
let team: Awaited<ReturnType<typeof buildTeam>>;
let repository: Repository;
let loads: Record<'v1' | 'v2' | 'v3', LoadSnapshotResult>;

beforeAll(async () => {
  team = await buildTeam();
  repository = await buildRepository({ organisationId: team.organisation.id, name: 'freight-platform', description: 'Brackenfold consignment pricing and yard tools' });
  loads = {
    v1: await loadFolder(repository, `${RELEASES}/v1`, 'v1'),
    v2: await loadFolder(repository, `${RELEASES}/v2`, 'v2'),
    v3: await loadFolder(repository, `${RELEASES}/v3`, 'v3'),
  };
  // A budget between the lowest and the highest release, so the reference line sits inside the chart.
  const ratios = Object.values(loads).map((l) => l.cloneRatio);
  await repository.update({ cloneBudget: (Math.round(((Math.min(...ratios) + Math.max(...ratios)) / 2) * 1000) / 1000).toFixed(3) });

  session = await startBrowserSession({ width: 1440, height: 900 });
}, 180_000);

afterAll(async () => {
  await session?.close();
});

async function signIn(page: Page, user: User) {
  // One browser profile serves every test: start each without the previous user's session.
  await session.context.clearCookies();
  await signInThroughForm(page, session.baseUrl, user);
}

/** A page that records console errors (401s before sign-in aside). */
async function openPage(): Promise<{ page: Page; consoleErrors: string[] }> {
  const page = await session.context.newPage();
  const consoleErrors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error' && !/401|Unauthorized/.test(m.text())) consoleErrors.push(m.text());
  });
  return { page, consoleErrors };
}

describe('reviewing clones with Chromium', () => {
  it('takes a viewer from the repository list through the trend and the v2 snapshot to the drifted class, side by side', async () => {
    const { page, consoleErrors } = await openPage();
    try {
      await signIn(page, team.viewer);
      // One repository: the organisation's clone ratio is its latest release's, and the trend has a point a load.
      const v3Percent = `${(loads.v3.cloneRatio * 100).toFixed(1)} %`;
      const overall = page.getByRole('group', { name: 'Clone ratio, all repositories' });
      await expect.poll(() => overall.textContent()).toContain(v3Percent);
      const trend = page.locator('figure[aria-label="Clone ratio across all repositories"]');
      await trend.locator('.recharts-line-dot').first().waitFor();
      expect(await trend.locator('.recharts-line-dot').count()).toBe(3);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'review-overview.png'), fullPage: true });

      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Repositories' }).click();
      // the overview's latest loads also have freight-platform rows: wait for the list page first
      await page.getByRole('heading', { name: 'Repositories', exact: true }).waitFor();
      const row = page.getByRole('row', { name: /freight-platform/ });
      await row.waitFor();
      await expect(row.textContent()).resolves.toContain(v3Percent);
      // The budget lies between the releases' ratios; "over budget" shows exactly when v3 is above it.
      const overBudget = loads.v3.cloneRatio > Number(repository.cloneBudget);
      expect(await row.getByText('over budget').count()).toBe(overBudget ? 1 : 0);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'review-repositories.png'), fullPage: true });

      await row.getByRole('link', { name: 'freight-platform' }).click();
      await page.getByRole('heading', { name: 'freight-platform' }).waitFor();
      // The trend: one dot per release, oldest first, with the budget line.
      const chart = page.locator('figure[aria-label="Clone ratio by release"]');
      await chart.locator('.recharts-line-dots').waitFor();
      expect(await chart.locator('.recharts-line-dot').count()).toBe(3);
      await expect.poll(() => chart.locator('.recharts-xAxis-tick-labels .recharts-cartesian-axis-tick-value').allTextContents()).toEqual(['v1', 'v2', 'v3']);
      expect(await chart.locator('.recharts-reference-line').count()).toBe(1);
      // A viewer reads; settings and delete are for leads.
      expect(await page.getByRole('button', { name: 'Save settings' }).count()).toBe(0);
      const snapshots = page.getByRole('table', { name: 'Snapshots' });
      expect(await snapshots.locator('tbody tr td:first-child').allTextContents()).toEqual(['v3', 'v2', 'v1']);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'review-repository.png'), fullPage: true });

      await snapshots.getByRole('link', { name: 'v2', exact: true }).click();
      await page.getByRole('heading', { name: 'Snapshot v2' }).waitFor();
      await page.getByRole('table', { name: 'Clone classes' }).waitFor();
      await page.getByLabel('Status', { exact: true }).selectOption('drifted');
      await page.waitForURL(/[?&]status=drifted\b/);
      const classRows = page.getByRole('table', { name: 'Clone classes' }).locator('tbody tr');
      await expect.poll(() => classRows.count()).toBe(1);
      await expect(classRows.first().textContent()).resolves.toMatch(/drifted.*billing\/tariff\.js.*yard\/shunting\.js/);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'review-snapshot-v2-drifted.png'), fullPage: true });

      // The filter lives in the URL: a reload keeps it.
      await page.reload({ waitUntil: 'networkidle' });
      expect(await page.getByLabel('Status', { exact: true }).inputValue()).toBe('drifted');
      await expect.poll(() => classRows.count()).toBe(1);

      await classRows.first().getByRole('link', { name: /^Open clone class/ }).click();
      await page.getByRole('heading', { name: /^Clone class #\d+$/ }).waitFor();
      const left = page.getByRole('article', { name: /^Left: / });
      const right = page.getByRole('article', { name: /^Right: / });
      await left.waitFor();
      const sides = [await left.getAttribute('aria-label'), await right.getAttribute('aria-label')].sort();
      expect(sides.map((s) => s!.replace(/^(Left|Right): /, '')).sort()).toEqual(['billing/tariff.js', 'yard/shunting.js']);
      // Both members' code is on screen, next to each other (same top, left column first).
      await expect(page.getByRole('region', { name: /Code of priceConsignment/ }).textContent()).resolves.toContain('export function priceConsignment(wagons, distanceKm, contract)');
      await expect(page.getByRole('region', { name: /Code of quoteYardMove/ }).textContent()).resolves.toContain('quoteYardMove');
      const [leftBox, rightBox] = [await left.boundingBox(), await right.boundingBox()];
      expect(leftBox!.y).toBe(rightBox!.y);
      expect(rightBox!.x).toBeGreaterThanOrEqual(leftBox!.x + leftBox!.width);
      // Only the tariff copy was edited in v2: the class drifted.
      expect(await page.getByText('changed since last release').count()).toBe(1);
      const tariff = page.getByRole('article', { name: /billing\/tariff\.js$/ });
      expect(await tariff.getByText('changed since last release').count()).toBe(1);
      // Code is set in IBM Plex Mono.
      const family = await page.getByRole('region', { name: /Code of priceConsignment/ }).locator('pre').evaluate((el) => getComputedStyle(el).fontFamily);
      expect(family).toContain('IBM Plex Mono');
      await expect(page.getByRole('status', { name: 'Pair shown' }).textContent()).resolves.toMatch(/similarity 0\.\d{3}|similarity 1\.000/);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'review-clone-class.png'), fullPage: true });

      // v3 adds a third copy (billing/quotes.js): the class grew, and a chooser picks which two to compare.
      await page.goto(`${session.baseUrl}/snapshots/${loads.v3.snapshotId}?status=grown`, { waitUntil: 'networkidle' });
      await expect.poll(() => classRows.count()).toBe(1);
      await classRows.first().getByRole('link', { name: /^Open clone class/ }).click();
      const chooseRight = page.getByLabel('Right', { exact: true });
      await chooseRight.waitFor();
      expect(await chooseRight.locator('option').count()).toBe(3);
      const optionLabel = async (file: string) => (await chooseRight.locator('option', { hasText: file }).textContent())!;
      await page.getByLabel('Left', { exact: true }).selectOption({ label: await optionLabel('billing/tariff.js') });
      await chooseRight.selectOption({ label: await optionLabel('billing/quotes.js') });
      await expect.poll(() => left.getAttribute('aria-label')).toBe('Left: billing/tariff.js');
      await expect.poll(() => right.getAttribute('aria-label')).toBe('Right: billing/quotes.js');
      await expect(page.getByRole('region', { name: /Code of quoteForCustomer/ }).textContent()).resolves.toContain('quoteForCustomer(units, kilometres, terms)');
      await page.screenshot({ path: path.join(SCREENSHOTS, 'review-clone-class-three.png'), fullPage: true });
      expect(consoleErrors).toEqual([]);
    } finally {
      await page.close();
    }
  }, 90_000);

  it('lets an engineer paste a copy of the pricing rule into find copies and see the copies in the latest release', async () => {
    const { page, consoleErrors } = await openPage();
    try {
      await signIn(page, team.engineer);
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Find copies' }).click();
      await page.getByRole('heading', { name: 'Find copies' }).waitFor();
      // The shared schema's message, before anything is sent.
      await page.getByRole('button', { name: 'Find copies' }).click();
      await page.getByText('Paste some code.').waitFor();

      // The threshold field starts at the default, so the search runs at 0.7 unless changed.
      expect(await page.getByLabel('Threshold').inputValue()).toBe('0.7');
      await page.getByLabel('Code', { exact: true }).fill(PASTED_PRICING_RULE);
      await page.getByRole('button', { name: 'Find copies' }).click();
      const table = page.getByRole('table', { name: 'Copies found' });
      await table.waitFor();
      const rows = await table.locator('tbody tr').allInnerTexts();
      const found = rows.map((r) => r.split('\t').map((cell) => cell.trim()));
      // Every copy is in the latest snapshot of the repository. All of them reach 0.8, the old
      // default, too: the lower default adds no copy of the pricing rule in the demo.
      expect(found.every((cells) => cells[1] === 'freight-platform@v3')).toBe(true);
      expect(found.every((cells) => Number(cells[0]) >= 0.8)).toBe(true);
      // The demo's v3 has the rule in billing (the original), the yard and the sales desk quotes.
      expect(found.map((cells) => `${cells[2].replace(/:.*/, '')} ${cells[3]}`).sort()).toEqual([
        'billing/quotes.js quoteForCustomer',
        'billing/tariff.js priceConsignment',
        'yard/shunting.js quoteYardMove',
      ]);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'review-find-copies.png'), fullPage: true });
      expect(consoleErrors).toEqual([]);
    } finally {
      await page.close();
    }
  }, 60_000);

  it('lets a lead add a repository, tighten the budget of another until it shows over budget, and delete the new one', async () => {
    const { page, consoleErrors } = await openPage();
    try {
      await signIn(page, team.lead);
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Repositories' }).click();
      const create = page.getByRole('region', { name: 'Add a repository' });
      await create.getByLabel('Name').fill('depot tools!');
      await create.getByRole('button', { name: 'Add repository' }).click();
      // The shared schema's message; nothing was created.
      await create.getByText('Letters, digits, dot, dash, underscore and slash only.').waitFor();
      await create.getByLabel('Name').fill('depot-tools');
      await create.getByLabel('Clone budget').fill('0.1');
      await create.getByRole('button', { name: 'Add repository' }).click();
      await page.getByRole('heading', { name: 'depot-tools' }).waitFor();
      await page.getByText('No snapshots yet.').waitFor();

      await page.goto(`${session.baseUrl}/repositories/${repository.id}`, { waitUntil: 'networkidle' });
      await page.getByRole('heading', { name: 'freight-platform' }).waitFor();
      // A budget just under the latest release's ratio puts the repository over it.
      const budget = Math.floor(loads.v3.cloneRatio * 100 - 2) / 100;
      const settings = page.getByRole('region', { name: 'Settings' });
      await settings.getByLabel('Clone budget').fill(String(budget));
      await settings.getByLabel('Ignore').fill('vendor/\n\n  **/*.generated.js  ');
      await settings.getByRole('button', { name: 'Save settings' }).click();
      await settings.getByText('Settings saved.').waitFor();
      await page.getByRole('heading', { name: 'freight-platform' }).locator('..').getByText('over budget').waitFor();
      await expect
        .poll(() => page.locator('figure[aria-label="Clone ratio by release"] svg').textContent())
        .toContain(`budget ${(budget * 100).toFixed(1)} %`);
      // What the server kept: blank lines dropped, patterns trimmed.
      await page.reload({ waitUntil: 'networkidle' });
      expect(await page.getByRole('region', { name: 'Settings' }).getByLabel('Ignore').inputValue()).toBe('vendor/\n**/*.generated.js');
      await page.screenshot({ path: path.join(SCREENSHOTS, 'review-repository-lead.png'), fullPage: true });

      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Repositories' }).click();
      await page.getByRole('row', { name: /freight-platform/ }).getByText('over budget').waitFor();
      await page.getByRole('link', { name: 'depot-tools' }).click();
      await page.getByRole('button', { name: 'Delete repository…' }).click();
      await page.getByRole('button', { name: 'Delete for good' }).click();
      await page.waitForURL(/\/repositories$/);
      await page.getByRole('row', { name: /freight-platform/ }).waitFor();
      await expect.poll(() => page.getByRole('link', { name: 'depot-tools' }).count()).toBe(0);
      expect(consoleErrors).toEqual([]);
    } finally {
      await page.close();
    }
  }, 60_000);
});
