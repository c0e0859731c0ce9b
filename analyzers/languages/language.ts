import type { FragmentSpan, ResolvedOptions } from '../fragments';
import type { TokenStream } from '../tokens';

/** What a language analyzer finds in one file: its tokens and its function-level spans. */
export interface LanguageAnalysis {
  tokens: TokenStream;
  spans: FragmentSpan[];
  /** Syntax errors the parser recovered from (the fragments around them are still reported). */
  syntaxErrors: number;
}

/**
 * One supported language. Adding a language is adding one file that exports one of these and
 * listing it in `languages/index.ts`. `analyze` may throw when the source cannot be parsed at all;
 * the caller turns that into an error record.
 */
export interface LanguageAnalyzer {
  /** Language id, e.g. 'python'. */
  id: string;
  /** Lower-case file extensions with the dot, e.g. ['.py']. */
  extensions: readonly string[];
  analyze(path: string, text: string, options: ResolvedOptions): Promise<LanguageAnalysis>;
}
