import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import * as acorn from 'acorn';
import * as walk from 'acorn-walk';
import { describe, expect, it } from 'vitest';
import { analyzeFile } from '../../analyzers';

/**
 * Independent check of the JavaScript analyzer: for real published code, the function line
 * ranges it finds equal those found by a different parser, acorn@8.19.0 with acorn-walk@8.3.5.
 * The code: express@5.3.0 (lib/*.js) and pg@8.23.1 (lib/*.js and lib/crypto/*.js), both
 * CommonJS files installed under node_modules as dependencies of this project.
 */
const require = createRequire(import.meta.url);

function packageFiles(pkg: string, dirs: string[]): string[] {
  const root = path.dirname(require.resolve(`${pkg}/package.json`));
  return dirs.flatMap((dir) =>
    fs
      .readdirSync(path.join(root, dir))
      .filter((f) => f.endsWith('.js'))
      .map((f) => path.join(root, dir, f)),
  );
}

function versionOf(pkg: string): string {
  return (JSON.parse(fs.readFileSync(require.resolve(`${pkg}/package.json`), 'utf8')) as { version: string }).version;
}

/** [startLine, endLine] of every function acorn finds; a method starts at its key, as written. */
function acornRanges(text: string): string[] {
  const ast = acorn.parse(text, { ecmaVersion: 'latest', sourceType: 'script', locations: true, allowHashBang: true });
  const ranges: string[] = [];
  walk.fullAncestor(ast, (node, _state, ancestors) => {
    if (node.type !== 'FunctionDeclaration' && node.type !== 'FunctionExpression' && node.type !== 'ArrowFunctionExpression') return;
    const parent = ancestors[ancestors.length - 2] as acorn.Node & { kind?: string; method?: boolean; value?: acorn.Node };
    const isMethod =
      parent !== undefined &&
      parent.value === node &&
      (parent.type === 'MethodDefinition' || (parent.type === 'Property' && (parent.method === true || parent.kind === 'get' || parent.kind === 'set')));
    const start = isMethod ? parent.loc!.start.line : node.loc!.start.line;
    ranges.push(`${start}-${node.loc!.end.line}`);
  });
  return ranges.sort();
}

const FILES = [
  ...packageFiles('express', ['lib']).map((file) => ({ pkg: `express@${versionOf('express')}`, file })),
  ...packageFiles('pg', ['lib', 'lib/crypto']).map((file) => ({ pkg: `pg@${versionOf('pg')}`, file })),
];

describe('javascript analyzer against acorn (express@5.3.0, pg@8.23.1)', () => {
  it('reads the packages it claims to (pinned versions)', () => {
    expect(versionOf('express')).toBe('5.3.0');
    expect(versionOf('pg')).toBe('8.23.1');
    expect(FILES.length).toBeGreaterThan(15);
  });

  for (const { pkg, file } of FILES) {
    it(`finds the same function line ranges as acorn in ${pkg} ${path.basename(path.dirname(file))}/${path.basename(file)}`, async () => {
      const text = fs.readFileSync(file, 'utf8');
      const ours = await analyzeFile(file, text, { minTokens: 1 });
      expect(ours.error).toBeUndefined();
      const mine = ours.fragments.map((f) => `${f.startLine}-${f.endLine}`).sort();
      expect(mine).toEqual(acornRanges(text));
    });
  }

  describe('edge cases', () => {
    it('agrees on a file with no functions at all', async () => {
      const text = "'use strict';\nmodule.exports = { a: 1 };\n";
      expect((await analyzeFile('a.js', text, { minTokens: 1 })).fragments).toEqual([]);
      expect(acornRanges(text)).toEqual([]);
    });
  });
});
