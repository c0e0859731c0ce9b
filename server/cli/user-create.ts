import readline from 'node:readline';
import { Writable } from 'node:stream';
import { parseArgs } from 'node:util';
import { z } from 'zod';
import { passwordSchema } from '../../shared/api/session';
import { emailSchema, nameSchema } from '../../shared/api/users';
import { roleSchema } from '../../shared/api/users';
import { ROLES } from '../../shared/roles';
import { createUser } from '../commands/createUser';
import { disconnect } from '../db';
import { HttpError } from '../errors';
import { guarded, InputError, processIo, UsageError, type CommandIo } from './command';
import { openCliDatabase } from './database';

const USAGE = `usage: doublet user:create --email EMAIL --name NAME --role ${ROLES.join('|')} [--organisation NAME]

Creates a user who signs in with EMAIL and a password, in the organisation NAME (created when no
organisation has that name). Without --organisation the only organisation is used, or "Local" is
created on an empty database; with several organisations --organisation is required.
The password is read from the environment variable DOUBLET_PASSWORD when it is set (scripts),
otherwise asked for twice on the terminal without echo. The local PostgreSQL is started when it is
not running.
`;

/** An organisation's name as the database holds it (organisations.name is 120 characters). */
const organisationNameSchema = z
  .string()
  .trim()
  .min(1, 'Give the organisation a name.')
  .max(120, 'An organisation name has at most 120 characters.');

/** Where the password comes from: the environment, or the terminal the command runs in. */
export interface PasswordSource {
  env: Record<string, string | undefined>;
  stdin: NodeJS.ReadableStream & { isTTY?: boolean };
  /** Where the prompts go (never the typed characters). */
  prompt: NodeJS.WritableStream;
}

/** The process's environment and terminal. */
export function processPasswordSource(): PasswordSource {
  return { env: process.env, stdin: process.stdin, prompt: process.stderr };
}

/** The first message of a failed zod parse, prefixed with the option it came from. */
function check<T>(schema: z.ZodType<T>, value: string, option: string): T {
  const result = schema.safeParse(value);
  if (!result.success) throw new InputError(`${option}: ${result.error.issues[0]?.message ?? 'not valid'}`);
  return result.data;
}

/** One line read from a terminal with echo muted; rejects on Ctrl-C or end of input. */
function askHidden(source: PasswordSource, question: string): Promise<string> {
  let muted = false;
  // readline echoes what is typed to its output; this output drops everything while muted.
  const output = new Writable({
    write(chunk: Buffer | string, _encoding, callback) {
      if (!muted) source.prompt.write(chunk);
      callback();
    },
  });
  const rl = readline.createInterface({ input: source.stdin, output, terminal: true });
  return new Promise<string>((resolve, reject) => {
    let answered = false;
    rl.on('SIGINT', () => rl.close());
    rl.on('close', () => {
      if (!answered) {
        source.prompt.write('\n');
        reject(new InputError('no password entered'));
      }
    });
    rl.question(question, (answer) => {
      answered = true;
      source.prompt.write('\n');
      rl.close();
      resolve(answer);
    });
    muted = true;
  });
}

/** The password: DOUBLET_PASSWORD when set, else typed twice on a terminal. */
async function readPassword(source: PasswordSource): Promise<string> {
  const fromEnv = source.env.DOUBLET_PASSWORD;
  if (fromEnv !== undefined) return fromEnv;
  if (!source.stdin.isTTY) {
    throw new InputError('no terminal to ask for the password on: set DOUBLET_PASSWORD in the environment, or run the command in a terminal');
  }
  const first = await askHidden(source, 'Password: ');
  const second = await askHidden(source, 'Repeat the password: ');
  if (first !== second) throw new InputError('the two passwords differ; nothing was created');
  return first;
}

/** `doublet user:create`: a user (and its organisation when needed) from the command line. */
export function run(args: string[], io: CommandIo = processIo(), source: PasswordSource = processPasswordSource()): Promise<number> {
  return guarded(io, USAGE, async () => {
    const { values } = parseArgs({
      args,
      options: {
        email: { type: 'string' },
        name: { type: 'string' },
        role: { type: 'string' },
        organisation: { type: 'string' },
        help: { type: 'boolean' },
      },
    });
    if (values.help) {
      io.out(USAGE);
      return 0;
    }
    for (const option of ['email', 'name', 'role'] as const) {
      if (values[option] === undefined) throw new UsageError(`--${option} is required`);
    }
    const email = check(emailSchema, values.email!, '--email');
    const name = check(nameSchema, values.name!, '--name');
    const role = check(roleSchema, values.role!, '--role');
    const organisationName = values.organisation === undefined ? undefined : check(organisationNameSchema, values.organisation, '--organisation');
    // Checked before the database is touched, so a weak password costs no connection.
    const password = check(passwordSchema, await readPassword(source), 'password');

    await openCliDatabase();
    try {
      const { user, organisation, createdOrganisation } = await createUser({ email, name, role, password, organisationName }).catch((error: unknown) => {
        if (error instanceof HttpError) throw new InputError(error.message);
        throw error;
      });
      io.out(
        `${createdOrganisation ? `Created the organisation "${organisation.name}". ` : ''}` +
          `Created ${user.role} ${user.email} (${user.name}) in "${organisation.name}"; they can sign in now.\n`,
      );
      return 0;
    } finally {
      await disconnect();
    }
  });
}
