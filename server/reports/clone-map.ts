/** One directory or file of the clone map, with its tokens and cloned tokens (a directory: its files' sums). */
export interface CloneMapNode {
  name: string;
  /** a directory's path ends with "/"; the root's is "" */
  path: string;
  tokens: number;
  clonedTokens: number;
  children?: CloneMapNode[];
}

/**
 * The directory tree of a snapshot's files, each node sized by its tokens. A tree of more than
 * `maxNodes` nodes loses its deepest level until it fits (a directory then stands for everything
 * under it; a level that alone is too wide keeps its largest nodes), so a large repository still gives
 * a readable, bounded map; `depth` says how deep it goes.
 *
 * @example buildCloneMap([{ path: 'a/x.js', tokens: 10, clonedTokens: 4 }], 100).root.children[0]
 * // { name: 'a', path: 'a/', tokens: 10, clonedTokens: 4, children: [{ name: 'x.js', path: 'a/x.js', … }] }
 */
export function buildCloneMap(files: readonly { path: string; tokens: number; clonedTokens: number }[], maxNodes: number): { root: CloneMapNode; depth: number; complete: boolean } {
  const root: CloneMapNode = { name: '', path: '', tokens: 0, clonedTokens: 0, children: [] };
  for (const file of files) {
    const parts = file.path.split('/').filter((p) => p !== '');
    let node = root;
    node.tokens += file.tokens;
    node.clonedTokens += file.clonedTokens;
    parts.forEach((part, i) => {
      const leaf = i === parts.length - 1;
      const path = parts.slice(0, i + 1).join('/') + (leaf ? '' : '/');
      let child = node.children!.find((c) => c.path === path);
      if (!child) {
        child = { name: part, path, tokens: 0, clonedTokens: 0, ...(leaf ? {} : { children: [] }) };
        node.children!.push(child);
      }
      child.tokens += file.tokens;
      child.clonedTokens += file.clonedTokens;
      node = child;
    });
  }
  const levels: number[] = [];
  const count = (node: CloneMapNode, depth: number) => {
    for (const child of node.children ?? []) {
      levels[depth] = (levels[depth] ?? 0) + 1;
      count(child, depth + 1);
    }
  };
  count(root, 0);
  let depth = levels.length;
  let total = levels.reduce((sum, n) => sum + n, 0);
  while (depth > 1 && total > maxNodes) {
    depth--;
    total -= levels[depth];
  }
  const prune = (node: CloneMapNode, level: number): CloneMapNode => {
    const { children, ...rest } = node;
    if (!children || level >= depth) return rest;
    return { ...rest, children: children.sort((a, b) => b.tokens - a.tokens || a.path.localeCompare(b.path)).slice(0, maxNodes).map((c) => prune(c, level + 1)) };
  };
  return { root: prune(root, 0), depth, complete: depth === levels.length && total <= maxNodes };
}
