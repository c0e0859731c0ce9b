/**
 * The analyzers' public contract: what the command line, the server and the worker get from a
 * source file. Everything here is plain data, so it crosses worker_threads unchanged.
 */

/** What kind of function-level unit a fragment is. */
export type FragmentKind =
  | 'function'
  | 'method'
  | 'constructor'
  | 'arrow'
  | 'getter'
  | 'setter'
  | 'lambda';

/** One function-level unit of code with its identities and its shingle set. */
export interface Fragment {
  /** Qualified where the language has classes: `Class.method`; `<anonymous>` when it has no name. */
  name: string;
  kind: FragmentKind;
  /** 1-based, inclusive. */
  startLine: number;
  startColumn: number;
  endLine: number;
  endColumn: number;
  /** Number of raw tokens (comments and whitespace dropped). */
  tokens: number;
  /**
   * Where the fragment's tokens lie in its file's token stream: the 0-based, end-exclusive index
   * range [tokenStart, tokenEnd) of the stream the fragment's tokens were taken from, so
   * `tokenEnd - tokenStart === tokens`. That stream is the whole file's tokens in source order,
   * comments and whitespace dropped, and (for TypeScript, unless `includeTypeAnnotations`) type
   * annotations dropped too: indexes then count only the tokens that remain. The nested functions
   * a fragment contains lie inside its range; fragments that do not nest do not overlap. Ranges
   * are comparable only between fragments of one file analysed with the same options (a snippet's
   * fragments index the dedented snippet). Use them to count each source token once, e.g. the
   * clone ratio as the union of ranges per file.
   */
  tokenStart: number;
  /** End of the token range, exclusive (see tokenStart). */
  tokenEnd: number;
  /** Hash of the raw token stream: equal for type-1 clones. */
  rawHash: string;
  /** Hash of the normalised token stream: equal for type-2 clones. */
  normalizedHash: string;
  /**
   * The shingle set: each shingle as a string, a repeat numbered `s#2`, `s#3`…, no duplicates,
   * sorted by the default string order. The matching engine maps these to integer ranks.
   */
  shingles: string[];
}

/** Options shared by every analyzer entry point; every field has a default. */
export interface AnalyzeOptions {
  /** Shingle size k. Default 3. */
  shingleSize?: number;
  /** Fragments with fewer raw tokens are dropped. Default 50. */
  minTokens?: number;
  /** Identifiers → one symbol, literals → one symbol per kind. Default true (false: type-1 only). */
  normalize?: boolean;
  /** Whether TypeScript type annotations count as tokens. Default false. */
  includeTypeAnnotations?: boolean;
}

/** The result for one source file. */
export interface FileAnalysis {
  path: string;
  language: string;
  fragments: Fragment[];
  /** Set when the file could not be parsed (or was cut off by the time limit); fragments is then empty. */
  error?: string;
  /**
   * Syntax errors the parser recovered from; absent when there were none. The fragments around
   * them are still reported (a half-written function elsewhere does not hide the good ones).
   */
  syntaxErrors?: number;
}

/** A file that was not analysed, with the reason (default ignore, gitignore rule, size, binary…). */
export interface SkippedFile {
  path: string;
  reason: string;
}

/** A file as read by ingest: path relative to the tree's root, with `/` separators, and raw bytes. */
export interface SourceFile {
  path: string;
  content: Uint8Array;
}
