import type { Role } from '../../shared/roles';
import { hashPassword } from '../auth/passwords';
import { db } from '../db/connection';
import { ConflictError, ValidationError, fromDatabaseError } from '../errors';
import { Organisation } from '../models/Organisation';
import { User } from '../models/User';

/** A user to create from the command line; every field already validated by the shared schemas. */
export interface CreateUserInput {
  email: string;
  name: string;
  role: Role;
  password: string;
  /** The organisation's name; it is created when no organisation has this name. */
  organisationName?: string;
}

/**
 * Creates a user (and its organisation when needed) in one transaction. Without an organisation
 * name it uses the only organisation there is, or creates "Local" on a database with none (as
 * `doublet import` does); with several it refuses, since guessing would put someone in the wrong one.
 *
 * @throws ConflictError when the e-mail is taken; ValidationError when the organisation is ambiguous
 * @example
 * const { user, organisation, createdOrganisation } = await createUser({ email, name, role: 'admin', password });
 */
export async function createUser(input: CreateUserInput): Promise<{ user: User; organisation: Organisation; createdOrganisation: boolean }> {
  const passwordHash = await hashPassword(input.password);
  try {
    return await db().transaction(async (transaction) => {
      if (await User.findOne({ where: { email: input.email }, transaction })) {
        throw new ConflictError('Someone with this e-mail address already has an account.', 'email');
      }
      let organisation: Organisation | null;
      let createdOrganisation = false;
      if (input.organisationName !== undefined) {
        organisation = await Organisation.findOne({ where: { name: input.organisationName }, order: [['createdAt', 'ASC']], transaction });
      } else {
        const all = await Organisation.findAll({ order: [['createdAt', 'ASC']], limit: 2, transaction });
        if (all.length > 1) throw new ValidationError('There are several organisations: name one with --organisation NAME.', 'organisation');
        organisation = all[0] ?? null;
      }
      if (!organisation) {
        organisation = await Organisation.create({ name: input.organisationName ?? 'Local' }, { transaction });
        createdOrganisation = true;
      }
      const user = await User.create(
        { organisationId: organisation.id, email: input.email, name: input.name, role: input.role, passwordHash },
        { transaction },
      );
      return { user, organisation, createdOrganisation };
    });
  } catch (error) {
    // Two creations racing for one e-mail: the unique index decides, with the same message.
    throw fromDatabaseError(error);
  }
}
