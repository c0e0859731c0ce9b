import { createHash } from 'node:crypto';
import { ANALYSIS_LIMITS, DEFAULT_REPOSITORY_SETTINGS } from '../shared/constants';
import { checkFragmentWork } from './limits';
import { LineIndex } from './lines';
import { WindowTable } from './shingle-windows';
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
 * Fills in the defaults (shingle size and minimum tokens from DEFAULT_REPOSITORY_SETTINGS,
 * normalization on, annotations ignored) and rejects values that would make every result
 * meaningless, saying which option was wrong.
 *
 * @example resolveOptions({ minTokens: 1 }) // { shingleSize: 3, minTokens: 1, normalize: true, includeTypeAnnotations: false }
 */
export function resolveOptions(options: AnalyzeOptions = {}): ResolvedOptions {
  const resolved: ResolvedOptions = {
    shingleSize: options.shingleSize ?? DEFAULT_REPOSITORY_SETTINGS.shingleSize,
    minTokens: options.minTokens ?? DEFAULT_REPOSITORY_SETTINGS.minTokens,
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
 * A file's token forms joined once with NUL, so the hash input of any token range is one slice of
 * it rather than a join per fragment (nested fragments would otherwise rejoin the same tokens at
 * every level). NUL is unambiguous: tokenForm escapes every control character.
 */
class JoinedForms {
  private readonly joined: string;
  /** offsets[i - lo]: where token i starts in `joined`; offsets[hi - lo] = joined.length + 1. */
  private readonly offsets: Int32Array;

  constructor(
    forms: readonly string[],
    private readonly lo: number,
    hi: number,
  ) {
    this.joined = forms.slice(lo, hi).join('\u0000');
    const offsets = new Int32Array(hi - lo + 1);
    let at = 0;
    for (let i = lo; i < hi; i++) {
      offsets[i - lo] = at;
      at += forms[i].length + 1;
    }
    offsets[hi - lo] = at;
    this.offsets = offsets;
  }

  /** SHA-1 (hex) of the forms [from, to) (inside [lo, hi)) joined with NUL: `forms.slice(from, to).join('\0')`. */
  sha1(from: number, to: number): string {
    const text = from >= to ? '' : this.joined.slice(this.offsets[from - this.lo], this.offsets[to - this.lo] - 1);
    return createHash('sha1').update(text).digest('hex');
  }
}

/**
 * Attaches tokens, identities and shingle sets to spans. A span takes every token that lies
 * inside it, nested functions included (see languages/babel.ts on nesting), and records them as
 * the index range [tokenStart, tokenEnd) of `tokens`; spans with fewer than `minTokens` tokens
 * are dropped (the others keep their indexes into the whole stream). Fragments come out in source
 * order (outer first when two start together).
 * @throws AnalysisLimitError when more than `maxFragments` fragments are kept, or they hold more
 * than ANALYSIS_LIMITS.maxNestedTokenFactor times the file's tokens together
 */
export function buildFragments(
  text: string,
  tokens: TokenStream,
  spans: readonly FragmentSpan[],
  options: ResolvedOptions,
  maxFragments: number = ANALYSIS_LIMITS.maxFragmentsPerFile,
): Fragment[] {
  const sorted = [...spans].sort((a, b) => a.start - b.start || b.end - a.end);
  // Token ranges first: forms, hashes and windows only need to cover the fragments that are kept.
  const kept: Array<{ span: FragmentSpan; from: number; to: number }> = [];
  let lo = tokens.texts.length;
  let hi = 0;
  let keptTokens = 0;
  for (const span of sorted) {
    const from = lowerBound(tokens.starts, span.start);
    const to = lowerBound(tokens.starts, span.end);
    const count = to - from;
    if (count === 0 || count < options.minTokens) continue;
    kept.push({ span, from, to });
    keptTokens += count;
    if (from < lo) lo = from;
    if (to > hi) hi = to;
  }
  if (kept.length === 0) return [];
  // Before any per-fragment work: hashing and shingling cost what the fragments hold together.
  checkFragmentWork(kept.length, keptTokens, tokens.texts.length, maxFragments);
  const lines = new LineIndex(text);
  // Indexed by token position; only [lo, hi) is filled.
  const raw: string[] = new Array(hi);
  const normal: string[] = new Array(hi);
  for (let i = lo; i < hi; i++) {
    const cls = tokens.classes[i];
    raw[i] = tokenForm(tokens.texts[i], cls, false);
    // tokenForm(text, 'other', true) is the raw form; only identifiers and literals change.
    normal[i] = cls === 'other' ? raw[i] : tokenForm(tokens.texts[i], cls, true);
  }
  const windows = new WindowTable(options.normalize ? normal : raw, options.shingleSize, lo, hi);
  const rawJoined = new JoinedForms(raw, lo, hi);
  const normalJoined = new JoinedForms(normal, lo, hi);
  const fragments: Fragment[] = [];
  for (const { span, from, to } of kept) {
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
      tokens: to - from,
      tokenStart: from,
      tokenEnd: to,
      rawHash: rawJoined.sha1(from, to),
      normalizedHash: normalJoined.sha1(from, to),
      shingles: windows.shingles(from, to),
    });
  }
  return fragments;
}
