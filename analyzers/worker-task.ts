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

/** Loads every language's parser (grammars included) so the first real file is not charged for it. */
export async function warmUp(): Promise<null> {
  await Promise.all(LANGUAGES.map((language) => language.analyze(`warm${language.extensions[0]}`, '', resolveOptions())));
  return null;
}
