import type { CloneMapNodeDTO } from '@shared/api/repositories';

/** One rectangle of the clone map: a directory, or the files directly in one. */
export interface CloneMapArea {
  /** what the rectangle says */
  name: string;
  /** the directory a click narrows the class list to ("" for the top level) */
  directory: string;
  tokens: number;
  clonedTokens: number;
  share: number;
  children?: CloneMapArea[];
}

const shareOf = (cloned: number, tokens: number) => (tokens === 0 ? 0 : cloned / tokens);

/**
 * The map's rectangles from the directory tree: directories keep their sub-directories, and the
 * files directly in a directory become one rectangle of that directory, so every rectangle stands
 * for a directory a click can narrow the classes to.
 *
 * @example
 * cloneMapAreas({ name: '', path: '', tokens: 30, clonedTokens: 6, children: [
 *   { name: 'a', path: 'a/', tokens: 20, clonedTokens: 6, children: [{ name: 'x.js', path: 'a/x.js', tokens: 20, clonedTokens: 6 }] },
 *   { name: 'top.js', path: 'top.js', tokens: 10, clonedTokens: 0 }] })
 * // [{ name: 'a/', directory: 'a/', tokens: 20, share: 0.3 }, { name: 'top-level files', directory: '', tokens: 10, share: 0 }]
 */
export function cloneMapAreas(root: CloneMapNodeDTO): CloneMapArea[] {
  const areasOf = (node: CloneMapNodeDTO): CloneMapArea[] => {
    const children = node.children ?? [];
    const directories = children.filter((c) => c.path.endsWith('/'));
    const files = children.filter((c) => !c.path.endsWith('/'));
    const areas = directories.map((d) => {
      const inner = areasOf(d);
      const area: CloneMapArea = { name: d.path, directory: d.path, tokens: d.tokens, clonedTokens: d.clonedTokens, share: shareOf(d.clonedTokens, d.tokens) };
      // a directory holding only files (or cut at the map's depth) is one rectangle
      return inner.length > 1 || (inner.length === 1 && inner[0].directory !== d.path) ? { ...area, children: inner } : area;
    });
    const tokens = files.reduce((sum, f) => sum + f.tokens, 0);
    if (tokens > 0) {
      const cloned = files.reduce((sum, f) => sum + f.clonedTokens, 0);
      areas.push({ name: node.path === '' ? 'top-level files' : `${node.path} files`, directory: node.path, tokens, clonedTokens: cloned, share: shareOf(cloned, tokens) });
    }
    return areas.filter((a) => a.tokens > 0);
  };
  return areasOf(root);
}

/** Every rectangle of the map, parents before their children (the text alternative's rows). */
export function flattenAreas(areas: CloneMapArea[], depth = 0): (CloneMapArea & { depth: number })[] {
  return areas.flatMap((a) => [{ ...a, depth }, ...flattenAreas(a.children ?? [], depth + 1)]);
}

/**
 * The clone map's colour scale: six steps of the share of cloned tokens in one hue, from the page's
 * paper (nothing cloned) through pale verdigris to the deep green-black of the app's ink (half or
 * more cloned). The step colours a rectangle's cloned band; `ink` is what a label on it needs to stay
 * readable.
 */
export const SHARE_STEPS = [
  { below: 1e-9, label: 'none', fill: '#eceae3', ink: '#1f2523' },
  { below: 0.05, label: 'under 5 %', fill: '#cfe2d9', ink: '#1f2523' },
  { below: 0.15, label: '5–15 %', fill: '#9fc8b7', ink: '#1f2523' },
  { below: 0.3, label: '15–30 %', fill: '#5f9f89', ink: '#1f2523' },
  { below: 0.5, label: '30–50 %', fill: '#2d6e60', ink: '#ffffff' },
  { below: Infinity, label: '50 % or more', fill: '#163d35', ink: '#ffffff' },
] as const;

/** The ground of every rectangle: the part of its tokens that is not cloned. */
export const UNCLONED_FILL = '#f4f2ec';

/** The step of the scale a share falls in. */
export function shareStep(share: number): (typeof SHARE_STEPS)[number] {
  return SHARE_STEPS.find((s) => share < s.below) ?? SHARE_STEPS[SHARE_STEPS.length - 1];
}
