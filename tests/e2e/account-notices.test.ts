import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { noticeSettings } from '../../server/queries/notices';
import { ROLES } from '../../shared/roles';
import { buildTeam, useDatabase } from '../support';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';
import { seriousViolations } from './axe';

useDatabase();

let session: BrowserSession;
let team: Awaited<ReturnType<typeof buildTeam>>;

beforeAll(async () => {
  team = await buildTeam();
  session = await startBrowserSession({ width: 1280, height: 900 });
}, 120_000);

afterAll(async () => {
  await session?.close();
});


describe('notice mails in account settings, in Chromium', () => {
  for (const role of ROLES) {
    it(`lets a ${role} turn a notice kind off and on again`, async () => {
      const user = team[role];
      const page = await session.context.newPage();
      try {
        await session.context.clearCookies();
        await signInThroughForm(page, session.baseUrl, user);
        await page.getByRole('link', { name: user.name }).click();
        await page.getByRole('heading', { name: 'Account', level: 1 }).waitFor();
        const panel = page.getByRole('region', { name: 'Notice mails' });
        const budget = panel.getByRole('checkbox', { name: 'Snapshot over its clone budget' });
        await budget.waitFor();
        for (const name of ['Task assigned to you', 'Your task done or reopened by a load', 'Snapshot over its clone budget', 'Drifted classes in a new snapshot']) {
          expect(await panel.getByRole('checkbox', { name }).isChecked(), name).toBe(true);
        }
        expect(await panel.getByText('invitations always go out').count()).toBe(1);

        await budget.uncheck();
        await panel.getByRole('status').filter({ hasText: 'Saved.' }).waitFor();
        await expect.poll(async () => (await noticeSettings(user.id)).get('budgetExceeded')).toBe(false);
        await page.screenshot({ path: path.join(SCREENSHOTS, `account-notices-${role}.png`), fullPage: true });
        expect(await seriousViolations(page)).toEqual([]);

        // Kept across a reload; the other kinds are untouched.
        await page.reload({ waitUntil: 'networkidle' });
        await budget.waitFor();
        expect(await budget.isChecked()).toBe(false);
        expect(await panel.getByRole('checkbox', { name: 'Task assigned to you' }).isChecked()).toBe(true);

        await budget.check();
        await expect.poll(async () => (await noticeSettings(user.id)).get('budgetExceeded')).toBe(true);
      } finally {
        await page.close();
      }
    }, 60_000);
  }
});
