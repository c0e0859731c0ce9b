import type { Transaction } from 'sequelize';
import type { Role } from '../../shared/roles';
import { hashPassword } from '../auth/passwords';
import { db } from '../db/connection';
import { Organisation } from '../models/Organisation';
import { User } from '../models/User';
import { seedDemoRepositories } from './seedDemoRepositories';
import { seedDemoTasks } from './seedDemoTasks';

/** The invented demo organisation: a rail-freight operator with its own codebases. */
export const DEMO_ORGANISATION_NAME = 'Brackenfold Rail Freight';

/** One demo sign-in. */
export interface DemoSignIn {
  role: Role;
  name: string;
  email: string;
  password: string;
}

/**
 * One user per role, with demo passwords (printed at start-up, listed in the README). The
 * `.example` domain is reserved for examples, so these addresses can never reach anyone.
 */
export const DEMO_SIGN_INS: readonly DemoSignIn[] = [
  { role: 'admin', name: 'Ines Varga', email: 'ines.varga@brackenfold.example', password: 'brackenfold-admin' },
  { role: 'lead', name: 'Tomasz Okafor', email: 'tomasz.okafor@brackenfold.example', password: 'brackenfold-lead' },
  { role: 'engineer', name: 'Priya Lindqvist', email: 'priya.lindqvist@brackenfold.example', password: 'brackenfold-engineer' },
  { role: 'viewer', name: 'Malcolm Achterberg', email: 'malcolm.achterberg@brackenfold.example', password: 'brackenfold-viewer' },
];

/** Creates the demo organisation and its users, inside the caller's transaction when given. */
export async function createDemoOrganisation(options: { transaction?: Transaction } = {}): Promise<Organisation> {
  const hashes = await Promise.all(DEMO_SIGN_INS.map((s) => hashPassword(s.password)));
  const write = async (transaction: Transaction) => {
    const organisation = await Organisation.create({ name: DEMO_ORGANISATION_NAME }, { transaction });
    await User.bulkCreate(
      DEMO_SIGN_INS.map((s, i) => ({
        organisationId: organisation.id,
        email: s.email,
        name: s.name,
        role: s.role,
        passwordHash: hashes[i],
      })),
      { transaction },
    );
    return organisation;
  };
  return options.transaction ? write(options.transaction) : db().transaction(write);
}

/**
 * Creates the demo organisation and its users when the database has no organisation at all, and
 * returns it; on a database in use it does nothing and returns null. With `force` (DOUBLET_DEMO=1)
 * it creates it beside other organisations too, unless one named like the demo is already there.
 *
 * @example
 * const organisation = await claimDemoOrganisation(); // Organisation on a fresh database, else null
 */
export async function claimDemoOrganisation(options: { transaction?: Transaction; force?: boolean } = {}): Promise<Organisation | null> {
  const { transaction } = options;
  if (!options.force) {
    if ((await Organisation.count({ transaction })) > 0) return null;
  } else {
    // The demo users' e-mails are unique too: an organisation renamed since still holds them.
    if ((await Organisation.count({ where: { name: DEMO_ORGANISATION_NAME }, transaction })) > 0) return null;
    if ((await User.count({ where: { email: DEMO_SIGN_INS.map((s) => s.email) }, transaction })) > 0) return null;
  }
  return createDemoOrganisation({ transaction });
}

/**
 * `npm start`'s demo: the organisation and its users (see claimDemoOrganisation), then its
 * content, step by step in this order, each step reporting through `log`. Returns the
 * organisation, or null when the database already has one (nothing is written then). Safe to call
 * at every start.
 */
export async function seedDemo(options: { force?: boolean; log?: (line: string) => void } = {}): Promise<Organisation | null> {
  const log = options.log ?? (() => {});
  const organisation = await claimDemoOrganisation({ force: options.force });
  if (!organisation) return null;
  log(`Seeding the demo organisation "${organisation.name}" with its repositories…`);
  await seedDemoRepositories(organisation, log);
  for (const line of await seedDemoTasks(organisation)) log(line); // refactor tasks on the loaded classes
  return organisation;
}

/** Whether the demo organisation is in the database (its sign-ins are worth printing then). */
export async function demoOrganisationExists(): Promise<boolean> {
  return (await Organisation.count({ where: { name: DEMO_ORGANISATION_NAME } })) > 0;
}

/** The demo sign-ins as console lines. */
export function demoSignInLines(): string[] {
  return DEMO_SIGN_INS.map((s) => `  ${s.role.padEnd(9)} ${s.email.padEnd(40)} ${s.password}`);
}
