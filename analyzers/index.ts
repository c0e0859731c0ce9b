/**
 * The analyzers' public entry: source text → fragments → token streams → shingle sets.
 * Pure functions (the pool only spreads the same pure work over threads): no database, no HTTP,
 * so the command line, the server and the worker all use the same code.
 */
export { analyzeFile, analyzeSnippet, languageForPath } from './analyze';
export { analyzeFiles, AnalyzerPool, DEFAULT_TIMEOUT_MS, type AnalyzeFilesOptions } from './pool';
export { analyzeSnippetInPool, closeSnippetPool, type SnippetOutcome, type SnippetPoolOptions } from './snippet-pool';
export { AnalysisLimitError, type AnalysisLimit } from './limits';
export {
  skipReason,
  directorySkipReason,
  defaultIgnoreReason,
  decodeUtf8,
  DEFAULT_MAX_FILE_BYTES,
  DEFAULT_IGNORED_DIRECTORIES,
  type SkipOptions,
} from './skip';
export { shingleSet, jaccard, SHINGLE_SEPARATOR } from './shingles';
export { LANGUAGES } from './languages';
export type { AnalyzeOptions, FileAnalysis, Fragment, FragmentKind, SkippedFile, SourceFile } from './types';
