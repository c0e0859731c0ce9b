import nodemailer from 'nodemailer';
import { loadConfig } from '../config';

/** One e-mail as the product writes it. */
export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html?: string;
}

/** A message as it left the transport, kept for tests and for the later local mail catcher. */
export interface SentMail extends MailMessage {
  from: string;
  messageId: string;
  sentAt: Date;
}

/**
 * For now a JSON transport: nodemailer builds the message but does not deliver it, and the message
 * is recorded in memory. A later change swaps this file's transport for the local SMTP catcher;
 * callers only ever use sendMail().
 */
const transport = nodemailer.createTransport({ jsonTransport: true });
const outbox: SentMail[] = [];
const OUTBOX_LIMIT = 200;

/**
 * Sends one e-mail and records it. Only the recipient and subject go to the console, never the
 * body (it can hold one-time links).
 *
 * @example
 * await sendMail({ to: 'ana@example.test', subject: 'Hello', text: 'Hi' });
 */
export async function sendMail(message: MailMessage): Promise<SentMail> {
  const from = loadConfig().mailFrom;
  const info = await transport.sendMail({ from, ...message });
  const sent: SentMail = { ...message, from, messageId: info.messageId, sentAt: new Date() };
  outbox.push(sent);
  if (outbox.length > OUTBOX_LIMIT) outbox.shift();
  if (!process.env.DOUBLET_TEST) console.log(`mail: "${message.subject}" to ${message.to}`);
  return sent;
}

/**
 * The messages recorded by this process, oldest first; with `to`, only those to that address.
 *
 * @example
 * sentMail('ana@example.test').at(-1)?.subject
 */
export function sentMail(to?: string): SentMail[] {
  return to ? outbox.filter((m) => m.to === to) : [...outbox];
}
