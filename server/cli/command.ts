/**
 * What every `doublet` subcommand module exports, and the streams it writes to. Commands take
 * their streams as an argument so tests can run them in-process and read what they printed.
 */

/** Where a command writes: results on `out`, counts, progress and errors on `err`. */
export interface CommandIo {
  out(text: string): void;
  err(text: string): void;
  /** Whether `err` is an interactive terminal (progress lines are redrawn in place then). */
  errIsTTY: boolean;
}

/** A subcommand: `run` gets the arguments after its name and resolves to the exit code. */
export interface CommandModule {
  run(args: string[], io?: CommandIo): Promise<number>;
}

/** Bad command line usage (unknown option, missing value): exit code 2 with the message. */
export class UsageError extends Error {}

/** Bad input data (a malformed line, a missing folder): exit code 1 with the message. */
export class InputError extends Error {}

/** The process's own streams. */
export function processIo(): CommandIo {
  return {
    out: (text) => void process.stdout.write(text),
    err: (text) => void process.stderr.write(text),
    errIsTTY: Boolean(process.stderr.isTTY),
  };
}

/**
 * Runs a command body, turning UsageError/InputError into a message on `err` and exit code
 * 2/1; anything else is a bug and is rethrown with its stack.
 */
export async function guarded(io: CommandIo, usage: string, body: () => Promise<number>): Promise<number> {
  try {
    return await body();
  } catch (error) {
    if (error instanceof UsageError) {
      io.err(`error: ${error.message}\n${usage}`);
      return 2;
    }
    if (error instanceof InputError) {
      io.err(`error: ${error.message}\n`);
      return 1;
    }
    // parseArgs reports unknown or malformed options with these codes
    const code = (error as { code?: string }).code;
    if (code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION' || code === 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE' || code === 'ERR_PARSE_ARGS_UNEXPECTED_POSITIONAL') {
      io.err(`error: ${(error as Error).message}\n${usage}`);
      return 2;
    }
    throw error;
  }
}

/** Milliseconds since `start` (from performance.now()), rounded for display. */
export function elapsed(start: number): number {
  return Math.round(performance.now() - start);
}

/**
 * A positive integer option, or undefined when it was not given.
 *
 * @example positiveIntegerOption('50', '--min-tokens') // 50
 * @throws UsageError naming the option when the value is not a positive integer
 */
export function positiveIntegerOption(value: string | undefined, option: string): number | undefined {
  if (value === undefined) return undefined;
  const n = Number(value);
  if (!/^\d+$/.test(value) || !Number.isSafeInteger(n) || n < 1) throw new UsageError(`${option} must be a positive integer (got "${value}")`);
  return n;
}
