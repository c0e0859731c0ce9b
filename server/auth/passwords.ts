import bcrypt from 'bcryptjs';

/** bcrypt cost factor: 2^10 rounds, about 60–100 ms per hash in bcryptjs here; common practice for web sign-in. */
const COST = 10;

/**
 * A bcrypt hash of a password (salt included).
 *
 * @example
 * const hash = await hashPassword('correct horse battery');
 */
export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, COST);
}

// A real hash of a random string, compared against when no user matches, so a missing account and
// a wrong password take the same time and do not reveal which e-mails exist.
const DECOY_HASH = bcrypt.hashSync(`decoy-${Math.random()}`, COST);

/**
 * True when the password matches the hash. With `hash` undefined it still spends the time of a
 * comparison and answers false.
 *
 * @example
 * await verifyPassword('correct horse battery', hash) // true
 */
export async function verifyPassword(password: string, hash: string | undefined): Promise<boolean> {
  const matches = await bcrypt.compare(password, hash ?? DECOY_HASH);
  return hash !== undefined && matches;
}
