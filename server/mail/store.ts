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
 * Which organisation's admins may read a message: the organisation it is about, when every
 * recipient is either that organisation's member or someone without an account (an invitee).
 * The organisation is the one the sender named in the X-Doublet-Organisation header when that
 * exists, else the one organisation of the recipients who have accounts. A message to someone who
 * belongs to another organisation is filed under none: one organisation's admins never read mail
 * to another's members (an invitation to an address that has an account elsewhere says so, and
 * that is for the address's owner alone). Filed under none, a message is stored but shown to nobody.
 */
async function organisationOf(header: string | undefined, recipients: string[]): Promise<string | null> {
  const accounts = await User.findAll({ where: { email: { [Op.in]: recipients } }, attributes: ['organisationId'] });
  const accountOrganisations = new Set(accounts.map((u) => u.organisationId));
  const named = header && UUID.test(header) && (await Organisation.findByPk(header, { attributes: ['id'] })) ? header : undefined;
  const candidate = named ?? (accountOrganisations.size === 1 ? [...accountOrganisations][0] : undefined);
  if (!candidate) return null;
  return [...accountOrganisations].every((id) => id === candidate) ? candidate : null;
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
