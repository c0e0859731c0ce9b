/** What a token of source text is, as far as comparing two copies needs to know. */
export type TokenKind = 'identifier' | 'keyword' | 'number' | 'string' | 'comment' | 'punctuation';

/** One token with its place in the source text: `text === code.slice(start, end)`. */
export interface Token {
  kind: TokenKind;
  text: string;
  start: number;
  end: number;
}

// Keywords of the languages Doublet reads. A keyword is never a renamed identifier: `let` becoming
// `const` is a change of meaning, not a new name.
const KEYWORDS = new Set(
  (
    'abstract and as async await break case catch class const continue def default defer del delete do elif else enum ' +
    'export extends false final finally fn for from func function go goto if implements import in instanceof interface ' +
    'is lambda let match module namespace new nil none not null or package pass private protected public raise ' +
    'readonly return select static struct super switch this throw throws true try type typeof undefined var void ' +
    'while with yield None True False self using override virtual sealed internal out ref base'
  ).split(' '),
);

// One alternative per kind, tried in this order at each position. Strings and comments stop at the
// end of the text when unterminated, so a fragment cut mid-literal still tokenizes.
const PATTERN = new RegExp(
  [
    String.raw`(?<ws>\s+)`,
    String.raw`(?<comment>\/\/[^\n]*|\/\*[\s\S]*?(?:\*\/|$)|#[^\n]*)`,
    String.raw`(?<string>"""[\s\S]*?(?:"""|$)|'''[\s\S]*?(?:'''|$)|"(?:\\.|[^"\\\n])*"?|'(?:\\.|[^'\\\n])*'?|\x60(?:\\[\s\S]|[^\x60\\])*\x60?)`,
    String.raw`(?<number>0[xXbBoO][0-9a-fA-F_]+[a-zA-Z]*|(?:\d[\d_]*(?:\.\d[\d_]*)?|\.\d[\d_]*)(?:[eE][+-]?\d+)?[a-zA-Z]*)`,
    String.raw`(?<word>[\p{L}_$][\p{L}\p{N}_$]*)`,
    String.raw`(?<punctuation>>>>=|===|!==|\*\*=|\.\.\.|<<=|>>=|>>>|=>|->|::|\+\+|--|&&|\|\||\?\?|\?\.|\*\*|<<|>>|[=!<>+\-*/%&|^]=|[\s\S])`,
  ].join('|'),
  'gu',
);

/**
 * Splits source text into identifiers, keywords, numbers, strings, comments and punctuation, with
 * offsets; white space is dropped. Language-neutral on purpose: it serves JavaScript, Python, Java,
 * Go, C-family code alike, and only has to be good enough to line two copies up.
 *
 * @example tokenize('a = 1') // [{ kind: 'identifier', text: 'a', … }, { kind: 'punctuation', text: '=' }, { kind: 'number', text: '1' }]
 */
export function tokenize(code: string): Token[] {
  const tokens: Token[] = [];
  for (const match of code.matchAll(PATTERN)) {
    const groups = match.groups!;
    if (groups.ws !== undefined) continue;
    const text = match[0];
    const start = match.index;
    const kind: TokenKind =
      groups.comment !== undefined
        ? 'comment'
        : groups.string !== undefined
          ? 'string'
          : groups.number !== undefined
            ? 'number'
            : groups.word !== undefined
              ? KEYWORDS.has(text)
                ? 'keyword'
                : 'identifier'
              : 'punctuation';
    tokens.push({ kind, text, start, end: start + text.length });
  }
  return tokens;
}
