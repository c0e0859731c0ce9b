import crypto from 'node:crypto';
import type { Role } from '../../shared/roles';
import { hashPassword } from '../../server/auth/passwords';
import { Organisation } from '../../server/models/Organisation';
import { User } from '../../server/models/User';

/** The password every factory-built user has unless told otherwise. */
export const TEST_PASSWORD = 'signal-lamp-crossing';

let testPasswordHash: Promise<string> | undefined;

/**
 * An e-mail address no other test (in any parallel file) uses.
 *
 * @example
 * uniqueEmail('lead') // 'lead-3f9a1c2b7d@test.example'
 */
export function uniqueEmail(label = 'user'): string {
  return `${label}-${crypto.randomBytes(6).toString('hex')}@test.example`;
}

/** A new organisation (each test gets its own, so listings are not disturbed by parallel files). */
export function buildOrganisation(overrides: Partial<{ name: string }> = {}): Promise<Organisation> {
  return Organisation.create({ name: overrides.name ?? `Test organisation ${crypto.randomBytes(3).toString('hex')}` });
}

/** What buildUser accepts; everything optional. */
export interface BuildUserOptions {
  role?: Role;
  organisation?: Organisation;
  email?: string;
  name?: string;
  password?: string;
  deactivated?: boolean;
}

/**
 * A user in the database: role engineer, a new organisation, a unique e-mail and TEST_PASSWORD
 * unless told otherwise.
 *
 * @example
 * const admin = await buildUser({ role: 'admin' });
 * const team = await buildTeam();
 */
export async function buildUser(options: BuildUserOptions = {}): Promise<User> {
  const organisation = options.organisation ?? (await buildOrganisation());
  const role = options.role ?? 'engineer';
  let passwordHash: string;
  if (options.password === undefined) {
    testPasswordHash ??= hashPassword(TEST_PASSWORD);
    passwordHash = await testPasswordHash;
  } else {
    passwordHash = await hashPassword(options.password);
  }
  return User.create({
    organisationId: organisation.id,
    email: options.email ?? uniqueEmail(role),
    name: options.name ?? `Test ${role}`,
    role,
    passwordHash,
    deactivatedAt: options.deactivated ? new Date() : null,
  });
}

/**
 * One user per role in one new organisation.
 *
 * @example
 * const { admin, viewer } = await buildTeam();
 */
export async function buildTeam(): Promise<Record<Role, User> & { organisation: Organisation }> {
  const organisation = await buildOrganisation();
  const [admin, lead, engineer, viewer] = await Promise.all(
    (['admin', 'lead', 'engineer', 'viewer'] as const).map((role) => buildUser({ role, organisation })),
  );
  return { organisation, admin, lead, engineer, viewer };
}
