import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Repository } from '../../server/models/Repository';
import type { User } from '../../server/models/User';
import { buildRepository, buildTeam, loadFolder, useDatabase } from '../support';
import { seriousViolations } from './axe';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';

useDatabase();

// Invented Brackenfold code: a demurrage charge (copied in both repositories, fixed in one copy
// only), a brake inspection rule (copied from one repository into the other) and unique helpers.
const DEMURRAGE = (name: string, extra: string, fix = '') => `export function ${name}(wagons, tariff) {
  let owed = 0;
  for (const wagon of wagons) {${fix}
    const days = Math.max(0, wagon.releasedDay - wagon.arrivedDay - tariff.freeDays);
    const rate = wagon.hazardous ? tariff.perDay * 1.5 : tariff.perDay;
    owed += days * rate + (days > 10 ? ${extra} : 0);
  }
  return Math.round(owed * 100) / 100;
}
`;
const BRAKES = (name: string) => `export function ${name}(wagon, readings) {
  const faults = [];
  for (const shoe of readings.shoes) {
    if (shoe.thicknessMm < 12) faults.push({ wagon: wagon.number, part: 'shoe', at: shoe.position });
    if (shoe.temperature > 340) faults.push({ wagon: wagon.number, part: 'heat', at: shoe.position });
  }
  if (readings.pipePressure < 4.8) faults.push({ wagon: wagon.number, part: 'pipe', at: 0 });
  return faults;
}
`;
const VAT = `export function vatLines(invoice, rates) {
  const lines = [];
  for (const item of invoice.items) {
    const rate = rates[item.country] ?? rates.default;
    if (!rate || item.exempt) continue;
    lines.push({ item: item.code, base: item.net, vat: Math.round(item.net * rate * 100) / 100 });
  }
  return lines.concat([{ item: 'total', base: invoice.net, vat: lines.reduce((sum, l) => sum + l.vat, 0) }]);
}
`;
const SUMMARY = `export function shiftSummary(movements, shift) {
  const byTrack = new Map();
  for (const move of movements) {
    if (move.at < shift.start || move.at >= shift.end) continue;
    const list = byTrack.get(move.track) ?? [];
    list.push(\`\${move.wagon} \${move.from}->\${move.to}\`);
    byTrack.set(move.track, list);
  }
  return [...byTrack.entries()].sort(([a], [b]) => a.localeCompare(b)).map(([track, lines]) => ({ track, lines }));
}
`;

async function loadFiles(repository: Repository, label: string, files: Record<string, string>) {
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'organisation-pages-'));
  try {
    for (const [file, text] of Object.entries(files)) {
      fs.mkdirSync(path.dirname(path.join(folder, file)), { recursive: true });
      fs.writeFileSync(path.join(folder, file), text);
    }
    return await loadFolder(repository, folder, label);
  } finally {
    fs.rmSync(folder, { recursive: true, force: true });
  }
}

let session: BrowserSession;
let team: Awaited<ReturnType<typeof buildTeam>>;
let yard: Repository;
let billing: Repository;

beforeAll(async () => {
  team = await buildTeam();
  yard = await buildRepository({ organisationId: team.organisation.id, name: 'yard-ledger' });
  billing = await buildRepository({ organisationId: team.organisation.id, name: 'wagon-billing', cloneBudget: 0.1 });
  const yardFiles = {
    'charges/demurrage.js': DEMURRAGE('demurrageOwed', '40'),
    'charges/siding.js': DEMURRAGE('sidingRent', '45'),
    'charges/storage.js': DEMURRAGE('storageFee', '50'),
    'charges/vat.js': VAT,
    'safety/brakes.js': BRAKES('inspectBrakes'),
    'reports/summary.js': SUMMARY,
  };
  await loadFiles(yard, '1.0', yardFiles);
  await loadFiles(billing, '7.2', {
    'invoices/holding.js': DEMURRAGE('holdingCharge', '40'),
    'invoices/detention.js': DEMURRAGE('detentionCharge', '60'),
    'checks/brake_check.js': BRAKES('brakeCheck'),
  });
  // 1.1 fixes exempt wagons in one copy of the charge only: its class drifts.
  await loadFiles(yard, '1.1', { ...yardFiles, 'charges/demurrage.js': DEMURRAGE('demurrageOwed', '40', '\n    if (wagon.exempt) continue;') });
  session = await startBrowserSession({ width: 1440, height: 900 });
}, 180_000);

afterAll(async () => {
  await session?.close();
});

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

const shot = (page: Page, name: string) => page.screenshot({ path: path.join(SCREENSHOTS, `${name}.png`), fullPage: true });

describe('the clone classes of the whole organisation in Chromium', () => {
  it('narrows the list with its filters, keeps them in the URL, and opens a class that spans repositories', async () => {
    const { page, consoleErrors } = await pageAs(team.viewer);
    try {
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Clone classes' }).click();
      const rows = page.getByRole('table', { name: 'Clone classes' }).locator('tbody tr');
      // Two classes within a repository (one each) and two whose copies span both.
      await expect.poll(() => rows.count()).toBe(4);
      await shot(page, 'clone-classes-all-viewer');

      await page.getByLabel('Where').selectOption('across');
      await page.waitForURL(/[?&]scope=across\b/);
      await expect.poll(() => rows.count()).toBe(2);
      expect(await rows.allTextContents()).toEqual([expect.stringContaining('2 repos'), expect.stringContaining('2 repos')]);

      await page.getByLabel('Function name contains').fill('brake');
      await page.getByRole('button', { name: 'Apply' }).click();
      await page.waitForURL(/[?&]name=brake\b/);
      await expect.poll(() => rows.count()).toBe(1);
      await expect(rows.first().textContent()).resolves.toMatch(/wagon-billing.*yard-ledger.*checks\/brake_check\.js.*safety\/brakes\.js/);

      // The filters live in the URL: a reload keeps the list and the fields.
      await page.reload({ waitUntil: 'networkidle' });
      await expect.poll(() => rows.count()).toBe(1);
      expect(await page.getByLabel('Function name contains').inputValue()).toBe('brake');
      expect(await page.getByLabel('Where').inputValue()).toBe('across');
      await shot(page, 'clone-classes-filtered-viewer');

      await page.getByRole('button', { name: 'Clear' }).click();
      await expect.poll(() => new URL(page.url()).search).toBe('');
      await expect.poll(() => rows.count()).toBe(4);
      await page.getByLabel('Status', { exact: true }).selectOption('drifted');
      await page.waitForURL(/[?&]status=drifted\b/);
      await expect.poll(() => rows.count()).toBe(1);
      await expect(rows.first().textContent()).resolves.toMatch(/yard-ledger @1\.1.*drifted/);
      await page.getByLabel('Min members').fill('4');
      await page.getByRole('button', { name: 'Apply' }).click();
      await page.waitForURL(/[?&]minMembers=4\b/);
      await expect.poll(() => rows.count()).toBe(0);
      await page.getByText('No clone class matches these filters.').waitFor();

      // The demurrage charge across both repositories: five copies, each with its repository.
      await page.goto(`${session.baseUrl}/clone-classes?scope=across&minMembers=5`, { waitUntil: 'networkidle' });
      await expect.poll(() => rows.count()).toBe(1);
      await rows.first().getByRole('link', { name: /^Open class \d+ across wagon-billing and yard-ledger$/ }).click();
      await page.getByRole('heading', { name: /^Clone class ×\d+$/ }).waitFor();
      const members = page.getByRole('table', { name: 'Members by repository' }).locator('tbody tr');
      expect(await members.locator('td:first-child').allTextContents()).toEqual([
        'wagon-billing @7.2',
        'wagon-billing @7.2',
        'yard-ledger @1.1',
        'yard-ledger @1.1',
        'yard-ledger @1.1',
      ]);
      await page.locator('article pre span[style*="color"]').first().waitFor();
      expect(await page.getByRole('article', { name: /^Left: / }).getAttribute('aria-label')).toMatch(/^Left: (wagon-billing|yard-ledger): /);
      expect(await seriousViolations(page)).toEqual([]);
      await shot(page, 'cross-class-viewer');
      expect(consoleErrors).toEqual([]);
    } finally {
      await page.close();
    }
  }, 120_000);
});

describe('the repository page in Chromium', () => {
  it('draws the clone map of the latest release; a click on a directory lists the classes in it', async () => {
    const { page, consoleErrors } = await pageAs(team.engineer);
    try {
      await page.goto(`${session.baseUrl}/repositories/${yard.id}`, { waitUntil: 'networkidle' });
      const map = page.getByRole('figure', { name: 'Clone map of 1.1' });
      await map.locator('g[data-directory] rect').first().waitFor();
      // One rectangle a directory; its cloned band rises to the share of cloned tokens: all of charges/, none of reports/.
      const band = (dir: string) => map.locator(`g[data-directory="${dir}"] rect[data-cloned-band]`);
      const table = map.getByRole('table', { name: 'Clone map, as a table', includeHidden: true });
      expect(await table.locator('tbody tr td:first-child').allTextContents()).toEqual(expect.arrayContaining(['charges/', 'reports/', 'safety/']));
      // charges/ holds three copies and one function of its own: the band's height is its cloned share, as the table says
      const [tokens, cloned] = (await table.getByRole('row', { name: /^charges\// , includeHidden: true }).locator('td').allTextContents()).slice(1, 3).map(Number);
      expect(cloned / tokens).toBeGreaterThan(0.5);
      expect(cloned / tokens).toBeLessThan(1);
      expect(await band('charges/').getAttribute('fill')).toBe('#163d35');
      const heights = await map.locator('g[data-directory="charges/"] rect').evaluateAll((rects) => rects.map((r) => Number(r.getAttribute('height'))));
      expect(heights[1] / heights[0]).toBeCloseTo(cloned / tokens, 6);
      expect(await band('reports/').count()).toBe(0);
      // Under the trend, by release: 1.1 has the one drifted class, 1.0 started with two new ones.
      const changes = page.getByRole('table', { name: 'Classes new, drifted and gone by release' }).locator('tbody tr');
      expect((await changes.allTextContents()).map((t) => t.replace(/\s+/g, ' '))).toEqual([expect.stringMatching(/^1\.1 ?0 ?1 ?0 ?1$/), expect.stringMatching(/^1\.0 ?first ?1 ?0 ?0 ?1$/)]);
      expect(await seriousViolations(page)).toEqual([]);
      await shot(page, 'repository-clone-map-engineer');

      await map.locator('g[data-directory="charges/"]').click();
      await page.waitForURL((url) => url.pathname === '/clone-classes' && url.searchParams.get('path') === 'charges/' && url.searchParams.get('repository') === String(yard.id));
      const rows = page.getByRole('table', { name: 'Clone classes' }).locator('tbody tr');
      // yard-ledger's own class and the class across both repositories, each with members in charges/
      await expect.poll(() => rows.count()).toBe(2);
      for (const text of await rows.allTextContents()) expect(text).toContain('charges/');
      expect(await page.getByLabel('Path contains').inputValue()).toBe('charges/');
      expect(await page.getByLabel('Repository').inputValue()).toBe(String(yard.id));
      await shot(page, 'clone-classes-from-map-engineer');
      expect(consoleErrors).toEqual([]);
    } finally {
      await page.close();
    }
  }, 90_000);
});

describe('the overview in Chromium', () => {
  it('shows what needs attention: over budget, newly drifted, the latest loads and the ratio of all repositories', async () => {
    for (const user of [team.lead, team.viewer, team.engineer]) {
      const { page, consoleErrors } = await pageAs(user);
      try {
        await page.getByRole('heading', { name: 'Overview' }).waitFor();
        const trend = page.getByRole('figure', { name: 'Clone ratio across all repositories' });
        await trend.locator('.recharts-line-dot').first().waitFor();
        expect(await trend.locator('.recharts-line-dot').count()).toBe(3);
        await page.getByRole('list', { name: 'Repositories over budget' }).getByRole('link', { name: 'wagon-billing' }).waitFor();
        const drifted = page.getByRole('list', { name: 'Drifted classes' }).getByRole('listitem');
        await expect.poll(() => drifted.count()).toBe(1);
        await expect(drifted.first().textContent()).resolves.toMatch(/charges\/.*yard-ledger@1\.1/);
        const loads = page.getByRole('table', { name: 'Latest loads' }).locator('tbody tr');
        await expect.poll(() => loads.count()).toBe(3);
        expect((await loads.allTextContents()).map((t) => t.match(/^(yard-ledger|wagon-billing)(1\.1|7\.2|1\.0)ready/)?.slice(1))).toEqual([
          ['yard-ledger', '1.1'],
          ['wagon-billing', '7.2'],
          ['yard-ledger', '1.0'],
        ]);
        await expect.poll(() => page.getByRole('group', { name: 'Drifted classes' }).textContent()).toMatch(/Drifted classes1/);
        await expect.poll(() => page.getByRole('group', { name: 'Classes across repositories' }).textContent()).toMatch(/across repositories2/);
        // The text alternative of the chart holds the same three points.
        expect(await trend.getByRole('table', { name: 'Clone ratio across all repositories, as a table', includeHidden: true }).locator('tbody tr').count()).toBe(3);
        // No internal permission names anywhere on the page.
        expect(await page.locator('main').textContent()).not.toMatch(/\b(cloneClasses|repositories|snapshots|tasks|findCopies|apiTokens)\.[a-z]+/);
        expect(await seriousViolations(page)).toEqual([]);
        await shot(page, `overview-${user.role}`);
        expect(consoleErrors).toEqual([]);
      } finally {
        await page.close();
      }
    }
  }, 120_000);
});

describe('accessibility of the organisation pages (axe-core, serious and critical)', () => {
  it('finds no serious or critical violation on the class list, as a lead', async () => {
    const { page } = await pageAs(team.lead);
    try {
      await page.goto(`${session.baseUrl}/clone-classes`, { waitUntil: 'networkidle' });
      await page.getByRole('table', { name: 'Clone classes' }).waitFor();
      expect(await seriousViolations(page)).toEqual([]);
      await shot(page, 'clone-classes-all-lead');
      await page.goto(`${session.baseUrl}/repositories/${billing.id}`, { waitUntil: 'networkidle' });
      await page.getByRole('figure', { name: 'Clone map of 7.2' }).locator('g[data-directory] rect').first().waitFor();
      expect(await seriousViolations(page)).toEqual([]);
      await shot(page, 'repository-clone-map-lead');
    } finally {
      await page.close();
    }
  }, 60_000);
});
