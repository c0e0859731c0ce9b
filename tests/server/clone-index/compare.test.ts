import { describe, expect, it } from 'vitest';
import { compareClasses, fragmentKey, occurrences, type FragmentIdentity } from '../../../server/clone-index/compare';

const m = (path: string, name: string, rawHash: string, occurrence = 0): FragmentIdentity => ({ path, name, occurrence, rawHash });

function fragmentsOf(classes: FragmentIdentity[][], extra: FragmentIdentity[] = []) {
  return new Map([...classes.flat(), ...extra].map((x) => [fragmentKey(x), x.rawHash]));
}

describe('compareClasses', () => {
  const before = [[m('a.ts', 'f', 'h1'), m('b.ts', 'g', 'h2')]];

  it('calls a class with no member in a previous class new', () => {
    const result = compareClasses([[m('c.ts', 'x', 'h9'), m('d.ts', 'y', 'h9')]], before, fragmentsOf(before));
    expect(result.classes[0].status).toBe('new');
    expect(result.gone).toEqual([0]);
  });

  it('calls an untouched class unchanged', () => {
    const result = compareClasses(before, before, fragmentsOf(before));
    expect(result.classes[0]).toEqual({ status: 'unchanged', previous: 0, changed: [false, false] });
    expect(result.gone).toEqual([]);
  });

  it('calls a class drifted when one member changed and another did not', () => {
    const now = [[m('a.ts', 'f', 'h1-fixed'), m('b.ts', 'g', 'h2')]];
    expect(compareClasses(now, before, fragmentsOf(before)).classes[0]).toEqual({ status: 'drifted', previous: 0, changed: [true, false] });
  });

  it('calls a class edited when every member changed, grown and shrunk by member count', () => {
    const edited = [[m('a.ts', 'f', 'x1'), m('b.ts', 'g', 'x2')]];
    expect(compareClasses(edited, before, fragmentsOf(before)).classes[0].status).toBe('edited');
    const grown = [[m('a.ts', 'f', 'h1'), m('b.ts', 'g', 'h2'), m('c.ts', 'h', 'h3')]];
    expect(compareClasses(grown, before, fragmentsOf(before)).classes[0].status).toBe('grown');
    const three = [[m('a.ts', 'f', 'h1'), m('b.ts', 'g', 'h2'), m('c.ts', 'h', 'h3')]];
    expect(compareClasses(before, three, fragmentsOf(three)).classes[0].status).toBe('shrunk');
  });

  it('tells a member that was in no class before but existed whether it changed', () => {
    const loose = m('c.ts', 'h', 'h3');
    const now = [[m('a.ts', 'f', 'h1'), m('b.ts', 'g', 'h2'), m('c.ts', 'h', 'h3-edited')]];
    const result = compareClasses(now, before, fragmentsOf(before, [loose]));
    expect(result.classes[0]).toEqual({ status: 'drifted', previous: 0, changed: [false, false, true] });
  });

  describe('edge cases', () => {
    it('counts a previous class merged into a larger one as gone', () => {
      const two = [[m('a.ts', 'f', 'h1'), m('b.ts', 'g', 'h2'), m('e.ts', 'e', 'h5')], [m('c.ts', 'x', 'h3'), m('d.ts', 'y', 'h4')]];
      const merged = [[...two[0], ...two[1]]];
      const result = compareClasses(merged, two, fragmentsOf(two));
      expect(result.classes[0].previous).toBe(0);
      expect(result.gone).toEqual([1]);
    });

    it('numbers same-named fragments within a file', () => {
      expect(occurrences([{ path: 'a', name: 'f' }, { path: 'a', name: 'f' }, { path: 'b', name: 'f' }])).toEqual([0, 1, 0]);
    });

    it('handles no classes on either side', () => {
      expect(compareClasses([], [], new Map())).toEqual({ classes: [], gone: [] });
    });
  });
});
