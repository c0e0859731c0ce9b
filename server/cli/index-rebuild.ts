import { parseArgs } from 'node:util';
import { rebuildIndex } from '../clone-index/rebuild';
import { disconnect } from '../db';
import { guarded, processIo, type CommandIo } from './command';
import { openCliDatabase } from './database';

const USAGE = `usage: doublet index-rebuild

Re-ranks every shingle by its current frequency (rarest first) and rewrites the stored sets and
the prefix table in one transaction. Loads wait for it; readers keep the old order until it
commits. Results never change; probes get faster after many loads.
`;

/** `doublet index-rebuild` (npm run index:rebuild). */
export function run(args: string[], io: CommandIo = processIo()): Promise<number> {
  return guarded(io, USAGE, async () => {
    const { values } = parseArgs({ args, options: { help: { type: 'boolean' } } });
    if (values.help) {
      io.out(USAGE);
      return 0;
    }
    await openCliDatabase();
    try {
      const result = await rebuildIndex();
      io.out(`rebuilt: ${result.shingles} shingles, ${result.sets} sets, ${result.prefixEntries} prefix entries in ${result.millis} ms\n`);
      return 0;
    } finally {
      await disconnect();
    }
  });
}
