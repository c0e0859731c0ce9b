import { describe, expect, it } from 'vitest';
import { verifyPassword } from '../../../server/auth/passwords';
import { DEMO_ORGANISATION_NAME, DEMO_SIGN_INS, claimDemoOrganisation, createDemoOrganisation, seedDemo } from '../../../server/commands/seedDemo';
import { db } from '../../../server/db/connection';
import { User } from '../../../server/models/User';
import { ROLES } from '../../../shared/roles';
import { buildOrganisation, useDatabase } from '../../support';

useDatabase();

describe('seedDemo', () => {
  it('does nothing on a database that already has an organisation', async () => {
    await buildOrganisation();
    const lines: string[] = [];
    expect(await seedDemo({ log: (line) => lines.push(line) })).toBeNull();
    expect(await claimDemoOrganisation()).toBeNull();
    expect(lines).toEqual([]);
  });

  it('creates the demo organisation with one user per role whose demo passwords work', async () => {
    // Inside a transaction that is rolled back: the shared test database keeps no demo rows.
    const transaction = await db().transaction();
    try {
      const organisation = await createDemoOrganisation({ transaction });
      expect(organisation.name).toBe(DEMO_ORGANISATION_NAME);
      const users = await User.findAll({ where: { organisationId: organisation.id }, transaction });
      expect(users.map((u) => u.role).sort()).toEqual([...ROLES].sort());
      for (const signIn of DEMO_SIGN_INS) {
        const user = users.find((u) => u.email === signIn.email)!;
        expect(user.role).toBe(signIn.role);
        expect(await verifyPassword(signIn.password, user.passwordHash)).toBe(true);
      }
    } finally {
      await transaction.rollback();
    }
  });

  it('seeds beside other organisations when forced (DOUBLET_DEMO=1), and only once', async () => {
    await buildOrganisation();
    // Rolled back like the test above; no other test file commits the demo organisation.
    const transaction = await db().transaction();
    try {
      expect(await claimDemoOrganisation({ transaction })).toBeNull();
      const seeded = await claimDemoOrganisation({ force: true, transaction });
      expect(seeded?.name).toBe(DEMO_ORGANISATION_NAME);
      expect(await User.count({ where: { organisationId: seeded!.id }, transaction })).toBe(DEMO_SIGN_INS.length);
      expect(await claimDemoOrganisation({ force: true, transaction })).toBeNull();
    } finally {
      await transaction.rollback();
    }
  });

  describe('edge cases', () => {
    it('uses addresses under the reserved .example domain only', () => {
      for (const signIn of DEMO_SIGN_INS) expect(signIn.email).toMatch(/@[a-z-]+\.example$/);
    });
  });
});
