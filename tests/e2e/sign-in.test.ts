import fs from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { projectRoot } from '../../server/config';
import type { User } from '../../server/models/User';
import type { Role } from '../../shared/roles';
import { TEST_PASSWORD, buildTeam, useDatabase } from '../support';

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

const screenshots = path.join(projectRoot, 'test-results', 'screenshots');

let server: Server;
let baseUrl: string;
let context: BrowserContext;
let profileDir: string;
let team: Record<Role, User>;

beforeAll(async () => {
  if (!fs.existsSync(path.join(projectRoot, 'dist', 'web', 'index.html'))) {
    throw new Error('dist/web is missing: run the tests with `npm test`, which builds the client first');
  }
  team = await buildTeam();
  server = await new Promise<Server>((resolve) => {
    const s = createApp().listen(0, '127.0.0.1', () => resolve(s));
  });
  baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  fs.mkdirSync(screenshots, { recursive: true });
  profileDir = fs.mkdtempSync(path.join(os.tmpdir(), 'chromium-profile-'));
  context = await chromium.launchPersistentContext(profileDir, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1280, height: 800 },
    args: [
      '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync',
    ],
  });
}, 120_000);

afterAll(async () => {
  await context?.close();
  if (profileDir) fs.rmSync(profileDir, { recursive: true, force: true });
  await new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve()));
});

async function signIn(page: Page, user: User) {
  await page.goto(`${baseUrl}/`, { waitUntil: 'networkidle' });
  // Anonymous visitors land on the sign-in page.
  await page.waitForURL(/\/sign-in$/);
  await page.getByLabel('E-mail').fill(user.email);
  await page.getByLabel('Password').fill(TEST_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}

async function navLabels(page: Page): Promise<string[]> {
  return page.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents();
}

describe('signing in with Chromium', () => {
  for (const role of ['admin', 'lead', 'engineer', 'viewer'] as const) {
    it(`shows a ${role} the navigation of their role, then signs out`, async () => {
      const page = await context.newPage();
      const consoleErrors: string[] = [];
      page.on('console', (m) => {
        if (m.type() === 'error') consoleErrors.push(m.text());
      });
      try {
        await signIn(page, team[role]);
        expect(await navLabels(page)).toEqual(EXPECTED_NAV[role]);
        await expect(page.getByRole('heading', { name: 'Overview' }).isVisible()).resolves.toBe(true);

        // The Admin page is there for admins; others get the refusal page even by URL.
        await page.goto(`${baseUrl}/admin`, { waitUntil: 'networkidle' });
        if (role === 'admin') {
          await page.getByRole('cell', { name: new RegExp(team.viewer.email) }).waitFor();
        } else {
          await page.getByRole('heading', { name: 'Not available to your role' }).waitFor();
        }
        await page.goto(`${baseUrl}/`, { waitUntil: 'networkidle' });
        await page.getByRole('heading', { name: 'Overview' }).waitFor();
        // IBM Plex Mono is served by the app itself (no CDN) and loaded.
        expect(await page.evaluate(() => document.fonts.check('12px "IBM Plex Mono"'))).toBe(true);
        await page.screenshot({ path: path.join(screenshots, `overview-${role}.png`), fullPage: true });
        if (role === 'admin') {
          await page.goto(`${baseUrl}/admin`, { waitUntil: 'networkidle' });
          await page.getByRole('cell', { name: new RegExp(team.viewer.email) }).waitFor();
          await page.screenshot({ path: path.join(screenshots, 'admin.png'), fullPage: true });
        }

        await page.getByRole('button', { name: 'Sign out' }).click();
        await page.waitForURL(/\/sign-in$/);
        await page.goto(`${baseUrl}/tasks`, { waitUntil: 'networkidle' });
        await page.waitForURL(/\/sign-in$/);
        expect(consoleErrors.filter((e) => !/401|Unauthorized/.test(e))).toEqual([]);
      } finally {
        await page.close();
      }
    }, 60_000);
  }
});
