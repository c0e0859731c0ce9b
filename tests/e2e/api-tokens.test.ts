import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Repository } from '../../server/models/Repository';
import { buildRepository, buildTeam, useDatabase } from '../support';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';
import { seriousViolations } from './axe';

useDatabase();

let session: BrowserSession;
let team: Awaited<ReturnType<typeof buildTeam>>;
let repository: Repository;

beforeAll(async () => {
  team = await buildTeam();
  repository = await buildRepository({ organisationId: team.organisation.id, name: 'yard-scheduler', description: 'Brackenfold yard slot planning' });
  session = await startBrowserSession({ width: 1440, height: 900 });
}, 120_000);

afterAll(async () => {
  await session?.close();
});


/** What a CI job does with the token: a plain HTTP request with the Bearer header and nothing else. */
function readRepository(token: string): Promise<Response> {
  return fetch(`${session.baseUrl}/api/repositories/${repository.id}`, { headers: { Authorization: `Bearer ${token}` } });
}

describe('API tokens in Chromium', () => {
  it('lets a lead create a token, shows its secret once, and revoking it stops it working', async () => {
    const page = await session.context.newPage();
    try {
      await session.context.clearCookies();
      await signInThroughForm(page, session.baseUrl, team.lead);
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'API tokens' }).click();
      await page.getByRole('heading', { name: 'API tokens', level: 1 }).waitFor();

      await page.getByLabel('Name').fill('Nightly build');
      await page.getByLabel('Repository').selectOption({ label: 'yard-scheduler' });
      await page.getByRole('button', { name: 'Create token' }).click();
      const secretBox = page.getByTestId('new-token-secret');
      await secretBox.waitFor();
      const secret = (await secretBox.textContent())?.trim() ?? '';
      expect(secret).toMatch(/^dblt_[A-Za-z0-9_-]{43}$/);
      await expect.poll(() => page.getByText('It will not be shown again', { exact: false }).count()).toBe(1);
      await expect.poll(() => page.getByRole('button', { name: 'Copy' }).count()).toBe(1);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'api-tokens-created.png'), fullPage: true });
      expect(await seriousViolations(page)).toEqual([]);

      const works = await readRepository(secret);
      expect(works.status).toBe(200);
      expect(((await works.json()) as { name: string }).name).toBe('yard-scheduler');

      // Once dismissed, the secret is gone from the page for good; the list shows only its first characters.
      await page.getByRole('button', { name: 'Done, I have copied it' }).click();
      const row = page.getByRole('row', { name: /Nightly build/ });
      await row.waitFor();
      await expect.poll(() => row.textContent()).toContain(secret.slice(0, 8));
      await page.reload({ waitUntil: 'networkidle' });
      await page.getByRole('row', { name: /Nightly build/ }).waitFor();
      expect(await page.content()).not.toContain(secret);
      // Last use is recorded by the request above.
      await expect.poll(() => page.getByRole('row', { name: /Nightly build/ }).textContent()).not.toContain('Never');

      await page.getByRole('row', { name: /Nightly build/ }).getByRole('button', { name: 'Revoke…' }).click();
      await page.getByRole('button', { name: 'Revoke for good' }).click();
      await expect.poll(() => page.getByRole('row', { name: /Nightly build/ }).textContent()).toContain('Revoked');
      await page.screenshot({ path: path.join(SCREENSHOTS, 'api-tokens-revoked.png'), fullPage: true });
      expect(await seriousViolations(page)).toEqual([]);

      const refused = await readRepository(secret);
      expect(refused.status).toBe(401);
    } finally {
      await page.close();
    }
  });

  it('offers the page to leads only', async () => {
    const page = await session.context.newPage();
    try {
      await session.context.clearCookies();
      await signInThroughForm(page, session.baseUrl, team.engineer);
      const nav = page.getByRole('navigation', { name: 'Main' });
      await nav.getByRole('link', { name: 'Repositories' }).waitFor();
      expect(await nav.getByRole('link', { name: 'API tokens' }).count()).toBe(0);
      await page.screenshot({ path: path.join(SCREENSHOTS, 'api-tokens-engineer-nav.png') });
    } finally {
      await page.close();
    }
  });
});
