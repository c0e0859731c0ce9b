import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { parse, type ParserPlugin } from '@babel/parser';
import { describe, expect, it } from 'vitest';
import { BABEL_CHILD_KEYS } from '../../../analyzers/languages/babel-child-keys';
import { readFixture } from './fixture';

/**
 * The child-key table the JavaScript walk uses, checked two ways: against @babel/types'
 * VISITOR_KEYS (the copy @babel/parser@7.29.15 itself depends on, resolved through it), and on
 * real code, where a walk by the table must reach exactly the nodes a walk over every key does.
 * The real code: @babel/parser's own lib/index.js, express@5.3.0 lib/*.js and zod's src/**.ts,
 * installed under node_modules, plus the invented fixtures.
 */
const require = createRequire(import.meta.url);
const requireFromParser = createRequire(require.resolve('@babel/parser'));
const babelTypes = requireFromParser('@babel/types') as {
  VISITOR_KEYS: Record<string, string[]>;
  FLIPPED_ALIAS_KEYS: Record<string, string[]>;
};

interface Node {
  type: string;
  [key: string]: unknown;
}

// The keys the generic walk in babel.ts skips (positions, comments, parser bookkeeping).
const SKIP = new Set(['loc', 'start', 'end', 'type', 'extra', 'leadingComments', 'trailingComments', 'innerComments', 'range', 'errors', 'tokens', 'comments']);
const isNode = (value: unknown): value is Node => typeof value === 'object' && value !== null && typeof (value as Node).type === 'string';

function children(node: Node, keys: readonly string[]): Node[] {
  const out: Node[] = [];
  for (const key of keys) {
    const value = node[key];
    if (Array.isArray(value)) out.push(...value.filter(isNode));
    else if (isNode(value)) out.push(value);
  }
  return out;
}

/** Nodes reached from the root, by the table or over every key; each node once. */
function reached(root: Node, byTable: boolean): Set<Node> {
  const seen = new Set<Node>();
  const stack = [root];
  while (stack.length > 0) {
    const node = stack.pop()!;
    seen.add(node);
    const keys = byTable ? BABEL_CHILD_KEYS[node.type] : Object.keys(node).filter((k) => !SKIP.has(k));
    if (!keys) throw new Error(`no child keys for ${node.type}`);
    stack.push(...children(node, keys));
  }
  return seen;
}

function walkFiles(dir: string, test: (file: string) => boolean, out: string[] = []): string[] {
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) walkFiles(full, test, out);
    else if (test(full)) out.push(full);
  }
  return out;
}

function parseFile(text: string, typescript: boolean): Node {
  const plugins: ParserPlugin[] = typescript ? ['typescript', 'decorators-legacy'] : ['decorators-legacy', 'jsx'];
  return parse(text, { sourceType: 'module', plugins, errorRecovery: true, allowReturnOutsideFunction: true }) as unknown as Node;
}

const packageRoot = (pkg: string) => path.dirname(require.resolve(`${pkg}/package.json`));

describe('BABEL_CHILD_KEYS', () => {
  it('equals @babel/types VISITOR_KEYS for every non-Flow node type, plus Program.interpreter', () => {
    const flow = new Set(babelTypes.FLIPPED_ALIAS_KEYS.Flow);
    const expected: Record<string, string[]> = {};
    for (const [type, keys] of Object.entries(babelTypes.VISITOR_KEYS)) if (!flow.has(type)) expected[type] = [...keys];
    expected.Program = ['interpreter', ...expected.Program!];
    expect(Object.fromEntries(Object.entries(BABEL_CHILD_KEYS).map(([t, k]) => [t, [...k]]))).toEqual(expected);
  });

  it('reaches every node a walk over all keys reaches, on real JavaScript and TypeScript', () => {
    const files = [
      path.join(packageRoot('@babel/parser'), 'lib/index.js'),
      ...walkFiles(path.join(packageRoot('express'), 'lib'), (f) => f.endsWith('.js')),
      ...walkFiles(path.join(packageRoot('zod'), 'src'), (f) => f.endsWith('.ts') && !f.endsWith('.d.ts')).slice(0, 60),
    ];
    expect(files.length).toBeGreaterThan(40);
    let nodes = 0;
    for (const file of files) {
      const ast = parseFile(fs.readFileSync(file, 'utf8'), file.endsWith('.ts'));
      const all = reached(ast, false);
      const byTable = reached(ast, true);
      expect(byTable.size, file).toBe(all.size);
      for (const node of all) if (!byTable.has(node)) throw new Error(`${file}: ${node.type} not reached`);
      nodes += all.size;
    }
    expect(nodes).toBeGreaterThan(100_000);
  });

  describe('edge cases', () => {
    it('reaches a #! line, which VISITOR_KEYS leaves out', () => {
      const ast = parseFile('#!/usr/bin/env node\nfunction f() {}\n', false);
      const types = [...reached(ast, true)].map((n) => n.type);
      expect(types).toContain('InterpreterDirective');
      expect(reached(ast, true).size).toBe(reached(ast, false).size);
    });

    it('reaches every node of the invented fixtures, TypeScript declarations and JSX included', () => {
      const fixtures: Array<[string, boolean]> = [['shipments.js', false], ['tariffs.ts.txt', true], ['pool-script.ts', true]];
      for (const [name, typescript] of fixtures) {
        const ast = parseFile(readFixture(name), typescript);
        expect(reached(ast, true).size, name).toBe(reached(ast, false).size);
      }
      const jsx = parseFile('const Hold = ({ bay }) => <Crane.Arm id="a" {...bay}><>{bay.name}</></Crane.Arm>;', false);
      expect(reached(jsx, true).size).toBe(reached(jsx, false).size);
    });
  });
});
