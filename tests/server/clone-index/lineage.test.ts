import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fragmentKey, type FragmentIdentity } from '../../../server/clone-index/compare';
import { assignLineages, type LineageClass } from '../../../server/clone-index/lineage';

/** A member key as the load builds it: path, name, occurrence (the raw hash is not part of it). */
const key = (path: string, name: string, rawHash = 'h', occurrence = 0) => {
  const fragment: FragmentIdentity = { path, name, occurrence, rawHash };
  return fragmentKey(fragment);
};

describe('assignLineages', () => {
  const rule = [key('billing/tariff.js', 'rate'), key('yard/shunting.js', 'rate')];

  it('keeps the lineage of an unchanged class', () => {
    expect(assignLineages([{ lineageId: 4, members: rule }], [[...rule]])).toEqual([4]);
  });

  it('keeps the lineage when a member is edited (its raw hash changes, its key does not)', () => {
    const edited = [key('billing/tariff.js', 'rate', 'h-fixed'), key('yard/shunting.js', 'rate')];
    expect(assignLineages([{ lineageId: 4, members: rule }], [edited])).toEqual([4]);
  });

  it('keeps the lineage when the class grows or shrinks', () => {
    const three = [...rule, key('billing/quotes.js', 'rate')];
    expect(assignLineages([{ lineageId: 4, members: rule }], [three])).toEqual([4]);
    expect(assignLineages([{ lineageId: 4, members: three }], [rule])).toEqual([4]);
  });

  it('gives a split lineage to the part with most of its members; the smaller part starts a new one', () => {
    const before = [{ lineageId: 9, members: ['a', 'b', 'c', 'd', 'e'] }];
    expect(assignLineages(before, [['d', 'e'], ['a', 'b', 'c']])).toEqual(['new', 9]);
  });

  it('counts only the lineage\'s own members when a split part also holds newcomers', () => {
    // ['d', 'e', 'x', 'y'] is the larger class, but it holds two of the lineage's members, not three
    const before = [{ lineageId: 9, members: ['a', 'b', 'c', 'd', 'e'] }];
    expect(assignLineages(before, [['d', 'e', 'x', 'y'], ['a', 'b', 'c']])).toEqual(['new', 9]);
  });

  it('breaks an even split by class size, then by the smallest member key', () => {
    const before = [{ lineageId: 9, members: ['a', 'b', 'c', 'd'] }];
    expect(assignLineages(before, [['c', 'd', 'z'], ['a', 'b']])).toEqual([9, 'new']);
    expect(assignLineages(before, [['c', 'd'], ['a', 'b']])).toEqual(['new', 9]);
  });

  it('keeps the older lineage when two merge, even when the younger brought more members', () => {
    const before = [
      { lineageId: 12, members: ['x', 'y', 'z'] },
      { lineageId: 3, members: ['a', 'b'] },
    ];
    expect(assignLineages(before, [['a', 'b', 'x', 'y', 'z']])).toEqual([3]);
  });

  it('lets the smaller part of a split continue another lineage it holds members of', () => {
    const before = [
      { lineageId: 1, members: ['a', 'b', 'c'] },
      { lineageId: 2, members: ['p', 'q'] },
    ];
    expect(assignLineages(before, [['a', 'b'], ['c', 'p', 'q']])).toEqual([1, 2]);
  });

  it('ends a lineage whose class is gone and starts one for a class with no predecessor', () => {
    const before = [{ lineageId: 5, members: ['a', 'b'] }];
    expect(assignLineages(before, [['m', 'n']])).toEqual(['new']);
    expect(assignLineages([], [['m', 'n'], ['o', 'p']])).toEqual(['new', 'new']);
  });

  describe('edge cases', () => {
    it('returns nothing for a snapshot without classes', () => {
      expect(assignLineages([{ lineageId: 1, members: ['a'] }], [])).toEqual([]);
    });

    it('counts a key found in two previous classes for the older lineage', () => {
      const before = [
        { lineageId: 8, members: ['a', 'b'] },
        { lineageId: 2, members: ['b', 'c'] },
      ];
      expect(assignLineages(before, [['b']])).toEqual([2]);
    });

    it('tells same-named fragments of one file apart by occurrence', () => {
      const before = [{ lineageId: 6, members: [key('a.js', 'f', 'h', 0), key('b.js', 'f')] }];
      expect(assignLineages(before, [[key('a.js', 'f', 'h', 1), key('c.js', 'f')]])).toEqual(['new']);
    });
  });

  /** Disjoint classes over a small alphabet of keys, each with at least one member. */
  const disjointClasses = (keys: string[]) =>
    fc
      .array(fc.integer({ min: -1, max: 5 }), { minLength: keys.length, maxLength: keys.length })
      .map((slots) => {
        const classes: string[][] = [[], [], [], [], [], []];
        slots.forEach((slot, i) => slot >= 0 && classes[slot].push(keys[i]));
        return classes.filter((c) => c.length > 0);
      });
  const KEYS = 'abcdefghijklmnop'.split('');
  const world = fc
    .record({
      previous: disjointClasses(KEYS),
      current: disjointClasses(KEYS),
      ids: fc.uniqueArray(fc.integer({ min: 1, max: 1000 }), { minLength: 6, maxLength: 6 }),
    })
    .map(({ previous, current, ids }) => ({ previous: previous.map((members, i): LineageClass => ({ lineageId: ids[i], members })), current }));

  it('does not depend on the order of classes or members (property)', () => {
    fc.assert(
      fc.property(world, fc.infiniteStream(fc.double({ min: 0, max: 1, noNaN: true })), ({ previous, current }, noise) => {
        const shuffle = <T>(xs: readonly T[]) => xs.map((x) => [noise.next().value, x] as const).sort((p, q) => p[0] - q[0]).map(([, x]) => x);
        const base = assignLineages(previous, current);
        const order = shuffle(current.map((_, i) => i));
        const shuffled = assignLineages(
          shuffle(previous.map((c) => ({ ...c, members: shuffle(c.members) }))),
          order.map((i) => shuffle(current[i])),
        );
        order.forEach((original, at) => expect(shuffled[at]).toBe(base[original]));
      }),
    );
  });

  it('gives each lineage to at most one class, and only to a class sharing a member with it (property)', () => {
    fc.assert(
      fc.property(world, ({ previous, current }) => {
        const result = assignLineages(previous, current);
        const given = result.filter((r): r is number => r !== 'new');
        expect(new Set(given).size).toBe(given.length);
        result.forEach((r, i) => {
          if (r === 'new') return;
          const members = previous.find((c) => c.lineageId === r)!.members;
          expect(current[i].some((k) => members.includes(k))).toBe(true);
        });
        // a lineage ends only when every class holding its members took an older lineage
        for (const c of previous) {
          if (given.includes(c.lineageId)) continue;
          current.forEach((members, i) => {
            if (members.some((k) => c.members.includes(k))) expect(result[i]).not.toBe('new');
          });
        }
      }),
    );
  });
});
