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
      at += forms[i]!.length + 1;
    }
    offsets[hi - lo] = at;
    this.offsets = offsets;
  }

  /** SHA-1 (hex) of the forms [from, to) (inside [lo, hi)) joined with NUL: `forms.slice(from, to).join('\0')`. */
  sha1(from: number, to: number): string {
    const text = from >= to ? '' : this.joined.slice(this.offsets[from - this.lo]!, this.offsets[to - this.lo]! - 1);
    return createHash('sha1').update(text).digest('hex');
  }
}

/**
 * The repeat numbers 2..max in the string order of their decimal spelling, the order in which
 * `s#n` sort: a preorder walk of the digit tree, linear in max.
 *
 * @example repeatsInStringOrder(12) // [10, 11, 12, 2, 3, 4, 5, 6, 7, 8, 9]
 */
function repeatsInStringOrder(max: number): number[] {
  const out: number[] = [];
  const visit = (n: number): void => {
    if (n >= 2) out.push(n);
    for (let digit = 0; digit <= 9 && n * 10 + digit <= max; digit++) visit(n * 10 + digit);
  };
  for (let first = 1; first <= 9 && first <= max; first++) visit(first);
  return out;
}

/**
 * Per-file shingle machinery for the windows of k tokens inside [lo, hi). Each token form gets a
 * small integer id, each window a numeric key (exact while vocabulary^k stays below 2^53) and a
 * dense window id. A fragment's n-th repeat of a window is the string `shingle#n`, and n can be no
 * larger than the window's count in [lo, hi); so every string any fragment can produce is known
 * up front: one per window position. They are built and sorted once per file, and a fragment's
 * set is its windows' ranks, sorted as integers, mapped back to the shared strings. This keeps
 * the default string order of shingleSet while nested fragments share all the string work.
 */
class WindowTable {
  /** Dense window id per window position (index i - lo), or undefined when keys would be inexact. */
  private readonly windowIds: Int32Array | undefined;
  /** Start of each dense id's block in the rank table; block entry n - 1 is the n-th repeat. */
  private readonly blocks: Int32Array = new Int32Array(0);
  /** Rank (position in `sorted`) of each (dense id, repeat). */
  private readonly ranks: Int32Array = new Int32Array(0);
  /** Every shingle string of [lo, hi), in the default string order. */
  private readonly sorted: string[] = [];
  /** Per dense id: repeats seen so far in the fragment being built; all zero between calls. */
  private readonly seen: Int32Array = new Int32Array(0);

  constructor(
    private readonly forms: readonly string[],
    private readonly k: number,
    private readonly lo: number,
    hi: number,
  ) {
    const windows = hi - lo - k + 1;
    if (windows <= 0) {
      this.windowIds = undefined;
      return;
    }
    const vocabulary = new Map<string, number>();
    const ids = new Int32Array(hi - lo);
    for (let i = lo; i < hi; i++) {
      let id = vocabulary.get(forms[i]!);
      if (id === undefined) {
        id = vocabulary.size;
        vocabulary.set(forms[i]!, id);
      }
      ids[i - lo] = id;
    }
    const base = vocabulary.size + 1;
    if (!(Math.pow(base, k) < Number.MAX_SAFE_INTEGER)) {
      this.windowIds = undefined;
      return;
    }
    const dense = new Map<number, number>();
    const windowIds = new Int32Array(windows);
    const firstAt: number[] = [];
    const counts: number[] = [];
    for (let w = 0; w < windows; w++) {
      let key = 0;
      for (let j = 0; j < k; j++) key = key * base + ids[w + j]! + 1;
      let d = dense.get(key);
      if (d === undefined) {
        d = firstAt.length;
        dense.set(key, d);
        firstAt.push(w);
        counts.push(0);
      }
      counts[d]!++;
      windowIds[w] = d;
    }
    const distinct = firstAt.length;
    const blocks = new Int32Array(distinct);
    const strings: string[] = new Array(windows);
    const bases: string[] = new Array(distinct);
    let at = 0;
    for (let d = 0; d < distinct; d++) {
      blocks[d] = at;
      const w = lo + firstAt[d]!;
      let text = forms[w]!;
      for (let j = 1; j < k; j++) text += SHINGLE_SEPARATOR + forms[w + j]!;
      bases[d] = text;
      strings[at++] = text;
      for (let n = 2; n <= counts[d]!; n++) strings[at++] = `${text}#${n}`;
    }
    // All strings are distinct (tokenForm keeps `#n` and the separator out of tokens), so no
    // comparator below ever sees a tie and the order is exactly the default sort's.
    const ranks = new Int32Array(windows);
    const sorted: string[] = new Array(windows);
    const baseOrder = Array.from({ length: distinct }, (_, d) => d);
    baseOrder.sort((a, b) => (bases[a]! < bases[b]! ? -1 : 1));
    // Every string with prefix p sorts in one interval. So the sorted shingles fall into groups:
    // a shingle p and the shingles after it that start with p (rare: it takes a last token that
    // extends another, like `=` and `==`). A group's shingles and their repeats `s#n` fill one
    // interval of the order, and the groups keep the order of their first shingles. A group of
    // one is just `s`, then its repeats in the string order of n ("#10" < "#2"); a larger group
    // is sorted as strings. `s#n` never lands in another group: it would need `s` to end in `#`
    // and digits, which tokenForm escapes.
    let r = 0;
    const place = (u: number) => {
      ranks[u] = r;
      sorted[r++] = strings[u]!;
    };
    for (let g = 0; g < distinct; ) {
      const top = bases[baseOrder[g]!]!;
      let end = g + 1;
      while (end < distinct && bases[baseOrder[end]!]!.startsWith(top)) end++;
      if (end === g + 1) {
        const d = baseOrder[g]!;
        const block = blocks[d]!;
        const count = counts[d]!;
        place(block);
        const repeats = count <= 9 ? undefined : repeatsInStringOrder(count);
        for (let i = 0; i < count - 1; i++) place(block + (repeats ? repeats[i]! : i + 2) - 1);
      } else {
        const members: number[] = [];
        for (let i = g; i < end; i++) {
          const d = baseOrder[i]!;
          for (let n = 0; n < counts[d]!; n++) members.push(blocks[d]! + n);
        }
        members.sort((a, b) => (strings[a]! < strings[b]! ? -1 : 1));
        for (const u of members) place(u);
      }
      g = end;
    }
    this.windowIds = windowIds;
    this.blocks = blocks;
    this.ranks = ranks;
    this.sorted = sorted;
    this.seen = new Int32Array(distinct);
  }

  /** The shingle set of the tokens [from, to) (inside [lo, hi)), exactly as shingleSet computes it. */
  shingles(from: number, to: number): string[] {
    const k = this.k;
    const windowIds = this.windowIds;
    if (!windowIds || to - from < k) return shingleSet(this.forms.slice(from, to), k);
    const { blocks, ranks, sorted, seen } = this;
    const first = from - this.lo;
    const count = to - from - k + 1;
    const picked = new Int32Array(count);
    for (let w = 0; w < count; w++) {
      const d = windowIds[first + w]!;
      picked[w] = ranks[blocks[d]! + seen[d]!]!;
      seen[d]!++;
    }
    for (let w = 0; w < count; w++) seen[windowIds[first + w]!] = 0;
    picked.sort();
    const out: string[] = new Array(count);
    for (let i = 0; i < count; i++) out[i] = sorted[picked[i]!]!;
    return out;
  }
}

/**
 * Attaches tokens, identities and shingle sets to spans. A span takes every token that lies
 * inside it, nested functions included (see languages/babel.ts on nesting), and records them as
 * the index range [tokenStart, tokenEnd) of `tokens`; spans with fewer than `minTokens` tokens
 * are dropped (the others keep their indexes into the whole stream). Fragments come out in source order (outer first when two
 * start together).
 */
export function buildFragments(
  text: string,
  tokens: TokenStream,
  spans: readonly FragmentSpan[],
  options: ResolvedOptions,
): Fragment[] {
  const sorted = [...spans].sort((a, b) => a.start - b.start || b.end - a.end);
  // Token ranges first: forms, hashes and windows only need to cover the fragments that are kept.
  const kept: Array<{ span: FragmentSpan; from: number; to: number }> = [];
  let lo = tokens.texts.length;
  let hi = 0;
  for (const span of sorted) {
    const from = lowerBound(tokens.starts, span.start);
    const to = lowerBound(tokens.starts, span.end);
    const count = to - from;
    if (count === 0 || count < options.minTokens) continue;
    kept.push({ span, from, to });
    if (from < lo) lo = from;
    if (to > hi) hi = to;
  }
  if (kept.length === 0) return [];
  const lines = new LineIndex(text);
  // Indexed by token position; only [lo, hi) is filled.
  const raw: string[] = new Array(hi);
  const normal: string[] = new Array(hi);
  for (let i = lo; i < hi; i++) {
    const cls = tokens.classes[i]!;
    raw[i] = tokenForm(tokens.texts[i]!, cls, false);
    // tokenForm(text, 'other', true) is the raw form; only identifiers and literals change.
    normal[i] = cls === 'other' ? raw[i]! : tokenForm(tokens.texts[i]!, cls, true);
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
