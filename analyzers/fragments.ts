import { createHash } from 'node:crypto';
import { SHINGLE_SEPARATOR, shingleSet } from './shingles';
import { lowerBound, tokenForm, type TokenStream } from './tokens';
import type { AnalyzeOptions, Fragment, FragmentKind } from './types';

/** A function-level unit found by a language analyzer, before tokens are attached. */
export interface FragmentSpan {
  name: string;
  kind: FragmentKind;
  /** Offsets into the source text (UTF-16 code units), end exclusive. */
  start: number;
  end: number;
}

/** Options with every default filled in. */
export interface ResolvedOptions {
  shingleSize: number;
  minTokens: number;
  normalize: boolean;
  includeTypeAnnotations: boolean;
}

/**
 * Fills in the defaults (k = 3, 50 tokens, normalisation on, annotations ignored) and rejects
 * values that would make every result meaningless, saying which option was wrong.
 */
export function resolveOptions(options: AnalyzeOptions = {}): ResolvedOptions {
  const resolved: ResolvedOptions = {
    shingleSize: options.shingleSize ?? 3,
    minTokens: options.minTokens ?? 50,
    normalize: options.normalize ?? true,
    includeTypeAnnotations: options.includeTypeAnnotations ?? false,
  };
  if (!Number.isInteger(resolved.shingleSize) || resolved.shingleSize < 1) {
    throw new RangeError(`options.shingleSize must be a positive integer, got ${String(options.shingleSize)}`);
  }
  if (!Number.isInteger(resolved.minTokens) || resolved.minTokens < 0) {
    throw new RangeError(`options.minTokens must be a non-negative integer, got ${String(options.minTokens)}`);
  }
  return resolved;
}

/**
 * Maps offsets to 1-based lines and columns. Line breaks are `\n`, `\r\n` and a lone `\r`;
 * columns count UTF-16 code units, like editors that index JavaScript strings.
 */
export class LineIndex {
  private readonly lineStarts: number[] = [0];

  constructor(text: string) {
    for (let i = 0; i < text.length; i++) {
      const c = text.charCodeAt(i);
      if (c === 10) this.lineStarts.push(i + 1);
      else if (c === 13 && text.charCodeAt(i + 1) !== 10) this.lineStarts.push(i + 1);
    }
  }

  /** 1-based line and column of the character at `offset`. */
  position(offset: number): { line: number; column: number } {
    const line = lowerBound(this.lineStarts, offset + 1) - 1;
    return { line: line + 1, column: offset - this.lineStarts[line]! + 1 };
  }
}

function sha1(parts: readonly string[]): string {
  // Parts are joined with NUL: tokenForm escapes every control character, so the join is unambiguous.
  return createHash('sha1').update(parts.join('\u0000')).digest('hex');
}

/**
 * Per-file shingle machinery: each token's form gets a small integer id, each window of k ids a
 * numeric key (exact while vocabulary^k stays below 2^53), and each key its shingle string, built
 * once per file. Nested fragments share the file's windows instead of rebuilding them.
 */
class WindowTable {
  private readonly keys: Float64Array | undefined;
  private readonly strings = new Map<number, string>();

  constructor(
    private readonly forms: readonly string[],
    private readonly k: number,
  ) {
    const vocabulary = new Map<string, number>();
    const ids = new Int32Array(forms.length);
    for (let i = 0; i < forms.length; i++) {
      let id = vocabulary.get(forms[i]!);
      if (id === undefined) {
        id = vocabulary.size;
        vocabulary.set(forms[i]!, id);
      }
      ids[i] = id;
    }
    const base = vocabulary.size + 1;
    if (Math.pow(base, k) < Number.MAX_SAFE_INTEGER && forms.length >= k) {
      const keys = new Float64Array(forms.length - k + 1);
      for (let i = 0; i < keys.length; i++) {
        let key = 0;
        for (let j = 0; j < k; j++) key = key * base + ids[i + j]! + 1;
        keys[i] = key;
      }
      this.keys = keys;
    }
  }

  /** The shingle set of the tokens [from, to), as shingleSet would compute it. */
  shingles(from: number, to: number): string[] {
    const k = this.k;
    if (!this.keys || to - from < k) return shingleSet(this.forms.slice(from, to), k);
    const counts = new Map<number, number>();
    const out: string[] = new Array(to - from - k + 1);
    for (let i = from; i + k <= to; i++) {
      const key = this.keys[i]!;
      let text = this.strings.get(key);
      if (text === undefined) {
        text = this.forms[i]!;
        for (let j = 1; j < k; j++) text += SHINGLE_SEPARATOR + this.forms[i + j]!;
        this.strings.set(key, text);
      }
      const seen = (counts.get(key) ?? 0) + 1;
      counts.set(key, seen);
      out[i - from] = seen === 1 ? text : `${text}#${seen}`;
    }
    return out.sort();
  }
}

/**
 * Attaches tokens, identities and shingle sets to spans. A span takes every token that lies
 * inside it, nested functions included (see languages/babel.ts on nesting); spans with fewer
 * than `minTokens` tokens are dropped. Fragments come out in source order (outer first when two
 * start together).
 */
export function buildFragments(
  text: string,
  tokens: TokenStream,
  spans: readonly FragmentSpan[],
  options: ResolvedOptions,
): Fragment[] {
  const lines = new LineIndex(text);
  const sorted = [...spans].sort((a, b) => a.start - b.start || b.end - a.end);
  const n = tokens.texts.length;
  const raw: string[] = new Array(n);
  const normal: string[] = new Array(n);
  for (let i = 0; i < n; i++) {
    raw[i] = tokenForm(tokens.texts[i]!, tokens.classes[i]!, false);
    normal[i] = tokenForm(tokens.texts[i]!, tokens.classes[i]!, true);
  }
  let windows: WindowTable | undefined;
  const fragments: Fragment[] = [];
  for (const span of sorted) {
    const from = lowerBound(tokens.starts, span.start);
    const to = lowerBound(tokens.starts, span.end);
    const count = to - from;
    if (count === 0 || count < options.minTokens) continue;
    windows ??= new WindowTable(options.normalize ? normal : raw, options.shingleSize);
    // The span may end after its last token (a dropped comment can); the reported range still
    // covers the whole construct as the parser saw it.
    const start = lines.position(span.start);
    const end = lines.position(Math.max(span.start, span.end - 1));
    fragments.push({
      name: span.name,
      kind: span.kind,
      startLine: start.line,
      startColumn: start.column,
      endLine: end.line,
      endColumn: end.column,
      tokens: count,
      rawHash: sha1(raw.slice(from, to)),
      normalizedHash: sha1(normal.slice(from, to)),
      shingles: windows.shingles(from, to),
    });
  }
  return fragments;
}
