import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../../server/models/User';
import type { Role } from '../../shared/roles';
import { buildTeam, useDatabase } from '../support';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';

useDatabase();

/**
 * Navigation each role should see, written out from the product brief rather than computed from
 * shared/permissions.ts: viewers read only (no Find copies), engineers add Find copies, leads add
 * API tokens, admins add Admin.
 */
const EXPECTED_NAV: Record<Role, string[]> = {
  admin: ['Overview', 'Repositories', 'Clone classes', 'Find copies', 'Tasks', 'API tokens', 'Admin'],
  lead: ['Overview', 'Repositories', 'Clone classes', 'Find copies', 'Tasks', 'API tokens'],
  engineer: ['Overview', 'Repositories', 'Clone classes', 'Find copies', 'Tasks'],
  viewer: ['Overview', 'Repositories', 'Clone classes', 'Tasks'],
};

let session: BrowserSession;
let team: Record<Role, User>;

beforeAll(async () => {
  team = await buildTeam();
  session = await startBrowserSession({ width: 1280, height: 800 });
}, 120_000);

afterAll(async () => {
  await session?.close();
});

async function signIn(page: Page, user: User) {
  await page.goto(`${session.baseUrl}/`, { waitUntil: 'networkidle' });
  // Anonymous visitors land on the sign-in page.
  await page.waitForURL(/\/sign-in$/);
  await signInThroughForm(page, session.baseUrl, user);
}

async function navLabels(page: Page): Promise<string[]> {
  return page.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents();
}

describe('signing in with Chromium', () => {
  for (const role of ['admin', 'lead', 'engineer', 'viewer'] as const) {
    it(`shows ${/^[aeiou]/.test(role) ? 'an' : 'a'} ${role} the navigation of their role, then signs out`, async () => {
      const page = await session.context.newPage();
      const consoleErrors: string[] = [];
      page.on('console', (m) => {
        if (m.type() === 'error') consoleErrors.push(m.text());
      });
      try {
        await signIn(page, team[role]);
        expect(await navLabels(page)).toEqual(EXPECTED_NAV[role]);
        // Pages load on first visit (one chunk a route): wait for the overview's own heading.
        await page.getByRole('heading', { name: 'Overview' }).waitFor();

        // The Admin page is there for admins; others get the refusal page even by URL.
        await page.goto(`${session.baseUrl}/admin`, { waitUntil: 'networkidle' });
        if (role === 'admin') {
          await page.getByRole('cell', { name: new RegExp(team.viewer.email) }).waitFor();
        } else {
          await page.getByRole('heading', { name: 'Not available to your role' }).waitFor();
        }
        await page.goto(`${session.baseUrl}/`, { waitUntil: 'networkidle' });
        await page.getByRole('heading', { name: 'Overview' }).waitFor();
        // IBM Plex Mono is served by the app itself (no CDN) and loaded.
        expect(await page.evaluate(() => document.fonts.check('12px "IBM Plex Mono"'))).toBe(true);
        await page.screenshot({ path: path.join(SCREENSHOTS, `overview-${role}.png`), fullPage: true });
        if (role === 'admin') {
          await page.goto(`${session.baseUrl}/admin`, { waitUntil: 'networkidle' });
          await page.getByRole('cell', { name: new RegExp(team.viewer.email) }).waitFor();
          await page.screenshot({ path: path.join(SCREENSHOTS, 'admin.png'), fullPage: true });
        }

        await page.getByRole('button', { name: 'Sign out' }).click();
        await page.waitForURL(/\/sign-in$/);
        await page.goto(`${session.baseUrl}/tasks`, { waitUntil: 'networkidle' });
        await page.waitForURL(/\/sign-in$/);
        expect(consoleErrors.filter((e) => !/401|Unauthorized/.test(e))).toEqual([]);
      } finally {
        await page.close();
      }
    }, 60_000);
  }
});
