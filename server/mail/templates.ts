import type { MailMessage } from './transport';
import { escapeHtml } from './html';

/**
 * The invitation mail: who invited whom to which organisation, with the one-time link. When the
 * address already has a Doublet account (in another organisation: one address belongs to one
 * organisation), the mail says so and how to go on instead of holding a link that could not work.
 *
 * @example
 * invitationMail({ to, inviteeName: 'Ana', inviterName: 'Ines', organisationName: 'Acme', roleLabel: 'Engineer', link, expiresAt })
 */
export function invitationMail(input: {
  to: string;
  inviteeName: string;
  inviterName: string;
  organisationName: string;
  roleLabel: string;
  link: string;
  expiresAt: Date;
  hasAccountElsewhere?: boolean;
  signInLink?: string;
}): MailMessage {
  const expires = input.expiresAt.toISOString().slice(0, 10);
  const subject = `You are invited to ${input.organisationName} on Doublet`;
  const greeting = `Hello ${input.inviteeName},`;
  const invited = `${input.inviterName} invited you to ${input.organisationName} on Doublet as ${input.roleLabel}.`;
  if (input.hasAccountElsewhere) {
    const signIn = input.signInLink ?? input.link;
    const text = [
      greeting,
      '',
      invited,
      'This e-mail address already has a Doublet account, and one address can belong to one organisation only,',
      'so this invitation cannot be accepted with it. You can sign in to your account as usual:',
      '',
      signIn,
      '',
      `To join ${input.organisationName} as well, ask ${input.inviterName} to invite another address of yours.`,
      'If you did not expect this, ignore this mail.',
    ].join('\n');
    const html =
      `<p>${escapeHtml(greeting)}</p><p>${escapeHtml(invited)}</p>` +
      '<p>This e-mail address already has a Doublet account, and one address can belong to one organisation only, ' +
      `so this invitation cannot be accepted with it. You can <a href="${escapeHtml(signIn)}">sign in to your account</a> as usual.</p>` +
      `<p>To join ${escapeHtml(input.organisationName)} as well, ask ${escapeHtml(input.inviterName)} to invite another address of yours.</p>`;
    return { to: input.to, subject, text, html };
  }
  const text = [
    greeting,
    '',
    invited,
    'Open this link to choose your password (it works once, until ' + expires + '):',
    '',
    input.link,
    '',
    'If you did not expect this, ignore this mail.',
  ].join('\n');
  const html =
    `<p>${escapeHtml(greeting)}</p>` +
    `<p>${escapeHtml(input.inviterName)} invited you to ${escapeHtml(input.organisationName)} on Doublet as ` +
    `${escapeHtml(input.roleLabel)}.</p>` +
    `<p><a href="${escapeHtml(input.link)}">Choose your password</a> (the link works once, until ${expires}).</p>`;
  return { to: input.to, subject, text, html };
}
