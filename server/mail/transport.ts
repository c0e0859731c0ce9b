import crypto from 'node:crypto';
import type { Transporter } from 'nodemailer';
import { loadConfig } from '../config';

/** One e-mail as the product writes it. */
export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html?: string;
  /**
   * The organisation the mail is about. It travels as the `X-Doublet-Organisation` header, so
   * the catcher can show the mail to that organisation's admins only.
   */
  organisationId?: string;
}

/** A message on its way: what a `mail.send` job carries. */
export interface OutgoingMail extends MailMessage {
  /** Chosen once when the mail is queued, so a retried delivery carries the same Message-ID. */
  messageId: string;
}

/** The header that names the organisation a mail is about. */
export const ORGANISATION_HEADER = 'X-Doublet-Organisation';

/** Where mail is delivered: a real server by URL, or a plain SMTP host and port (the local catcher). */
export type MailTarget = { url: string } | { host: string; port: number };

let override: MailTarget | undefined;
let cached: { key: string; transport: Transporter } | undefined;

/**
 * Points delivery at another server for this process (tests point it at their own catcher on an
 * ephemeral port); `undefined` goes back to the configured one.
 *
 * @example
 * setMailTarget({ host: '127.0.0.1', port: catcher.port });
 */
export function setMailTarget(target: MailTarget | undefined): void {
  override = target;
}

/** The configured target: SMTP_URL when set, else the local catcher on 127.0.0.1:DOUBLET_SMTP_PORT. */
export function mailTarget(): MailTarget {
  if (override) return override;
  const config = loadConfig();
  return config.smtpUrl ? { url: config.smtpUrl } : { host: '127.0.0.1', port: config.smtpPort };
}

// Bounded waits: a mail server that hangs fails the attempt, and the job's retries take over.
const TIMEOUTS = { connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000 };

async function transportFor(target: MailTarget): Promise<Transporter> {
  const key = JSON.stringify(target);
  if (cached?.key === key) return cached.transport;
  // imported on the first delivery: processes that only queue mail (the command line) never load it
  const { default: nodemailer } = await import('nodemailer');
  if (cached?.key === key) return cached.transport; // another delivery made it meanwhile
  cached?.transport.close();
  const transport =
    'url' in target
      ? nodemailer.createTransport({ url: target.url, ...TIMEOUTS })
      : // The local catcher speaks plain SMTP on loopback only: no TLS to negotiate.
        nodemailer.createTransport({ host: target.host, port: target.port, secure: false, ignoreTLS: true, ...TIMEOUTS });
  cached = { key, transport };
  return transport;
}

/**
 * A Message-ID for a new mail, on the sender's domain.
 *
 * @example
 * newMessageId() // '<3f0c…@doublet.localhost>'
 */
export function newMessageId(): string {
  const from = loadConfig().mailFrom;
  const domain = /@([^>\s]+)>?\s*$/.exec(from)?.[1] ?? 'doublet.localhost';
  return `<${crypto.randomUUID()}@${domain}>`;
}

/**
 * Hands one message to the SMTP server now; throws when the server cannot be reached or refuses
 * it (the `mail.send` job retries). Only the recipient and subject are ever logged, never the body:
 * it can hold one-time links.
 */
export async function deliver(mail: OutgoingMail): Promise<void> {
  const { organisationId, messageId, ...message } = mail;
  await (await transportFor(mailTarget())).sendMail({
    from: loadConfig().mailFrom,
    ...message,
    messageId,
    headers: organisationId ? { [ORGANISATION_HEADER]: organisationId } : undefined,
  });
  if (!process.env.DOUBLET_TEST) console.log(`mail: "${mail.subject}" to ${mail.to}`);
}
