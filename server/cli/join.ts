import { readFile } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import { DEFAULT_REPOSITORY_SETTINGS } from '../../shared/constants';
import { JOIN_METHODS, jaccard, newJoinStats, selfJoin, type JoinMethod } from '../matching/join';
import { rankFlatIntegerSets } from '../matching/order';
import { parseSetBytes, SetSyntaxError, type FlatSets } from '../matching/set-bytes';
import { parseThreshold, type Threshold } from '../matching/threshold';
import { elapsed, guarded, InputError, processIo, UsageError, type CommandIo } from './command';

const USAGE = `usage: doublet join --input FILE [--threshold T] [--method ${JOIN_METHODS.join('|')}]

FILE holds one set per line: space-separated non-negative integers (a repeat counts once).
Prints every pair with Jaccard similarity ≥ T (default ${DEFAULT_REPOSITORY_SETTINGS.threshold}) as "i j similarity", with 0-based
line numbers i < j; counts and times go to stderr. --algorithm is the old name of --method.
`;

/**
 * Parses the join input (see parseSetBytes): one set per line, tokens separated by spaces or tabs.
 * A final newline does not start another set; an empty line is an empty set (it pairs with
 * nothing). The command line reads bytes; this string form is for callers that hold text.
 *
 * @example parseSetLines('3 1 3\n\n7\n', 'sets.txt') // [[3, 1, 3], [], [7]]
 * @throws InputError naming the file, the 1-based line (and the 0-based set number) and the bad token
 */
export function parseSetLines(text: string, source: string): number[][] {
  const { tokens, offsets } = parseInput(Buffer.from(text, 'utf8'), source);
  return Array.from({ length: offsets.length - 1 }, (_, s) => Array.from(tokens.subarray(offsets[s], offsets[s + 1])));
}

/** parseSetBytes with its error named after the input file. */
function parseInput(bytes: Uint8Array, source: string): FlatSets {
  try {
    return parseSetBytes(bytes);
  } catch (error) {
    if (error instanceof SetSyntaxError) throw new InputError(`${source} ${error.message}`);
    throw error;
  }
}

/**
 * A similarity for display: at most six decimals, no trailing zeros (28/35 → "0.8").
 *
 * @example formatSimilarity(5 / 6) // "0.833333"
 */
export function formatSimilarity(value: number): string {
  return String(Number(value.toFixed(6)));
}

function parseMethod(value: string | undefined): JoinMethod {
  if (value === undefined) return 'auto';
  const method = JOIN_METHODS.find((m) => m === value);
  if (!method) throw new UsageError(`--method must be one of ${JOIN_METHODS.join(', ')} (got "${value}")`);
  return method;
}

/** Parses --threshold with threshold.ts, turning its error into a usage error. */
export function thresholdOption(value: string | undefined): Threshold {
  try {
    return parseThreshold(value ?? String(DEFAULT_REPOSITORY_SETTINGS.threshold));
  } catch (error) {
    throw new UsageError(`--threshold: ${(error as Error).message}`);
  }
}

/** `doublet join`: see USAGE. Nothing is printed on stdout unless the whole input is valid. */
export async function run(args: string[], io: CommandIo = processIo()): Promise<number> {
  return guarded(io, USAGE, async () => {
    const { values } = parseArgs({
      args,
      options: {
        input: { type: 'string', short: 'i' },
        threshold: { type: 'string', short: 't' },
        method: { type: 'string', short: 'm' },
        algorithm: { type: 'string', short: 'a' },
        help: { type: 'boolean', short: 'h' },
      },
      strict: true,
      allowPositionals: false,
    });
    if (values.help) {
      io.out(USAGE);
      return 0;
    }
    if (!values.input) throw new UsageError('--input FILE is required');
    const t = thresholdOption(values.threshold);
    const method = parseMethod(values.method ?? values.algorithm);

    let start = performance.now();
    let bytes: Buffer;
    try {
      bytes = await readFile(values.input);
    } catch (error) {
      throw new InputError(`cannot read ${values.input}: ${(error as NodeJS.ErrnoException).code ?? (error as Error).message}`);
    }
    const sets = parseInput(bytes, values.input);
    const count = sets.offsets.length - 1;
    const readMs = elapsed(start);

    start = performance.now();
    const { ranked } = rankFlatIntegerSets(sets);
    const rankMs = elapsed(start);

    start = performance.now();
    const stats = newJoinStats();
    const pairs = selfJoin(ranked, t, { method, stats });
    const joinMs = elapsed(start);

    start = performance.now();
    const CHUNK = 65_536;
    for (let from = 0; from < pairs.length; from += CHUNK) {
      let chunk = '';
      for (let i = from; i < Math.min(from + CHUNK, pairs.length); i++) {
        const { a, b, overlap } = pairs[i];
        chunk += `${a} ${b} ${formatSimilarity(jaccard(overlap, ranked[a].length, ranked[b].length))}\n`;
      }
      io.out(chunk);
    }
    const writeMs = elapsed(start);
    io.err(
      `sets ${count}, method ${method}, threshold ${t.p}/${t.q}: ` +
        `candidates ${stats.candidates}, verified ${stats.verified}, results ${stats.results}\n` +
        `times: read ${readMs} ms, rank ${rankMs} ms, join ${joinMs} ms, write ${writeMs} ms\n`,
    );
    return 0;
  });
}
