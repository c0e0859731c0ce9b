import { simpleParser } from 'mailparser';
import { Op } from 'sequelize';
import { db } from '../db/connection';
import { Organisation } from '../models/Organisation';
import { OutboxMessage } from '../models/OutboxMessage';
import { User } from '../models/User';
import { ORGANISATION_HEADER } from './transport';

/** The outbox keeps this many messages; older ones are deleted as new ones arrive. */
export const OUTBOX_LIMIT = 5000;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A message as the SMTP conversation delivered it. */
export interface ReceivedMail {
  raw: Buffer;
  /** MAIL FROM, or null for a bounce. */
  envelopeFrom: string | null;
  /** RCPT TO addresses. */
  envelopeTo: string[];
  receivedAt?: Date;
}

/**
 * Which organisation's admins may read a message: the organisation the sender named in the
 * X-Doublet-Organisation header when it exists, else the organisation of a recipient who has an
 * account, else none (the message is stored but shown to nobody). The sender's word is taken
 * because an invitee has no account yet, and one address may be invited by two organisations:
 * deriving it from the address alone would show one organisation's invitation to the other.
 */
async function organisationOf(header: string | undefined, recipients: string[]): Promise<string | null> {
  if (header && UUID.test(header) && (await Organisation.findByPk(header, { attributes: ['id'] }))) return header;
  const user = await User.findOne({ where: { email: { [Op.in]: recipients } }, attributes: ['organisationId'] });
  return user?.organisationId ?? null;
}

/**
 * Parses one received message (mailparser) and stores it in `outbox_messages`; a message whose
 * Message-ID is already stored (a retried delivery) is not stored twice. Nothing of the message is
 * logged.
 */
export async function storeReceivedMail(mail: ReceivedMail): Promise<void> {
  const parsed = await simpleParser(mail.raw, { skipImageLinks: true, skipTextLinks: true });
  const recipients = [...new Set(mail.envelopeTo.map((a) => a.trim().toLowerCase()))];
  const header = parsed.headers.get(ORGANISATION_HEADER.toLowerCase());
  const organisationId = await organisationOf(typeof header === 'string' ? header.trim() : undefined, recipients);
  await OutboxMessage.bulkCreate(
    [
      {
        organisationId,
        messageId: parsed.messageId ?? null,
        fromAddress: parsed.from?.text || mail.envelopeFrom || '',
        toAddresses: recipients,
        subject: parsed.subject ?? '',
        text: parsed.text ?? '',
        html: typeof parsed.html === 'string' ? parsed.html : null,
        sizeBytes: mail.raw.length,
        receivedAt: mail.receivedAt ?? new Date(),
      },
    ],
    { ignoreDuplicates: true },
  );
  await pruneOutbox();
}

/** Deletes all but the newest OUTBOX_LIMIT messages. */
async function pruneOutbox(): Promise<void> {
  await db().query(
    `delete from outbox_messages where id in (
       select id from outbox_messages order by received_at desc, id desc offset :keep)`,
    { replacements: { keep: OUTBOX_LIMIT } },
  );
}
