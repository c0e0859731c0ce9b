import { readFile } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import { SNIPPET_LANGUAGES } from '../../shared/api/find-copies';
import { DEFAULT_REPOSITORY_SETTINGS } from '../../shared/constants';
import { findCopies } from '../commands/findCopies';
import { disconnect } from '../db';
import { HttpError } from '../errors';
import { guarded, InputError, processIo, UsageError, type CommandIo } from './command';
import { openCliDatabase, resolveOrganisation } from './database';
import { formatSimilarity } from './join';

const USAGE = `usage: doublet find-copies --language L [--threshold T] [--organisation NAME] [--json] FILE

Prints every fragment, in the latest snapshot of each repository, whose similarity to the code in
FILE (a function or a few lines; "-" reads standard input) is at least T (default ${DEFAULT_REPOSITORY_SETTINGS.threshold}).
L is one of ${SNIPPET_LANGUAGES.join(', ')}.
`;

const isSnippetLanguage = (value: string): value is (typeof SNIPPET_LANGUAGES)[number] => (SNIPPET_LANGUAGES as readonly string[]).includes(value);

/** `doublet find-copies`: a snippet → every indexed copy of it. */
export function run(args: string[], io: CommandIo = processIo()): Promise<number> {
  return guarded(io, USAGE, async () => {
    const { values, positionals } = parseArgs({
      args,
      allowPositionals: true,
      options: {
        language: { type: 'string' },
        threshold: { type: 'string' },
        organisation: { type: 'string' },
        json: { type: 'boolean' },
        help: { type: 'boolean' },
      },
    });
    if (values.help) {
      io.out(USAGE);
      return 0;
    }
    if (!values.language) throw new UsageError('--language is required');
    const language = values.language;
    if (!isSnippetLanguage(language)) throw new InputError(`--language must be one of ${SNIPPET_LANGUAGES.join(', ')} (got "${language}")`);
    if (positionals.length !== 1) throw new UsageError('give exactly one snippet file');
    const threshold = values.threshold === undefined ? undefined : Number(values.threshold);
    if (threshold !== undefined && !(threshold > 0 && threshold <= 1)) throw new UsageError('--threshold must be a number in (0, 1]');
    const text = await readFile(positionals[0] === '-' ? '/dev/stdin' : positionals[0], 'utf8').catch(() => {
      throw new InputError(`cannot read ${positionals[0]}`);
    });
    await openCliDatabase();
    try {
      const organisation = await resolveOrganisation(values.organisation);
      const copies = await findCopies({ organisationId: organisation.id, language, text, threshold }).catch((error: unknown) => {
        if (error instanceof HttpError) throw new InputError(error.message);
        throw error;
      });
      if (values.json) {
        io.out(`${JSON.stringify(copies, null, 2)}\n`);
      } else {
        for (const c of copies) {
          io.out(`${formatSimilarity(c.similarity)}  ${c.repositoryName}@${c.snapshotLabel}  ${c.path}:${c.startLine}-${c.endLine}  ${c.name}\n`);
        }
        io.err(`${copies.length} cop${copies.length === 1 ? 'y' : 'ies'} found\n`);
      }
      return 0;
    } finally {
      await disconnect();
    }
  });
}
