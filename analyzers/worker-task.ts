import { analyzeFile } from './analyze';
import { resolveOptions } from './fragments';
import { LANGUAGES } from './languages';
import type { AnalyzeOptions, FileAnalysis } from './types';

/** One unit of work sent to a pool thread: a decoded file and the options. */
export interface AnalyzeTask {
  path: string;
  text: string;
  options: AnalyzeOptions;
}

/** What a pool thread runs for each task (see worker.mjs for how the thread loads TypeScript). */
export async function runTask(task: AnalyzeTask): Promise<FileAnalysis> {
  return analyzeFile(task.path, task.text, task.options);
}

/**
 * Loads the parsers (grammars included) of the given languages, so the first real file is not
 * charged for it against its time limit.
 */
export async function warmUp(languages: readonly string[]): Promise<null> {
  const wanted = LANGUAGES.filter((language) => languages.includes(language.id));
  await Promise.all(wanted.map((language) => language.analyze(`warm${language.extensions[0]}`, '', resolveOptions())));
  return null;
}
