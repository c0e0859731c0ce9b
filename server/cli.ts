import { processIo, type CommandModule } from './cli/command';

/**
 * The `doublet` command line: `doublet <command> [options]` (or `npm run <command> -- [options]`).
 * Each command lives in its own module under server/cli/ and exports `run(args, io)` resolving
 * to the exit code. Register a command with one line in the table below; modules are imported
 * lazily so one command's dependencies never slow down another.
 */
const commands: Record<string, { describe: string; load: () => Promise<CommandModule> }> = {
  join: { describe: 'exact similarity join of integer sets, one set per line', load: () => import('./cli/join') },
  scan: { describe: 'find clone classes in folders, in memory, and report them', load: () => import('./cli/scan') },
  import: { describe: 'load a local folder as a snapshot of a repository (database)', load: () => import('./cli/import') },
  push: { describe: 'upload a folder to a Doublet server as a snapshot, wait, judge it against the clone budget (CI)', load: () => import('./cli/push') },
  classes: { describe: "print a snapshot's fragments, clone pairs and clone classes (database)", load: () => import('./cli/classes') },
  'find-copies': { describe: 'find every indexed copy of a snippet (database)', load: () => import('./cli/find-copies') },
  'user:create': { describe: 'create a user, and its organisation when needed (database)', load: () => import('./cli/user-create') },
  'index-rebuild': { describe: 're-rank the prefix index by current shingle frequency (database)', load: () => import('./cli/index-rebuild') },
};

function usage(): string {
  const width = Math.max(...Object.keys(commands).map((name) => name.length));
  const lines = Object.entries(commands).map(([name, { describe }]) => `  ${name.padEnd(width)}  ${describe}`);
  return `usage: doublet <command> [options]\n\ncommands:\n${lines.join('\n')}\n\nRun "doublet <command> --help" for a command's options.\n`;
}

async function main(argv: string[]): Promise<number> {
  const [name, ...args] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    process.stdout.write(usage());
    return name === undefined ? 2 : 0;
  }
  const command = Object.hasOwn(commands, name) ? commands[name] : undefined;
  if (!command) {
    process.stderr.write(`error: unknown command "${name}"\n${usage()}`);
    return 2;
  }
  const module = await command.load();
  return module.run(args, processIo());
}

// exitCode instead of process.exit(): large outputs on a pipe are flushed before node exits.
main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (error: unknown) => {
    process.stderr.write(`${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
    process.exitCode = 1;
  },
);
