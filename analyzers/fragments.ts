import { createHash } from 'node:crypto';
import { shingleSet } from './shingles';
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
 * Attaches tokens, identities and shingle sets to spans. A span takes every token that lies
 * inside it, nested functions included (see the analyzers' README note on nesting); spans with
 * fewer than `minTokens` tokens are dropped. Fragments come out in source order (outer first
 * when two start together).
 */
export function buildFragments(
  text: string,
  tokens: TokenStream,
  spans: readonly FragmentSpan[],
  options: ResolvedOptions,
): Fragment[] {
  const lines = new LineIndex(text);
  const sorted = [...spans].sort((a, b) => a.start - b.start || b.end - a.end);
  const fragments: Fragment[] = [];
  for (const span of sorted) {
    const from = lowerBound(tokens.starts, span.start);
    const to = lowerBound(tokens.starts, span.end);
    const count = to - from;
    if (count === 0 || count < options.minTokens) continue;
    const raw: string[] = new Array(count);
    const normal: string[] = new Array(count);
    for (let i = 0; i < count; i++) {
      const t = tokens.texts[from + i]!;
      const cls = tokens.classes[from + i]!;
      raw[i] = tokenForm(t, cls, false);
      normal[i] = tokenForm(t, cls, true);
    }
    // The span may end after its last token (whitespace cannot, but a dropped comment can);
    // the reported range still covers the whole construct as the parser saw it.
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
      rawHash: sha1(raw),
      normalizedHash: sha1(normal),
      shingles: shingleSet(options.normalize ? normal : raw, options.shingleSize),
    });
  }
  return fragments;
}
