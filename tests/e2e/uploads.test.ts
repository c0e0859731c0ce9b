import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import AdmZip from 'adm-zip';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { select } from '../../server/clone-index/sql';
import { startJobs, stopJobs } from '../../server/jobs';
import type { Repository } from '../../server/models/Repository';
import { buildRepository, buildTeam, useDatabase, useJobs } from '../support';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';
import { seriousViolations } from './axe';

useDatabase();
const jobs = useJobs({ work: true });

let session: BrowserSession;
let team: Awaited<ReturnType<typeof buildTeam>>;
let repository: Repository;
let workDir: string;

/**
 * A small invented Brackenfold Rail Freight codebase, zipped in one top folder: wagon and siding
 * helpers, with the demurrage rule copied into two modules (one copy renamed) so the release has
 * a clone class.
 */
function brackenfoldZip(release: string): string {
  const demurrage = (name: string, days: string) => `
export function ${name}(wagon, ${days}, tariff) {
  const freeDays = tariff.freeDays ?? 2;
  if (${days} <= freeDays) return 0;
  let charge = 0;
  for (let day = freeDays + 1; day <= ${days}; day++) {
    const rate = day > 10 ? tariff.lateRate : tariff.rate;
    charge += rate * (wagon.axles > 4 ? 1.5 : 1);
  }
  if (wagon.hazardous) charge += tariff.hazardSurcharge;
  return Math.round(charge * 100) / 100;
}
`;
  const files: Record<string, string> = {
    'billing/demurrage.js': demurrage('demurrageCharge', 'daysHeld'),
    'yard/holding.js': demurrage('holdingFee', 'daysOnSiding'),
  };
  for (let i = 0; i < 12; i++) {
    files[`yard/siding-${i}.js`] = `
export function sidingCapacity${i}(siding, wagons) {
  const usable = siding.lengthMetres - ${i + 2} * siding.bufferMetres;
  const used = wagons.reduce((sum, w) => sum + w.lengthMetres + ${i % 3}, 0);
  return { free: usable - used, wagons: wagons.length, over: used > usable, siding: siding.code + '-${i}' };
}
`;
  }
  const zip = new AdmZip();
  for (const [name, text] of Object.entries(files)) zip.addFile(`brackenfold-yard-${release}/${name}`, Buffer.from(text));
  const file = path.join(workDir, `brackenfold-yard-${release}.zip`);
  zip.writeZip(file);
  return file;
}

beforeAll(async () => {
  workDir = fs.mkdtempSync(path.join(os.tmpdir(), 'doublet-e2e-uploads-'));
  team = await buildTeam();
  repository = await buildRepository({ organisationId: team.organisation.id, name: 'brackenfold-yard' });
  session = await startBrowserSession({ width: 1440, height: 900 });
}, 180_000);

afterAll(async () => {
  await session?.close();
  fs.rmSync(workDir, { recursive: true, force: true });
});

async function uploadThroughForm(page: Page, label: string, file: string) {
  const form = page.getByRole('form', { name: 'Upload a release' });
  await form.getByLabel('Release label').fill(label);
  await form.getByLabel('Archive').setInputFiles(file);
  await form.getByRole('button', { name: 'Upload' }).click();
}

describe('uploading a release in Chromium', () => {
  it('lets an engineer upload a zip and watch the progress bar reach the snapshot', async () => {
    const page = await session.context.newPage();
    try {
      await session.context.clearCookies();
      await signInThroughForm(page, session.baseUrl, team.engineer);
      await page.goto(`${session.baseUrl}/repositories/${repository.id}`);
      await page.getByRole('heading', { name: 'brackenfold-yard' }).waitFor();
      expect(await seriousViolations(page)).toEqual([]);

      await uploadThroughForm(page, '2026.10', brackenfoldZip('2026.10'));
      const bar = page.getByRole('progressbar', { name: 'Loading 2026.10' });
      await bar.waitFor();
      const phase = await bar.getAttribute('aria-valuetext');
      expect(phase).toMatch(/^(Waiting for a worker|Unpacking the archive|Analysing \d+ of \d+ files|Indexing \d+ of \d+ sets|Deriving clone classes)$/);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'upload-progress.png'), fullPage: true });

      const link = page.getByRole('link', { name: 'open snapshot 2026.10' });
      await link.waitFor({ timeout: 120_000 });
      expect(await bar.count()).toBe(0);
      const [stored] = await select<{ classes: string }>(
        undefined,
        `select count(*) as classes from clone_classes c join snapshots s on s.id = c.snapshot_id where s.repository_id = $1 and s.label = '2026.10'`,
        [repository.id],
      );
      expect(Number(stored.classes)).toBeGreaterThan(0);
      await expect(page.getByText(/2026\.10 is ready/).textContent()).resolves.toContain(`(14 files, ${stored.classes} clone classes)`);
      // The snapshot table shows it ready too.
      await page.getByRole('table', { name: 'Snapshots' }).getByRole('link', { name: '2026.10' }).waitFor();
      expect(await seriousViolations(page)).toEqual([]);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'upload-ready.png'), fullPage: true });

      await link.click();
      await page.waitForURL(/\/snapshots\/\d+$/);

      // A refused archive: its reason in words, on the form.
      await page.goto(`${session.baseUrl}/repositories/${repository.id}`);
      const notAnArchive = path.join(workDir, 'notes.zip');
      fs.writeFileSync(notAnArchive, 'release notes, not an archive\n');
      await uploadThroughForm(page, '2026.11', notAnArchive);
      await page.getByText('The file is not a zip or tar archive').waitFor();
      await page.screenshot({ path: path.join(SCREENSHOTS, 'upload-refused.png'), fullPage: true });
    } finally {
      await page.close();
    }
  }, 180_000);

  it('shows a queued load to every role, Cancel to the engineer who started it and to a lead, the form to no viewer', async () => {
    // No worker for this part: the load waits in the queue, as when every worker is busy.
    await stopJobs({ timeoutMs: 5000 });
    await startJobs({ connectionString: process.env.DATABASE_URL, schema: jobs.schema, work: false });
    const page = await session.context.newPage();
    try {
      await session.context.clearCookies();
      await signInThroughForm(page, session.baseUrl, team.engineer);
      await page.goto(`${session.baseUrl}/repositories/${repository.id}`);
      await uploadThroughForm(page, '2026.12', brackenfoldZip('2026.12'));
      const bar = page.getByRole('progressbar', { name: 'Loading 2026.12' });
      await bar.waitFor();
      expect(await bar.getAttribute('aria-valuetext')).toBe('Waiting for a worker');
      expect(await page.getByRole('button', { name: 'Cancel' }).count()).toBe(1);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'upload-queued-engineer.png'), fullPage: true });

      await session.context.clearCookies();
      await signInThroughForm(page, session.baseUrl, team.viewer);
      await page.goto(`${session.baseUrl}/repositories/${repository.id}`);
      await page.getByRole('progressbar', { name: 'Loading 2026.12' }).waitFor();
      expect(await page.getByRole('form', { name: 'Upload a release' }).count()).toBe(0);
      expect(await page.getByRole('button', { name: 'Cancel' }).count()).toBe(0);
      expect(await seriousViolations(page)).toEqual([]);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'upload-queued-viewer.png'), fullPage: true });

      await session.context.clearCookies();
      await signInThroughForm(page, session.baseUrl, team.lead);
      await page.goto(`${session.baseUrl}/repositories/${repository.id}`);
      await page.getByRole('progressbar', { name: 'Loading 2026.12' }).waitFor();
      expect(await seriousViolations(page)).toEqual([]);
      await page.getByRole('button', { name: 'Cancel' }).click();
      await page.getByText('Loading 2026.12 was cancelled').waitFor();
      const row = page.getByRole('table', { name: 'Snapshots' }).getByRole('row').filter({ hasText: '2026.12' });
      await row.getByText('cancelled').waitFor();
      await page.screenshot({ path: path.join(SCREENSHOTS, 'upload-cancelled-lead.png'), fullPage: true });
    } finally {
      await page.close();
    }
  }, 180_000);
});
