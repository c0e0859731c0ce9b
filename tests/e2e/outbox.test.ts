import path from 'node:path';
import nodemailer from 'nodemailer';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { User } from '../../server/models/User';
import { ORGANISATION_HEADER } from '../../server/mail';
import type { Role } from '../../shared/roles';
import { buildTeam, invitationTokenMailedTo, mailTo, uniqueEmail, useDatabase, useMail } from '../support';
import { SCREENSHOTS, signInThroughForm, startBrowserSession, type BrowserSession } from './browser';

useDatabase();
const mail = useMail();

let session: BrowserSession;
let team: Record<Role, User> & { organisation: { id: string; name: string } };

beforeAll(async () => {
  team = await buildTeam();
  session = await startBrowserSession({ width: 1366, height: 900 });
}, 120_000);

afterAll(async () => {
  await session?.close();
});

describe('the Outbox in Chromium', () => {
  it('an admin invites someone, then reads the invitation mail in the Outbox as text and as sandboxed HTML', async () => {
    const page = await session.context.newPage();
    const consoleErrors: string[] = [];
    page.on('console', (m) => {
      if (m.type() === 'error') consoleErrors.push(m.text());
    });
    await signInThroughForm(page, session.baseUrl, team.admin);

    const email = uniqueEmail('signaller');
    await page.goto(`${session.baseUrl}/admin`, { waitUntil: 'networkidle' });
    await page.getByLabel('Name').fill('Oona Pettersen');
    await page.getByLabel('E-mail').fill(email);
    await page.getByRole('button', { name: 'Send invitation' }).click();
    const token = await invitationTokenMailedTo(email);

    // A message whose HTML tries to run script: the frame must show it inert.
    const smtp = nodemailer.createTransport({ host: '127.0.0.1', port: mail.catcher.port, secure: false, ignoreTLS: true });
    await smtp.sendMail({
      from: 'yard@brackenfold.example',
      to: team.viewer.email,
      subject: 'Timetable change with a script',
      text: 'Plain text of the timetable change.',
      html: '<p id="marker">static</p><script>document.getElementById("marker").textContent = "script ran"; parent.document.title = "script ran";</script>',
      headers: { [ORGANISATION_HEADER]: team.organisation.id },
    });
    smtp.close();
    await mailTo(team.viewer.email);

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Outbox' }).click();
    await page.getByRole('heading', { name: 'Outbox' }).waitFor();
    await page.getByRole('cell', { name: email }).waitFor();
    await page.getByRole('link', { name: `You are invited to ${team.organisation.name} on Doublet` }).click();

    const message = page.getByRole('article', { name: 'Message' });
    await message.getByText(`/invitations/${token}`).waitFor();
    const frame = message.locator('iframe');
    expect(await frame.getAttribute('sandbox')).toBe('');
    await page.frameLocator('article iframe').getByRole('link').first().waitFor();
    expect(await page.frameLocator('article iframe').locator('a').first().getAttribute('href')).toContain(token);
    await page.screenshot({ path: path.join(SCREENSHOTS, 'outbox-invitation.png'), fullPage: true });

    await page.getByRole('link', { name: 'Timetable change with a script' }).click();
    await message.getByText('Plain text of the timetable change.').waitFor();
    const marker = page.frameLocator('article iframe').locator('#marker');
    await marker.waitFor();
    expect(await marker.textContent()).toBe('static');
    expect(await page.title()).not.toBe('script ran');
    expect(consoleErrors.filter((e) => !/Blocked script execution/.test(e))).toEqual([]);
    await page.close();
  }, 90_000);

  it('is not offered to a lead, and its address answers with the refusal page', async () => {
    await session.context.clearCookies();
    const page = await session.context.newPage();
    await signInThroughForm(page, session.baseUrl, team.lead);
    const labels = await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents();
    expect(labels).not.toContain('Outbox');
    await page.goto(`${session.baseUrl}/outbox`, { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'Not available to your role' }).waitFor();
    await page.screenshot({ path: path.join(SCREENSHOTS, 'outbox-lead.png'), fullPage: true });
    await page.close();
  }, 60_000);
});
