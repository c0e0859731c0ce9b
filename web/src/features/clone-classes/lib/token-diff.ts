import { diffArrays } from 'diff';
import type { Token } from './tokenize';

/** How a marked stretch of one copy differs from the other copy. */
export type ChangeKind = 'inserted' | 'removed' | 'changed' | 'renamed';

/** A marked stretch of source text, by character offsets into that copy's code. */
export interface ChangeMark {
  start: number;
  end: number;
  change: ChangeKind;
}

/** The token-level comparison of two copies. */
export interface TokenDiff {
  /** marks on the left copy: removed, changed or renamed */
  left: ChangeMark[];
  /** marks on the right copy: inserted, changed or renamed */
  right: ChangeMark[];
  /** identifier renames found, left name → right name */
  renames: Map<string, string>;
  /** token index pairs (left, right) that correspond, in order: the anchors for aligning lines */
  matched: Array<[number, number]>;
}

type Pairing = (a: Token, b: Token) => boolean;

/** Walks a token diff and calls back with matched index pairs and the unmatched runs. */
function walk(
  a: Token[],
  b: Token[],
  equal: Pairing,
  onRun: (kind: 'common' | 'removed' | 'added', fromA: number, fromB: number, count: number) => void,
): void {
  let i = 0;
  let j = 0;
  for (const part of diffArrays(a, b, { comparator: equal })) {
    const count = part.count ?? part.value.length;
    if (part.added) {
      onRun('added', i, j, count);
      j += count;
    } else if (part.removed) {
      onRun('removed', i, j, count);
      i += count;
    } else {
      onRun('common', i, j, count);
      i += count;
      j += count;
    }
  }
}

/** How often each identifier occurs in a stream. */
function countIdentifiers(tokens: Token[]): Map<string, number> {
  const counts = new Map<string, number>();
  for (const t of tokens) if (t.kind === 'identifier') counts.set(t.text, (counts.get(t.text) ?? 0) + 1);
  return counts;
}

/**
 * Identifier renames: pairs of names that line up one to one. Found by aligning the two streams
 * with every identifier treated as equal to every other; `from → to` is a rename when wherever
 * `from` lines up with a name it is `to`, `to` lines up with no other name, and neither name is
 * found on the other side (the old name is gone, the new one is new). Occurrences in removed or
 * inserted code do not count against a rename: they are marked as part of that change.
 */
function findRenames(a: Token[], b: Token[]): Map<string, string> {
  const pairs = new Map<string, Map<string, number>>();
  const looseEqual: Pairing = (x, y) => (x.kind === 'identifier' && y.kind === 'identifier') || (x.kind === y.kind && x.text === y.text);
  walk(a, b, looseEqual, (kind, i, j, count) => {
    if (kind !== 'common') return;
    for (let k = 0; k < count; k++) {
      const x = a[i + k];
      const y = b[j + k];
      if (x.kind !== 'identifier') continue;
      const targets = pairs.get(x.text) ?? new Map<string, number>();
      targets.set(y.text, (targets.get(y.text) ?? 0) + 1);
      pairs.set(x.text, targets);
    }
  });
  const inLeft = countIdentifiers(a);
  const inRight = countIdentifiers(b);
  const sources = new Map<string, number>();
  for (const targets of pairs.values()) for (const to of targets.keys()) sources.set(to, (sources.get(to) ?? 0) + 1);
  const renames = new Map<string, string>();
  for (const [from, targets] of pairs) {
    if (targets.size !== 1) continue;
    const [to] = targets.keys();
    if (to !== from && sources.get(to) === 1 && !inRight.has(from) && !inLeft.has(to)) renames.set(from, to);
  }
  return renames;
}

/** Adds a mark, merging it into the previous one when it continues the same kind of change. */
function pushMark(marks: ChangeMark[], tokens: Token[], from: number, count: number, change: ChangeKind): void {
  if (count === 0) return;
  const start = tokens[from].start;
  const end = tokens[from + count - 1].end;
  const last = marks[marks.length - 1];
  if (last && last.change === change && last.end <= start && from > 0 && tokens[from - 1].end === last.end) {
    last.end = end;
  } else {
    marks.push({ start, end, change });
  }
}

/**
 * Compares two token streams. Tokens that match keep no mark; an identifier consistently replaced
 * by another (the same new name at every aligned place) is marked `renamed` on both sides; a run
 * removed from the left next to a run inserted on the right is `changed` on both sides; other
 * unmatched runs are `removed` (left) or `inserted` (right).
 *
 * @example diffTokens(tokenize('f(a, 1)'), tokenize('f(b, 2)')) // a/b renamed, 1/2 changed
 */
export function diffTokens(a: Token[], b: Token[]): TokenDiff {
  const renames = findRenames(a, b);
  const strictEqual: Pairing = (x, y) =>
    x.kind === y.kind && (x.text === y.text || (x.kind === 'identifier' && renames.get(x.text) === y.text));
  const runs: Array<{ kind: 'common' | 'removed' | 'added'; i: number; j: number; count: number }> = [];
  walk(a, b, strictEqual, (kind, i, j, count) => runs.push({ kind, i, j, count }));

  const left: ChangeMark[] = [];
  const right: ChangeMark[] = [];
  const matched: Array<[number, number]> = [];
  for (let r = 0; r < runs.length; r++) {
    const run = runs[r];
    if (run.kind === 'common') {
      for (let k = 0; k < run.count; k++) {
        matched.push([run.i + k, run.j + k]);
        if (a[run.i + k].text !== b[run.j + k].text) {
          pushMark(left, a, run.i + k, 1, 'renamed');
          pushMark(right, b, run.j + k, 1, 'renamed');
        }
      }
      continue;
    }
    // jsdiff puts a removal before its neighbouring insertion; together they are one change.
    const next = runs[r + 1];
    if (run.kind === 'removed' && next?.kind === 'added') {
      pushMark(left, a, run.i, run.count, 'changed');
      pushMark(right, b, next.j, next.count, 'changed');
      r++;
    } else if (run.kind === 'removed') {
      pushMark(left, a, run.i, run.count, 'removed');
    } else {
      pushMark(right, b, run.j, run.count, 'inserted');
    }
  }
  return { left, right, renames, matched };
}
