import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { cloneClasses, clonedTokens, cloneRatio } from '../../../server/matching/classes';

/** Oracle: components by breadth-first search over an adjacency list. */
function componentsByBfs(count: number, pairs: { a: number; b: number }[]): number[][] {
  const next: number[][] = Array.from({ length: count }, () => []);
  for (const { a, b } of pairs) {
    next[a].push(b);
    next[b].push(a);
  }
  const seen = new Array<boolean>(count).fill(false);
  const out: number[][] = [];
  for (let start = 0; start < count; start++) {
    if (seen[start] || next[start].length === 0) continue;
    const queue = [start];
    seen[start] = true;
    for (let q = 0; q < queue.length; q++) {
      for (const v of next[queue[q]]) {
        if (!seen[v]) {
          seen[v] = true;
          queue.push(v);
        }
      }
    }
    out.push(queue.sort((u, v) => u - v));
  }
  return out;
}

const graph = fc.integer({ min: 0, max: 40 }).chain((count) =>
  fc.tuple(
    fc.constant(count),
    count < 2
      ? fc.constant<{ a: number; b: number }[]>([])
      : fc.array(fc.record({ a: fc.integer({ min: 0, max: count - 1 }), b: fc.integer({ min: 0, max: count - 1 }) }), { maxLength: 40 }),
  ),
);

describe('cloneClasses', () => {
  it('equals the connected components found by breadth-first search, largest first', () => {
    fc.assert(
      fc.property(graph, ([count, pairs]) => {
        const classes = cloneClasses(count, pairs);
        const expected = componentsByBfs(count, pairs).sort((x, y) => y.length - x.length || x[0] - y[0]);
        expect(classes).toEqual(expected);
      }),
    );
  });

  describe('edge cases', () => {
    it('leaves fragments in no pair out, and handles no pairs', () => {
      expect(cloneClasses(3, [])).toEqual([]);
      expect(cloneClasses(4, [{ a: 2, b: 2 }])).toEqual([[2]]);
    });

    it('orders equal-size classes by first member', () => {
      expect(cloneClasses(6, [{ a: 4, b: 5 }, { a: 0, b: 3 }, { a: 1, b: 2 }, { a: 2, b: 5 }])).toEqual([[1, 2, 4, 5], [0, 3]]);
    });

    it('refuses a pair outside the fragments', () => {
      expect(() => cloneClasses(2, [{ a: 0, b: 2 }])).toThrow(/fragment 2, outside 0..1/);
    });
  });
});

describe('cloneRatio', () => {
  /** Fragments side by side in one file, each `size` tokens long. */
  const flat = (...sizes: number[]) => {
    let at = 0;
    return sizes.map((size) => ({ file: 'f', tokenStart: at, tokenEnd: (at += size) }));
  };

  it('counts each cloned fragment once', () => {
    expect(clonedTokens(flat(100, 50, 30, 20), [{ a: 0, b: 2 }, { a: 2, b: 0 }, { a: 0, b: 3 }])).toEqual({ cloned: 150, total: 200 });
    expect(cloneRatio(flat(100, 50, 30, 20), [{ a: 0, b: 2 }, { a: 0, b: 3 }])).toBe(0.75);
  });

  it('counts the tokens of a nested function once, in the total and in the cloned share', () => {
    const spans = [
      { file: 'a.js', tokenStart: 0, tokenEnd: 100 }, // outer function
      { file: 'a.js', tokenStart: 20, tokenEnd: 50 }, // its callback
      { file: 'b.js', tokenStart: 10, tokenEnd: 40 }, // a copy of the callback elsewhere
    ];
    expect(clonedTokens(spans, [{ a: 1, b: 2 }])).toEqual({ cloned: 60, total: 130 });
    expect(clonedTokens(spans, [{ a: 0, b: 2 }])).toEqual({ cloned: 130, total: 130 });
  });

  describe('edge cases', () => {
    it('is 0 with no tokens or no pairs, 1 when all are cloned', () => {
      expect(cloneRatio([], [])).toBe(0);
      expect(cloneRatio(flat(10, 10), [])).toBe(0);
      expect(cloneRatio(flat(10, 10), [{ a: 0, b: 1 }])).toBe(1);
    });

    it('keeps equal ranges of different files apart and merges overlapping ranges of one file', () => {
      const spans = [
        { file: 1, tokenStart: 0, tokenEnd: 10 },
        { file: 2, tokenStart: 0, tokenEnd: 10 },
        { file: 1, tokenStart: 5, tokenEnd: 15 },
      ];
      expect(clonedTokens(spans, [{ a: 0, b: 2 }])).toEqual({ cloned: 15, total: 25 });
    });
  });
});
