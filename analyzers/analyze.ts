import { ANALYSIS_LIMITS } from '../shared/constants';
import { buildFragments, resolveOptions, type FragmentSpan } from './fragments';
import { AnalysisLimitError } from './limits';
import { splitLines } from './lines';
import { analyzerForLanguage, analyzerForPath, extensionOf, LANGUAGES } from './languages';
import type { AnalyzeOptions, FileAnalysis, Fragment } from './types';

/**
 * An error's message without the source: parser messages name a position ("Unexpected token
 * (3:4)"), never the code, and that is all that may leave the analyzer.
 */
function describe(error: unknown): string {
  if (error instanceof RangeError && /call stack/i.test(error.message)) return 'nesting too deep to parse';
  const message = error instanceof Error ? error.message : String(error);
  return message.length > 300 ? `${message.slice(0, 300)}…` : message;
}

/**
 * Cuts one source file into fragments with their token identities and shingle sets.
 * Never throws on bad source: a file that cannot be parsed, or goes over one of the analysis
 * bounds (ANALYSIS_LIMITS: nesting depth, fragments, tokens of nested fragments), comes back with
 * `error` set (naming the bound) and no fragments; a file parsed with recovered syntax errors
 * keeps its fragments and reports `syntaxErrors`. Throws only on invalid options (a caller bug).
 *
 * @example
 * const { fragments } = await analyzeFile('src/cart.ts', text, { shingleSize: 3 });
 * fragments[0]; // { name: 'Cart.total', kind: 'method', startLine: 4, …, shingles: [...] }
 */
export async function analyzeFile(path: string, text: string, options?: AnalyzeOptions): Promise<FileAnalysis> {
  const resolved = resolveOptions(options);
  const language = analyzerForPath(path);
  if (!language) {
    return { path, language: 'unknown', fragments: [], error: noAnalyzerReason(path) };
  }
  try {
    const { tokens, spans, syntaxErrors } = await language.analyze(path, text, resolved);
    const fragments = buildFragments(text, tokens, spans, resolved);
    const result: FileAnalysis = { path, language: language.id, fragments };
    if (syntaxErrors > 0) result.syntaxErrors = syntaxErrors;
    return result;
  } catch (error) {
    return { path, language: language.id, fragments: [], error: describe(error) };
  }
}

/** The skip reason for a file no language claims, e.g. "no analyzer for .xyz". */
export function noAnalyzerReason(path: string): string {
  const ext = extensionOf(path);
  return ext ? `no analyzer for ${ext}` : 'no analyzer for files without an extension';
}

/**
 * The language id for a path, by extension: 'javascript', 'typescript', 'python', 'java', 'go',
 * 'csharp', 'c' or 'cpp' (`.h` counts as C++); undefined when no analyzer claims it.
 *
 * @example languageForPath('lib/ledger.mjs') // 'javascript'
 */
export function languageForPath(path: string): string | undefined {
  return analyzerForPath(path)?.id;
}

/** Removes the indentation every non-blank line shares, so a body pasted from deep inside a file parses. */
function dedent(text: string): string {
  const lines = splitLines(text);
  let common: string | undefined;
  for (const line of lines) {
    if (line.trim() === '') continue;
    const indent = /^[ \t]*/.exec(line)?.[0] ?? '';
    if (common === undefined || !indent.startsWith(common)) {
      let i = 0;
      while (common !== undefined && i < common.length && i < indent.length && common[i] === indent[i]) i++;
      common = common === undefined ? indent : common.slice(0, i);
    }
  }
  if (!common) return text;
  return lines.map((line) => (line.startsWith(common) ? line.slice(common.length) : line.trimStart())).join('\n');
}

/**
 * The fragments of a pasted snippet (for "find copies"). The snippet is dedented and parsed in
 * `language`; when functions make up most of its tokens they are the fragments, otherwise (a
 * pasted body, a few statements) the whole snippet is one fragment named `<snippet>`.
 * `minTokens` defaults to 1 here: whatever the user pasted is searched for.
 * Throws on an unknown language or a snippet the parser cannot read at all, saying which, and an
 * AnalysisLimitError for a snippet over one of the analysis bounds (ANALYSIS_LIMITS, with at most
 * `maxSnippetFragments` fragments).
 *
 * @example await analyzeSnippet('python', 'total = 0\nfor x in xs:\n    total += x') // one '<snippet>' fragment
 */
export async function analyzeSnippet(language: string, text: string, options?: AnalyzeOptions): Promise<Fragment[]> {
  const analyzer = analyzerForLanguage(language);
  if (!analyzer) {
    throw new Error(`unknown language "${language}"; expected one of ${LANGUAGES.map((l) => l.id).join(', ')}`);
  }
  const resolved = resolveOptions({ minTokens: 1, ...options });
  const source = dedent(text);
  const path = `snippet${analyzer.extensions[0]}`;
  let analysis;
  try {
    analysis = await analyzer.analyze(path, source, resolved);
  } catch (error) {
    if (error instanceof AnalysisLimitError) throw error;
    throw new Error(`the snippet could not be parsed as ${language}: ${describe(error)}`);
  }
  const { tokens, spans } = analysis;
  const total = tokens.starts.length;
  const inside = tokensInOutermost(spans, tokens.starts);
  if (spans.length > 0 && inside >= total - inside) {
    return buildFragments(source, tokens, spans, resolved, ANALYSIS_LIMITS.maxSnippetFragments);
  }
  const whole: FragmentSpan = { name: '<snippet>', kind: 'function', start: 0, end: source.length };
  return buildFragments(source, tokens, [whole], resolved, ANALYSIS_LIMITS.maxSnippetFragments);
}

/** How many tokens lie inside at least one span. */
function tokensInOutermost(spans: readonly FragmentSpan[], starts: readonly number[]): number {
  const sorted = [...spans].sort((a, b) => a.start - b.start || b.end - a.end);
  let count = 0;
  let coveredUntil = -1;
  let i = 0;
  for (const span of sorted) {
    if (span.end <= coveredUntil) continue;
    const from = Math.max(span.start, coveredUntil);
    while (i < starts.length && starts[i] < from) i++;
    while (i < starts.length && starts[i] < span.end) {
      count++;
      i++;
    }
    coveredUntil = span.end;
  }
  return count;
}
