import crypto from 'node:crypto';
import { PassThrough, Writable } from 'node:stream';
import { afterEach, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { run as userCreate, type PasswordSource } from '../../../server/cli/user-create';
import { connect } from '../../../server/db/connection';
import { initModels, Organisation, User } from '../../../server/models';
import { buildOrganisation, buildUser, signedInAgent, uniqueEmail, useDatabase } from '../../support';
import { captureIo } from './io';

useDatabase();

const PASSWORD = 'points-and-crossings-42';

/** A source with no terminal: only DOUBLET_PASSWORD (when given) supplies the password. */
function noTerminal(password?: string): PasswordSource {
  const stdin = Object.assign(new PassThrough(), { isTTY: false });
  return { env: password === undefined ? {} : { DOUBLET_PASSWORD: password }, stdin, prompt: new PassThrough() };
}

/** A uniquely named organisation, so parallel test files never share it. */
function organisationName(): string {
  return `Signal works ${crypto.randomBytes(4).toString('hex')}`;
}

const printed: string[] = [];

/**
 * Runs the command in-process. It connects and disconnects the shared pool itself, so the test's
 * models are bound to a fresh connection afterwards.
 */
async function create(args: string[], source: PasswordSource) {
  const io = captureIo();
  const code = await userCreate(args, io, source);
  initModels(connect(process.env.DATABASE_URL!));
  printed.push(io.stdout(), io.stderr());
  return { code, stdout: io.stdout(), stderr: io.stderr() };
}

afterEach(() => {
  // Whatever a test did, no output ever carried a password.
  for (const text of printed) {
    expect(text).not.toContain(PASSWORD);
    expect(text).not.toContain('short-one');
  }
  printed.length = 0;
});

describe('doublet user:create', () => {
  it('creates an admin and the named organisation from DOUBLET_PASSWORD, and the admin can sign in', async () => {
    const email = uniqueEmail('first-admin');
    const name = organisationName();
    const result = await create(['--email', email.toUpperCase(), '--name', '  Ines Varga ', '--role', 'admin', '--organisation', name], noTerminal(PASSWORD));
    expect(result.stderr).toBe('');
    expect(result.code).toBe(0);
    expect(result.stdout).toContain(`Created the organisation "${name}"`);
    const user = (await User.findOne({ where: { email } }))!;
    expect(user.name).toBe('Ines Varga');
    expect(user.role).toBe('admin');
    expect((await Organisation.findByPk(user.organisationId))!.name).toBe(name);

    const agent = await signedInAgent(createApp(), user, PASSWORD);
    const session = await agent.get('/api/session').expect(200);
    expect(session.body.user.email).toBe(email);
    expect(session.body.user.role).toBe('admin');
    expect(session.body.organisation.name).toBe(name);
    // An admin may do what only admins may.
    await agent.get('/api/users').expect(200);
  });

  it('adds a user to an organisation that already exists, without creating another', async () => {
    const organisation = await buildOrganisation({ name: organisationName() });
    const email = uniqueEmail('lead');
    const result = await create(['--email', email, '--name', 'Tomasz Okafor', '--role', 'lead', '--organisation', organisation.name], noTerminal(PASSWORD));
    expect(result.code).toBe(0);
    expect(result.stdout).not.toContain('Created the organisation');
    expect((await User.findOne({ where: { email } }))!.organisationId).toBe(organisation.id);
    expect(await Organisation.count({ where: { name: organisation.name } })).toBe(1);
  });

  it('asks for the password twice on a terminal, without echoing it', async () => {
    const stdin = Object.assign(new PassThrough(), { isTTY: true });
    let shown = '';
    const prompt = new Writable({
      write(chunk, _encoding, callback) {
        shown += String(chunk);
        // Types each answer once its prompt is on the screen, as a person would.
        if (shown.endsWith('Password: ') || shown.endsWith('Repeat the password: ')) setImmediate(() => stdin.write(`${PASSWORD}\r`));
        callback();
      },
    });
    const email = uniqueEmail('engineer');
    const result = await create(['--email', email, '--name', 'Priya Lindqvist', '--role', 'engineer', '--organisation', organisationName()], { env: {}, stdin, prompt });
    expect(result.code).toBe(0);
    expect(shown).toContain('Password: ');
    expect(shown).toContain('Repeat the password: ');
    expect(shown).not.toContain(PASSWORD);
    const user = (await User.findOne({ where: { email } }))!;
    await signedInAgent(createApp(), user, PASSWORD);
  });

  describe('edge cases', () => {
    it('refuses an e-mail that already has an account, with exit code 1 and no change', async () => {
      const existing = await buildUser({ role: 'viewer' });
      const result = await create(['--email', existing.email, '--name', 'Someone Else', '--role', 'admin', '--organisation', organisationName()], noTerminal(PASSWORD));
      expect(result.code).toBe(1);
      expect(result.stderr).toBe('error: Someone with this e-mail address already has an account.\n');
      const stored = (await User.findOne({ where: { email: existing.email } }))!;
      expect(stored.role).toBe('viewer');
      expect(stored.name).toBe(existing.name);
    });

    it('refuses a weak password with the rule it broke, and creates nothing', async () => {
      const email = uniqueEmail('weak');
      const result = await create(['--email', email, '--name', 'Weak Password', '--role', 'viewer', '--organisation', organisationName()], noTerminal('short-one'));
      expect(result.code).toBe(1);
      expect(result.stderr).toBe('error: password: A password has at least 10 characters.\n');
      expect(await User.count({ where: { email } })).toBe(0);
    });

    it('refuses an unknown role, naming the option', async () => {
      const email = uniqueEmail('role');
      const result = await create(['--email', email, '--name', 'No Role', '--role', 'superuser', '--organisation', organisationName()], noTerminal(PASSWORD));
      expect(result.code).toBe(1);
      expect(result.stderr).toMatch(/^error: --role: .*"admin"\|"lead"\|"engineer"\|"viewer"/);
      expect(await User.count({ where: { email } })).toBe(0);
    });

    it('refuses a malformed e-mail, naming the option', async () => {
      const result = await create(['--email', 'not-an-address', '--name', 'X', '--role', 'viewer'], noTerminal(PASSWORD));
      expect(result.code).toBe(1);
      expect(result.stderr).toBe('error: --email: Enter a valid e-mail address.\n');
    });

    it('requires --organisation when there are several organisations', async () => {
      // The shared test database holds many; these two make "several" certain.
      await buildOrganisation();
      await buildOrganisation();
      const email = uniqueEmail('ambiguous');
      const result = await create(['--email', email, '--name', 'Which One', '--role', 'admin'], noTerminal(PASSWORD));
      expect(result.code).toBe(1);
      expect(result.stderr).toBe('error: There are several organisations: name one with --organisation NAME.\n');
      expect(await User.count({ where: { email } })).toBe(0);
    });

    it('refuses to run without a terminal when DOUBLET_PASSWORD is not set', async () => {
      const email = uniqueEmail('no-tty');
      const result = await create(['--email', email, '--name', 'No Terminal', '--role', 'admin', '--organisation', organisationName()], noTerminal());
      expect(result.code).toBe(1);
      expect(result.stderr).toBe(
        'error: no terminal to ask for the password on: set DOUBLET_PASSWORD in the environment, or run the command in a terminal\n',
      );
      expect(await User.count({ where: { email } })).toBe(0);
    });

    it('exits 2 with the usage when a required option is missing', async () => {
      const result = await create(['--email', uniqueEmail('usage'), '--role', 'admin'], noTerminal(PASSWORD));
      expect(result.code).toBe(2);
      expect(result.stderr).toMatch(/^error: --name is required\nusage: doublet user:create/);
    });
  });
});
