import { analyzeFile, analyzeSnippet } from './analyze';
import { AnalysisLimitError } from './limits';
import { resolveOptions } from './fragments';
import { LANGUAGES } from './languages';
import type { SnippetOutcome } from './snippet-pool';
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

/** A pasted snippet for find copies, sent to a pool thread (see snippet-pool.ts). */
export interface SnippetTask {
  snippet: { language: string; text: string; options: AnalyzeOptions };
}

/**
 * What a pool thread runs for a snippet: analyzeSnippet, with every refusal turned into an
 * outcome (plain data: an error's class does not survive the trip back from the thread).
 */
export async function runSnippetTask({ snippet }: SnippetTask): Promise<SnippetOutcome> {
  try {
    return { ok: true, fragments: await analyzeSnippet(snippet.language, snippet.text, snippet.options) };
  } catch (error) {
    if (error instanceof AnalysisLimitError) return { ok: false, refusal: 'limit', limit: error.limit, message: error.message };
    return { ok: false, refusal: 'invalid', message: error instanceof Error ? error.message : String(error) };
  }
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
