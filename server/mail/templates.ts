import type { MailMessage } from './transport';

function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/**
 * The invitation mail: who invited whom to which organisation, with the one-time link.
 *
 * @example
 * invitationMail({ to, inviteeName: 'Ana', inviterName: 'Ines', organisationName: 'Acme', role: 'Engineer', link, expiresAt })
 */
export function invitationMail(input: {
  to: string;
  inviteeName: string;
  inviterName: string;
  organisationName: string;
  roleLabel: string;
  link: string;
  expiresAt: Date;
}): MailMessage {
  const expires = input.expiresAt.toISOString().slice(0, 10);
  const text = [
    `Hello ${input.inviteeName},`,
    '',
    `${input.inviterName} invited you to ${input.organisationName} on Doublet as ${input.roleLabel}.`,
    'Open this link to choose your password (it works once, until ' + expires + '):',
    '',
    input.link,
    '',
    'If you did not expect this, ignore this mail.',
  ].join('\n');
  const html =
    `<p>Hello ${escapeHtml(input.inviteeName)},</p>` +
    `<p>${escapeHtml(input.inviterName)} invited you to ${escapeHtml(input.organisationName)} on Doublet as ` +
    `${escapeHtml(input.roleLabel)}.</p>` +
    `<p><a href="${escapeHtml(input.link)}">Choose your password</a> (the link works once, until ${expires}).</p>`;
  return { to: input.to, subject: `You are invited to ${input.organisationName} on Doublet`, text, html };
}
