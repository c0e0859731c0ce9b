import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildRepository, buildTeam, loadFolder, RELEASES, useDatabase } from '../support';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';

/**
 * The Content-Security-Policy fits the built client: every page of the app renders in Chromium
 * with the policy the server sends, and Chromium reports no violation (it logs each refused
 * script, style, font, image or connection as a console error).
 */
useDatabase();

let session: BrowserSession;
let team: Awaited<ReturnType<typeof buildTeam>>;
let ids: { repository: number; snapshot: number; cloneClass: number | undefined };

beforeAll(async () => {
  team = await buildTeam();
  const repository = await buildRepository({ organisationId: team.organisation.id, name: 'freight-platform' });
  await loadFolder(repository, `${RELEASES}/v1`, 'v1');
  const v2 = await loadFolder(repository, `${RELEASES}/v2`, 'v2');
  const { db } = await import('../../server/db/connection');
  const [rows] = await db().query('select id from clone_classes where snapshot_id = $1 order by id limit 1', { bind: [v2.snapshotId] });
  ids = { repository: repository.id, snapshot: v2.snapshotId, cloneClass: (rows as { id: number }[])[0]?.id };
  session = await startBrowserSession({ width: 1280, height: 800 });
}, 180_000);

afterAll(async () => {
  await session?.close();
});

describe('the Content-Security-Policy in Chromium', () => {
  it('lets every page render with no violation and no console error', async () => {
    const page = await session.context.newPage();
    const problems: string[] = [];
    page.on('console', (m) => {
      // Before sign-in the client asks who is signed in; the 401s of guarded calls are expected.
      if (m.type() === 'error' && !/401|Unauthorized/.test(m.text())) problems.push(m.text());
    });
    page.on('pageerror', (e) => problems.push(e.message));
    const response = await page.goto(`${session.baseUrl}/sign-in`, { waitUntil: 'networkidle' });
    expect(response?.headers()['content-security-policy']).toMatch(/script-src 'self'/);
    await signInThroughForm(page, session.baseUrl, team.admin);
    expect(ids.cloneClass).toBeDefined();
    const paths = ['/', '/repositories', `/repositories/${ids.repository}`, `/snapshots/${ids.snapshot}`, `/clone-classes/${ids.cloneClass}`, '/find-copies', '/admin', '/account'];
    for (const where of paths) {
      await page.goto(`${session.baseUrl}${where}`, { waitUntil: 'networkidle' });
      await page.getByRole('navigation', { name: 'Main' }).waitFor();
    }
    // The trend chart (inline style properties set through the DOM) and the mono font both rendered.
    await page.goto(`${session.baseUrl}/repositories/${ids.repository}`, { waitUntil: 'networkidle' });
    await page.locator('figure[aria-label="Clone ratio by release"] .recharts-line-dot').first().waitFor();
    expect(await page.evaluate(() => document.fonts.check('16px "IBM Plex Mono"'))).toBe(true);
    await page.screenshot({ path: path.join(SCREENSHOTS, 'csp-repository.png'), fullPage: true });
    expect(problems).toEqual([]);
    await page.close();
  }, 120_000);
});
