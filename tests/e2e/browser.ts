import fs from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { createApp } from '../../server/app';
import { projectRoot } from '../../server/config';
import type { User } from '../../server/models/User';
import { TEST_PASSWORD } from '../support';

/** Where browser tests save their screenshots (git-ignored). */
export const SCREENSHOTS = path.join(projectRoot, 'test-results', 'screenshots');

/** The real app on an ephemeral port and Debian's Chromium with a new, empty profile. */
export interface BrowserSession {
  baseUrl: string;
  context: BrowserContext;
  close(): Promise<void>;
}

/**
 * Starts the app (serving the built client from dist/web) and a headless Chromium, with the flags
 * this machine needs (no sandbox as root; no background networking: the network is closed).
 */
export async function startBrowserSession(viewport: { width: number; height: number }): Promise<BrowserSession> {
  if (!fs.existsSync(path.join(projectRoot, 'dist', 'web', 'index.html'))) {
    throw new Error('dist/web is missing: run the tests with `npm test`, which builds the client first');
  }
  const server = await new Promise<Server>((resolve) => {
    const s = createApp().listen(0, '127.0.0.1', () => resolve(s));
  });
  fs.mkdirSync(SCREENSHOTS, { recursive: true });
  const profileDir = fs.mkdtempSync(path.join(os.tmpdir(), 'chromium-profile-'));
  const context = await chromium.launchPersistentContext(profileDir, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport,
    args: [
      '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync',
    ],
  });
  return {
    baseUrl: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    context,
    async close() {
      await context.close();
      fs.rmSync(profileDir, { recursive: true, force: true });
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}

/** Signs a user in through the sign-in form (with TEST_PASSWORD) and waits for the navigation. */
export async function signInThroughForm(page: Page, baseUrl: string, user: User): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`, { waitUntil: 'networkidle' });
  await page.getByLabel('E-mail').fill(user.email);
  await page.getByLabel('Password').fill(TEST_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}
