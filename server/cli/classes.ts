import type { CommandIo } from './command';

/** Placeholder until the report writers land; replaced in the next commit. */
export async function run(_args: string[], io?: CommandIo): Promise<number> {
  io?.err('not yet\n');
  return 1;
}
