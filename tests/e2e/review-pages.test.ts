import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { LoadSnapshotResult } from '../../server/commands/loadSnapshot';
import type { Repository } from '../../server/models/Repository';
import type { User } from '../../server/models/User';
import { RELEASES, buildRepository, buildTeam, loadFolder, useDatabase } from '../support';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';
import { seriousViolations } from './axe';

useDatabase();

let session: BrowserSession;
let team: Awaited<ReturnType<typeof buildTeam>>;
let repository: Repository;
let loads: Record<'v1' | 'v2' | 'v3', LoadSnapshotResult>;
/** A snapshot whose one class is two copies of a rate rule that differ in one literal. */
let ratesLoad: LoadSnapshotResult;

// Invented for this test: a rate rule copied from road to rail with one surcharge changed.
const RATE_RULE = (surcharge: string) => `export function rateFor(legs, tariff) {
  let amount = 0;
  for (const leg of legs) {
    const base = leg.tonnes * tariff.perTonne + leg.stops * 12;
    const night = leg.atNight ? base * ${surcharge} : 0;
    amount += (base + night) * Math.max(1, leg.km / 50);
  }
  if (tariff.rebate > 0) {
    amount = amount - amount * tariff.rebate;
  }
  return Math.round(amount * 100) / 100;
}
`;

beforeAll(async () => {
  team = await buildTeam();
  repository = await buildRepository({ organisationId: team.organisation.id, name: 'freight-platform', description: 'Brackenfold consignment pricing and yard tools' });
  loads = {
    v1: await loadFolder(repository, `${RELEASES}/v1`, 'v1'),
    v2: await loadFolder(repository, `${RELEASES}/v2`, 'v2'),
    v3: await loadFolder(repository, `${RELEASES}/v3`, 'v3'),
  };
  const ratesFolder = fs.mkdtempSync(path.join(os.tmpdir(), 'rates-desk-'));
  fs.mkdirSync(path.join(ratesFolder, 'rates'));
  fs.writeFileSync(path.join(ratesFolder, 'rates', 'road.js'), RATE_RULE('0.15'));
  fs.writeFileSync(path.join(ratesFolder, 'rates', 'rail.js'), RATE_RULE('0.2'));
  const rates = await buildRepository({ organisationId: team.organisation.id, name: 'rates-desk' });
  ratesLoad = await loadFolder(rates, ratesFolder, 'r1');
  fs.rmSync(ratesFolder, { recursive: true, force: true });
  session = await startBrowserSession({ width: 1440, height: 900 });
}, 180_000);

afterAll(async () => {
  await session?.close();
});

/** A signed-in page that records console errors (and CSP reports, which arrive as console errors). */
async function pageAs(user: User): Promise<{ page: Page; consoleErrors: string[] }> {
  await session.context.clearCookies();
  const page = await session.context.newPage();
  const consoleErrors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error' && !/401|Unauthorized/.test(m.text())) consoleErrors.push(m.text());
  });
  await signInThroughForm(page, session.baseUrl, user);
  return { page, consoleErrors };
}

/** Opens the only class of a snapshot with that status (through the snapshot page) and waits until its code is coloured. */
async function openClass(page: Page, snapshotId: number, status: string): Promise<string> {
  await page.goto(`${session.baseUrl}/snapshots/${snapshotId}?status=${status}`, { waitUntil: 'networkidle' });
  const rows = page.getByRole('table', { name: 'Clone classes' }).locator('tbody tr');
  await expect.poll(() => rows.count()).toBe(1);
  await rows.first().getByRole('link', { name: /^Open clone class/ }).click();
  await page.getByRole('heading', { name: /^Clone class #\d+$/ }).waitFor();
  await page.locator('article pre span[style*="color"]').first().waitFor();
  return new URL(page.url()).pathname;
}

describe('the class view in Chromium', () => {
  it('colours both copies with our theme and marks renamed identifiers and changed code between them', async () => {
    const { page, consoleErrors } = await pageAs(team.viewer);
    try {
      // v3's grown class: the pricing rule in billing/tariff.js, billing/quotes.js and yard/shunting.js.
      await openClass(page, loads.v3.snapshotId, 'grown');
      const left = page.getByRole('article', { name: /^Left: / });
      const right = page.getByRole('article', { name: /^Right: / });
      // Colours: keywords and numbers get colours of the theme, different from plain ink.
      const colours = await left.locator('pre span[style*="color"]').evaluateAll((spans) => [...new Set(spans.map((s) => getComputedStyle(s).color))]);
      expect(colours.length).toBeGreaterThanOrEqual(4);
      const keywordColour = await left.locator('pre span[style*="color"]', { hasText: /^export$/ }).first().evaluate((s) => getComputedStyle(s).color);
      expect(keywordColour).toBe('rgb(122, 47, 99)');

      // Open tariff against quotes: the third copy renamed its parameters and nothing else.
      const open = (a: string, b: string) => page.getByRole('button', { name: new RegExp(`^Compare \\w+ \\(${a}\\) and \\w+ \\(${b}\\)`) });
      await open('billing/tariff\\.js', 'billing/quotes\\.js').click();
      await expect.poll(() => left.getAttribute('aria-label')).toBe('Left: billing/tariff.js');
      await expect.poll(() => right.getAttribute('aria-label')).toBe('Right: billing/quotes.js');
      const renamedLeft = await left.locator('[data-change="renamed"]').allTextContents();
      const renamedRight = await right.locator('[data-change="renamed"]').allTextContents();
      expect(new Set(renamedLeft)).toEqual(new Set(['priceConsignment', 'wagons', 'distanceKm', 'contract', 'wagon']));
      expect(new Set(renamedRight)).toEqual(new Set(['quoteForCustomer', 'units', 'kilometres', 'terms', 'unit']));
      // `contract` is used five times in the tariff copy: each place is marked, none as removed.
      expect(renamedLeft.filter((t) => t === 'contract')).toHaveLength(5);
      expect(await left.locator('[data-change="removed"], [data-change="changed"]').count()).toBe(0);
      expect(await right.locator('[data-change="inserted"], [data-change="changed"]').count()).toBe(0);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'class-view-renamed.png'), fullPage: true });

      // Tariff against the yard copy: the fixed fee was dropped from the yard copy, and `total` became `sum`.
      await open('billing/tariff\\.js', 'yard/shunting\\.js').click();
      await expect.poll(() => right.getAttribute('aria-label')).toBe('Right: yard/shunting.js');
      await expect.poll(() => left.locator('[data-change="removed"]').allTextContents()).toEqual(['+ contract.fixedFee']);
      expect(await right.locator('[data-change="renamed"]', { hasText: /^sum$/ }).count()).toBeGreaterThan(0);
      expect(await left.locator('[data-change="renamed"]', { hasText: /^total$/ }).count()).toBeGreaterThan(0);
      // The pressed cell is the pair on screen.
      expect(await open('billing/tariff\\.js', 'yard/shunting\\.js').getAttribute('aria-pressed')).toBe('true');
      // The two panes show the same number of rows, and scroll together.
      const rowCounts = await Promise.all([left, right].map((side) => side.locator('pre code > div').count()));
      expect(rowCounts[0]).toBe(rowCounts[1]);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'class-view-removed.png'), fullPage: true });
      expect(consoleErrors).toEqual([]);
    } finally {
      await page.close();
    }
  }, 90_000);

  it('marks a changed literal as changed on both sides', async () => {
    const { page, consoleErrors } = await pageAs(team.viewer);
    try {
      await openClass(page, ratesLoad.snapshotId, 'new');
      // Which copy is on the left depends on the pair's stored order; the surcharge is the only mark either way.
      const marks = await page.locator('article [data-change]').evaluateAll((els) =>
        els.map((e) => `${e.closest('article')!.getAttribute('aria-label')} ${e.getAttribute('data-change')} ${e.textContent}`).sort(),
      );
      expect(marks).toHaveLength(2);
      expect(marks.map((m) => m.replace(/^(Left|Right): /, ''))).toEqual(['rates/rail.js changed 0.2', 'rates/road.js changed 0.15']);
      // Both copies' lines face each other: nothing was inserted, so no blank rows.
      expect(await page.locator('.code-gap').count()).toBe(0);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'class-view-changed-literal.png'), fullPage: true });
      expect(consoleErrors).toEqual([]);
    } finally {
      await page.close();
    }
  }, 60_000);

  it('lets a keyboard user reach the matrix and the code, with a visible focus', async () => {
    const { page } = await pageAs(team.viewer);
    try {
      await openClass(page, loads.v3.snapshotId, 'grown');
      // A focus is visible as an outline, or (form fields) as a ring drawn with a box shadow.
      const reached: Array<{ label: string; visible: boolean }> = [];
      for (let i = 0; i < 60; i++) {
        await page.keyboard.press('Tab');
        const stop = await page.evaluate(() => {
          const el = document.activeElement as HTMLElement;
          if (el === document.body) return null;
          const style = getComputedStyle(el);
          const outline = style.outlineStyle !== 'none' && parseFloat(style.outlineWidth) > 0;
          return { label: el.getAttribute('aria-label') ?? `${el.tagName} ${el.textContent?.slice(0, 30)}`, visible: outline || style.boxShadow !== 'none' };
        });
        if (stop) reached.push(stop);
      }
      // Every stop on the way shows where the focus is, not only the two checked below.
      expect(reached.filter((r) => !r.visible)).toEqual([]);
      const cell = reached.find((r) => r.label?.startsWith('Compare '));
      const code = reached.find((r) => r.label?.startsWith('Code of '));
      expect(cell).toBeDefined();
      expect(code).toBeDefined();
    } finally {
      await page.close();
    }
  }, 60_000);
});

describe('the pair view scrolls both copies together', () => {
  it('moves the right pane when the left one is scrolled sideways, and back', async () => {
    const { page } = await pageAs(team.viewer);
    try {
      // Narrow enough that both copies' longest lines overflow their panes.
      await page.setViewportSize({ width: 1100, height: 800 });
      await openClass(page, ratesLoad.snapshotId, 'new');
      const panes = page.locator('article [role="region"]');
      expect(await panes.count()).toBe(2);
      const overflow = await panes.evaluateAll((els) => els.map((e) => e.scrollWidth - e.clientWidth));
      expect(Math.min(...overflow)).toBeGreaterThan(40);
      await panes.nth(0).evaluate((e) => (e.scrollLeft = 40));
      await expect.poll(() => panes.nth(1).evaluate((e) => e.scrollLeft)).toBe(40);
      await panes.nth(1).evaluate((e) => (e.scrollLeft = 10));
      await expect.poll(() => panes.nth(0).evaluate((e) => e.scrollLeft)).toBe(10);
    } finally {
      await page.close();
    }
  }, 60_000);
});

describe('accessibility of the main pages (axe-core, serious and critical)', () => {
  it('would catch a contrast failure: the check reports grey-on-grey text planted in the page', async () => {
    const { page } = await pageAs(team.viewer);
    try {
      await page.getByRole('heading', { name: 'Overview' }).waitFor();
      expect(await seriousViolations(page)).toEqual([]);
      await page.evaluate(() => {
        const p = document.createElement('p');
        p.textContent = 'Planted: pale text on a pale ground';
        p.style.color = '#bbbbbb';
        p.style.background = '#cccccc';
        document.querySelector('main')!.append(p);
      });
      await expect.poll(() => seriousViolations(page)).toEqual([expect.stringMatching(/^serious color-contrast: /)]);
    } finally {
      await page.close();
    }
  }, 60_000);

  it('finds no serious or critical violation on any main page, each opened as a role that uses it', async () => {
    const pages: Array<{ name: string; user: User; url: string; ready: (page: Page) => Promise<unknown> }> = [
      { name: 'overview', user: team.viewer, url: '/', ready: (p) => p.locator('figure[aria-label="Clone ratio across all repositories"] .recharts-line-dot').first().waitFor() },
      { name: 'repositories', user: team.lead, url: '/repositories', ready: (p) => p.getByRole('row', { name: /freight-platform/ }).waitFor() },
      { name: 'repository', user: team.lead, url: `/repositories/${repository.id}`, ready: (p) => p.getByRole('button', { name: 'Save settings' }).waitFor() },
      { name: 'snapshot', user: team.viewer, url: `/snapshots/${loads.v3.snapshotId}`, ready: (p) => p.getByRole('table', { name: 'Clone classes' }).waitFor() },
      { name: 'class', user: team.viewer, url: `/snapshots/${loads.v3.snapshotId}?status=grown`, ready: (p) => openClass(p, loads.v3.snapshotId, 'grown') },
      { name: 'find-copies', user: team.engineer, url: '/find-copies', ready: (p) => p.getByRole('heading', { name: 'Find copies' }).waitFor() },
      { name: 'account', user: team.viewer, url: '/account', ready: (p) => p.getByRole('heading', { name: /account/i }).first().waitFor() },
      { name: 'admin', user: team.admin, url: '/admin', ready: (p) => p.getByRole('table').first().waitFor() },
    ];
    const found: Record<string, string[]> = {};
    for (const entry of pages) {
      const { page, consoleErrors } = await pageAs(entry.user);
      try {
        if (entry.name !== 'class') await page.goto(`${session.baseUrl}${entry.url}`, { waitUntil: 'networkidle' });
        await entry.ready(page);
        found[entry.name] = [...(await seriousViolations(page)), ...consoleErrors.map((e) => `console: ${e}`)];
        await page.screenshot({ path: path.join(SCREENSHOTS, `page-${entry.name}-${entry.user.role}.png`), fullPage: true });
      } finally {
        await page.close();
      }
    }
    expect(found).toEqual(Object.fromEntries(pages.map((p) => [p.name, []])));
  }, 180_000);
});
