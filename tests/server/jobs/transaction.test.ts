import { describe, expect, it } from 'vitest';
import { db } from '../../../server/db/connection';
import { sendMail } from '../../../server/mail';
import { mailTo, uniqueEmail, useDatabase, useMail } from '../../support';

useDatabase();
const harness = useMail();

/** mail.send jobs in this file's queue whose subject is `subject`, seen from outside any transaction. */
async function jobsWithSubject(subject: string): Promise<number> {
  const [rows] = await db().query(`select count(*)::int as n from "${harness.schema}".job where name = 'mail.send' and data->>'subject' = :subject`, {
    replacements: { subject },
  });
  return (rows as { n: number }[])[0].n;
}

describe('sendMail inside a transaction', () => {
  it('queues nothing when the transaction rolls back', async () => {
    const to = uniqueEmail('rolled-back');
    await expect(
      db().transaction(async (transaction) => {
        await sendMail({ to, subject: 'Never sent', text: 'x' }, { transaction });
        throw new Error('the write failed');
      }),
    ).rejects.toThrow('the write failed');
    await sendMail({ to, subject: 'Sent after', text: 'y' });
    const arrived = await mailTo(to);
    expect(arrived.map((m) => m.subject)).toEqual(['Sent after']);
    expect(await jobsWithSubject('Never sent')).toBe(0);
  });

  it('queues the mail only when the transaction commits, and then it is delivered', async () => {
    const to = uniqueEmail('committed');
    const subject = `Committed ${to}`;
    await db().transaction(async (transaction) => {
      await sendMail({ to, subject, text: 'z' }, { transaction });
      // Not visible to anyone else (the workers included) before the commit.
      expect(await jobsWithSubject(subject)).toBe(0);
    });
    expect(await jobsWithSubject(subject)).toBe(1);
    const [mail] = await mailTo(to);
    expect(mail.subject).toBe(subject);
  });
});
