import { openDatabase } from '../db';
import { initModels, Organisation } from '../models';
import { InputError } from './command';

/** Starts the local PostgreSQL when it is not running, migrates, and binds the models. */
export async function openCliDatabase(): Promise<void> {
  initModels(await openDatabase());
}

/**
 * The organisation a command works in: the one named, or the only one there is; on an empty
 * database a first organisation named "Local" is created so `import` works before any sign-in.
 */
export async function resolveOrganisation(name: string | undefined): Promise<Organisation> {
  if (name !== undefined) {
    const found = await Organisation.findOne({ where: { name } });
    if (!found) throw new InputError(`no organisation named "${name}"`);
    return found;
  }
  const all = await Organisation.findAll({ order: [['createdAt', 'ASC']], limit: 2 });
  if (all.length === 0) return Organisation.create({ name: 'Local' });
  if (all.length > 1) throw new InputError('there are several organisations: name one with --organisation NAME');
  return all[0];
}
