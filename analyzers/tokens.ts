/**
 * Token streams: what every language analyzer produces for a whole file before it is cut into
 * fragments. Tokens are kept in source order as parallel arrays, so a fragment is a contiguous
 * index range found by binary search on the start offsets.
 */

/** A token's class: everything that is not an identifier or a literal is kept verbatim. */
export type TokenClass = 'other' | 'identifier' | 'string' | 'number' | 'boolean' | 'regexp' | 'char';

/**
 * The symbol a normalised token takes, per class. They start with `$` followed by a word, which no
 * keyword or punctuation token of a supported language spells (identifiers, the only tokens that
 * could, are normalised themselves).
 */
export const NORMALIZED_SYMBOL: Readonly<Record<Exclude<TokenClass, 'other'>, string>> = {
  identifier: '$id',
  string: '$str',
  number: '$num',
  boolean: '$bool',
  regexp: '$re',
  char: '$chr',
};

/** A file's tokens in source order (comments and whitespace already dropped). */
export interface TokenStream {
  /** Start offsets (UTF-16 code units into the source text), ascending. */
  starts: number[];
  /** End offsets, exclusive. */
  ends: number[];
  /** Token text as written. */
  texts: string[];
  classes: TokenClass[];
}

/** An empty stream to push tokens into. */
export function emptyTokenStream(): TokenStream {
  return { starts: [], ends: [], texts: [], classes: [] };
}

/**
 * Appends one token. Tokens must arrive in source order; a token out of order is a bug in the
 * analyzer, so it throws rather than producing wrong fragments.
 */
export function pushToken(stream: TokenStream, start: number, end: number, text: string, cls: TokenClass): void {
  const n = stream.starts.length;
  if (n > 0 && start < stream.starts[n - 1]) {
    throw new Error(`token at offset ${start} arrived after a token at offset ${stream.starts[n - 1]}`);
  }
  stream.starts.push(start);
  stream.ends.push(end);
  stream.texts.push(text);
  stream.classes.push(cls);
}

/** First index whose start offset is ≥ `offset` (binary search; `starts` is ascending). */
export function lowerBound(starts: readonly number[], offset: number): number {
  let lo = 0;
  let hi = starts.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (starts[mid] < offset) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * The token form used in shingles and hashes. With `normalize`, identifiers and literals become
 * their class symbol. A raw text that contains a control character, or ends like a repeat marker
 * (`#2`), is escaped behind U+001E so that no two different streams can spell the same shingle
 * (shingles join tokens with U+001F and number repeats with `#n`).
 *
 * @example tokenForm('count', 'identifier', true) // '$id'
 */
export function tokenForm(text: string, cls: TokenClass, normalize: boolean): string {
  if (normalize && cls !== 'other') return NORMALIZED_SYMBOL[cls];
  return NEEDS_ESCAPE.test(text) ? `\u001e${JSON.stringify(text)}` : text;
}

// eslint-disable-next-line no-control-regex -- control characters are exactly what must be escaped
const NEEDS_ESCAPE = /[\u0000-\u001f]|#\d+$/;
