import type { Config } from '../config';

/** DOUBLET_DEMO as server/config.ts reads it. */
export type DemoSetting = Config['demo'];

/**
 * What `npm start` does about the demo and the first admin:
 * - `seed`: seed the demo if the database has no organisation at all (a database filled by
 *   `npm run import` keeps its own data and gets the first-admin instructions instead);
 * - `force-seed`: seed the demo even beside other organisations (DOUBLET_DEMO=1);
 * - `first-admin`: seed nothing and print how to create the first admin;
 * - `nothing`: users exist and no demo was asked for.
 * After a seed attempt, start.ts counts the users again and prints the instructions when there
 * are still none.
 *
 * @example
 * firstRunStep(0, 'auto') // 'seed'
 * firstRunStep(0, 'off')  // 'first-admin'
 * firstRunStep(4, 'on')   // 'force-seed'
 */
export function firstRunStep(userCount: number, demo: DemoSetting): 'seed' | 'force-seed' | 'first-admin' | 'nothing' {
  if (demo === 'on') return 'force-seed';
  if (userCount > 0) return 'nothing';
  return demo === 'off' ? 'first-admin' : 'seed';
}

/** The command that creates the first admin, as the README and `npm start` show it. */
export const FIRST_ADMIN_COMMAND = 'npm run user:create -- --email you@example.com --name "Your Name" --role admin --organisation "Your organisation"';

/** What `npm start` prints when the database has no user: nobody could sign in otherwise. */
export function firstAdminLines(): string[] {
  return [
    'No one can sign in yet: the database has no users. Create the first admin in another terminal',
    '(it asks for the password; DOUBLET_PASSWORD=… supplies it in scripts):',
    `  ${FIRST_ADMIN_COMMAND}`,
    'The admin then invites everyone else from the Admin page.',
  ];
}
