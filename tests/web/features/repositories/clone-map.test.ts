import { describe, expect, it } from 'vitest';
import type { CloneMapNodeDTO } from '@shared/api/repositories';
import { cloneMapAreas, flattenAreas, SHARE_STEPS, shareStep } from '@/features/repositories/lib/clone-map';

const file = (path: string, tokens: number, clonedTokens: number): CloneMapNodeDTO => ({ name: path.split('/').pop()!, path, tokens, clonedTokens });

describe('the clone map areas', () => {
  const root: CloneMapNodeDTO = {
    name: '',
    path: '',
    tokens: 100,
    clonedTokens: 40,
    children: [
      {
        name: 'billing',
        path: 'billing/',
        tokens: 70,
        clonedTokens: 40,
        children: [
          { name: 'rules', path: 'billing/rules/', tokens: 50, clonedTokens: 40, children: [file('billing/rules/a.js', 50, 40)] },
          file('billing/tariff.js', 20, 0),
        ],
      },
      { name: 'yard', path: 'yard/', tokens: 20, clonedTokens: 0, children: [file('yard/shunt.js', 20, 0)] },
      file('index.js', 10, 0),
    ],
  };

  it('makes every rectangle a directory: sub-directories nest, files directly in one become one area of it', () => {
    const areas = cloneMapAreas(root);
    expect(flattenAreas(areas).map((a) => [a.depth, a.name, a.directory, a.tokens, a.share])).toEqual([
      [0, 'billing/', 'billing/', 70, 40 / 70],
      [1, 'billing/rules/', 'billing/rules/', 50, 0.8],
      [1, 'billing/ files', 'billing/', 20, 0],
      [0, 'yard/', 'yard/', 20, 0],
      [0, 'top-level files', '', 10, 0],
    ]);
    // a directory with files only is a single rectangle, not a rectangle holding one
    expect(areas[1].children).toBeUndefined();
  });

  it('shades by steps of the share: nothing cloned apart from a little, half or more the darkest', () => {
    expect(shareStep(0).label).toBe('none');
    expect(shareStep(0.001).label).toBe('under 5 %');
    expect(shareStep(0.05).label).toBe('5–15 %');
    expect(shareStep(0.5).label).toBe('50 % or more');
    expect(shareStep(1)).toBe(SHARE_STEPS[SHARE_STEPS.length - 1]);
  });
});
