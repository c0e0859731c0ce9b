import type { ParserPlugin } from '@babel/parser';
import type { FragmentSpan, ResolvedOptions } from '../fragments';
import { checkNestingDepth } from '../limits';
import { emptyTokenStream, pushToken, type TokenClass } from '../tokens';
import type { FragmentKind } from '../types';
import { BABEL_CHILD_KEYS } from './babel-child-keys';
import type { LanguageAnalysis } from './language';

/**
 * The JavaScript-family engine (JS, TS, JSX, TSX, .mjs, .cjs) on @babel/parser with error recovery.
 *
 * Nesting: a nested function is a fragment of its own AND its tokens also count in every
 * enclosing function. A fragment is the code a person would copy; copying an outer function
 * copies its callbacks too, and an outer function that is mostly a callback (a route handler,
 * a `describe` block) would otherwise shrink to a skeleton of a few tokens and match unrelated
 * skeletons. The price: a copied inner function also raises the similarity of the two outer
 * functions, and token-based metrics must count each source token once (by position), not once
 * per fragment.
 *
 * TypeScript annotations (`: T`, `<T>`, `as T`, `satisfies T`, `x!`, `x?:`, access modifiers,
 * declarations without bodies) are dropped from the token stream unless
 * `includeTypeAnnotations`, so a function copied from a .ts file into a .js file keeps its
 * identity.
 */

interface BabelNode {
  type: string;
  start: number;
  end: number;
  [key: string]: unknown;
}

interface BabelToken {
  type: string | { label: string };
  start: number;
  end: number;
}

const SKIP_KEYS = new Set(['loc', 'start', 'end', 'type', 'extra', 'leadingComments', 'trailingComments', 'innerComments', 'range', 'errors', 'tokens', 'comments']);

const TYPE_ONLY = new Set([
  'TSTypeAnnotation',
  'TSTypeParameterDeclaration',
  'TSTypeParameterInstantiation',
  'TSInterfaceDeclaration',
  'TSTypeAliasDeclaration',
  'TSDeclareFunction',
  'TSDeclareMethod',
  'TSIndexSignature',
]);

const MODIFIERS = new Set(['public', 'private', 'protected', 'readonly', 'override', 'abstract', 'declare']);

const LABEL_CLASS: Record<string, TokenClass> = {
  name: 'identifier',
  jsxName: 'identifier',
  string: 'string',
  template: 'string',
  jsxText: 'string',
  num: 'number',
  bigint: 'number',
  decimal: 'number',
  regexp: 'regexp',
  true: 'boolean',
  false: 'boolean',
};

/** Child keys by node type (see babel-child-keys.ts), as a Map so no prototype key can match. */
const CHILD_KEYS = new Map<string, readonly string[]>(Object.entries(BABEL_CHILD_KEYS));

/** Every key of a node type the table does not know that may hold children: all but SKIP_KEYS. */
function allChildKeys(node: BabelNode): string[] {
  const keys: string[] = [];
  for (const key in node) if (!SKIP_KEYS.has(key)) keys.push(key);
  return keys;
}

function isNode(value: unknown): value is BabelNode {
  return typeof value === 'object' && value !== null && typeof (value as BabelNode).type === 'string';
}

/** Readable name of a key or member expression: `a.b.c`, `X.prototype.y` → `X.y`. */
function nameOf(node: unknown, text: string): string | undefined {
  if (!isNode(node)) return undefined;
  switch (node.type) {
    case 'Identifier':
    case 'JSXIdentifier':
      return node.name as string;
    case 'PrivateName':
      return `#${nameOf(node.id, text) ?? ''}`;
    case 'StringLiteral':
      return node.value as string;
    case 'NumericLiteral':
      return String(node.value);
    case 'ThisExpression':
      return 'this';
    case 'MemberExpression':
    case 'OptionalMemberExpression': {
      const object = nameOf(node.object, text) ?? '<expression>';
      const property = node.computed ? '[computed]' : (nameOf(node.property, text) ?? '[computed]');
      if (property === 'prototype') return object;
      return `${object}.${property}`;
    }
    default:
      return undefined;
  }
}

function keyName(node: BabelNode, text: string): string {
  if (node.computed) return '[computed]';
  return nameOf(node.key, text) ?? '[computed]';
}

/** Name a function or class expression takes from where it is written (`const f = …`, `a.b = …`, `{ f: … }`). */
function nameFromParent(parent: BabelNode | undefined, node: BabelNode, text: string, objectName: string | undefined, className: string | undefined): string | undefined {
  if (!parent) return undefined;
  switch (parent.type) {
    case 'VariableDeclarator':
      return parent.init === node ? nameOf(parent.id, text) : undefined;
    case 'AssignmentExpression':
    case 'AssignmentPattern':
      return parent.right === node ? nameOf(parent.left, text) : undefined;
    case 'ObjectProperty':
      return parent.value === node ? qualify(objectName, keyName(parent, text)) : undefined;
    case 'ClassProperty':
    case 'ClassPrivateProperty':
    case 'ClassAccessorProperty':
      return parent.value === node ? qualify(className, keyName(parent, text)) : undefined;
    case 'ExportDefaultDeclaration':
      return 'default';
    default:
      return undefined;
  }
}

function qualify(owner: string | undefined, name: string): string {
  return owner ? `${owner}.${name}` : name;
}

type BabelParse = (typeof import('@babel/parser'))['parse'];

/**
 * The parser, imported on the first parse: a process that only routes files to the analyzer pool
 * (the command line's import, the web server) never loads it on its main thread.
 */
let babelParse: BabelParse | undefined;

function parseWithFallback(parse: BabelParse, text: string, plugins: ParserPlugin[], sourceType: 'module' | 'script') {
  const common = {
    plugins,
    tokens: true,
    // Comments are dropped from the token stream and never read from nodes; not attaching them
    // to nodes saves a tenth of the parse (node ranges and tokens are the same either way).
    attachComment: false,
    errorRecovery: true,
    allowReturnOutsideFunction: true,
    allowAwaitOutsideFunction: true,
    allowSuperOutsideMethod: true,
    allowUndeclaredExports: true,
    allowNewTargetOutsideFunction: true,
  } as const;
  try {
    return parse(text, { ...common, sourceType });
  } catch (error) {
    // Sloppy-mode scripts (`with`, legacy octal) are not modules; give them a second chance.
    if (sourceType === 'module') return parse(text, { ...common, sourceType: 'script' });
    throw error;
  }
}

/** Parses JavaScript-family source and returns its tokens and function spans. */
export async function analyzeWithBabel(
  text: string,
  dialect: { typescript: boolean; jsx: boolean; sourceType: 'module' | 'script' },
  options: ResolvedOptions,
): Promise<LanguageAnalysis> {
  const parse = babelParse ?? (babelParse = (await import('@babel/parser')).parse);
  const plugins: ParserPlugin[] = [];
  if (dialect.typescript) plugins.push('typescript', 'decorators-legacy');
  else plugins.push('decorators-legacy');
  if (dialect.jsx) plugins.push('jsx');
  const ast = parseWithFallback(parse, text, plugins, dialect.sourceType) as unknown as BabelNode & { tokens: BabelToken[]; errors?: unknown[] };

  const spans: FragmentSpan[] = [];
  const dropped: Array<[number, number]> = [];
  const dropTypes = dialect.typescript && !options.includeTypeAnnotations;
  // An explicit stack, not recursion: nesting depth is the input's to choose. Parallel stacks
  // instead of one object per node, since a large file has a few hundred thousand nodes.
  // `depths` counts the functions and classes around a node (the nesting limit, limits.ts).
  const nodes: BabelNode[] = [ast];
  const parents: Array<BabelNode | undefined> = [undefined];
  const classes: Array<string | undefined> = [undefined];
  const objects: Array<string | undefined> = [undefined];
  const depths: number[] = [0];

  for (let node = nodes.pop(); node !== undefined; node = nodes.pop()) {
    const parent = parents.pop();
    const className = classes.pop();
    const objectName = objects.pop();
    const depth = depths.pop() ?? 0;
    let childClass = className;
    let childObject = objectName;
    let childDepth = depth;

    if (dropTypes) collectTypeRanges(node, text, dropped);

    switch (node.type) {
      case 'ClassDeclaration':
      case 'ClassExpression':
        childClass = nameOf(node.id, text) ?? nameFromParent(parent, node, text, objectName, className) ?? '<anonymous>';
        childDepth = depth + 1;
        break;
      case 'ObjectExpression':
        childObject = nameFromParent(parent, node, text, objectName, className);
        break;
      case 'FunctionDeclaration':
      case 'FunctionExpression':
      case 'ArrowFunctionExpression': {
        const own = nameOf(node.id, text);
        const name = own ?? nameFromParent(parent, node, text, objectName, className) ?? '<anonymous>';
        const kind: FragmentKind = node.type === 'ArrowFunctionExpression' ? 'arrow' : 'function';
        spans.push({ name, kind, start: node.start, end: node.end });
        childDepth = depth + 1;
        break;
      }
      case 'ObjectMethod':
      case 'ClassMethod':
      case 'ClassPrivateMethod': {
        const owner = node.type === 'ObjectMethod' ? objectName : className;
        const kind: FragmentKind =
          node.kind === 'constructor' ? 'constructor' : node.kind === 'get' ? 'getter' : node.kind === 'set' ? 'setter' : 'method';
        spans.push({ name: qualify(owner, keyName(node, text)), kind, start: node.start, end: node.end });
        childDepth = depth + 1;
        break;
      }
      default:
        break;
    }
    if (childDepth > depth) checkNestingDepth(childDepth);

    // Children are pushed in reverse so they pop in source order (not needed for correctness:
    // spans are sorted later, but it keeps the traversal predictable when debugging).
    const keys = CHILD_KEYS.get(node.type) ?? allChildKeys(node);
    for (let k = keys.length - 1; k >= 0; k--) {
      const value = node[keys[k]];
      if (Array.isArray(value)) {
        for (let i = value.length - 1; i >= 0; i--) {
          const item: unknown = value[i];
          if (isNode(item)) {
            nodes.push(item);
            parents.push(node);
            classes.push(childClass);
            objects.push(childObject);
            depths.push(childDepth);
          }
        }
      } else if (isNode(value)) {
        nodes.push(value);
        parents.push(node);
        classes.push(childClass);
        objects.push(childObject);
        depths.push(childDepth);
      }
    }
  }

  const tokens = emptyTokenStream();
  dropped.sort((a, b) => a[0] - b[0]);
  let d = 0;
  let dropEnd = -1;
  for (const token of ast.tokens) {
    if (typeof token.type === 'string') continue; // CommentLine / CommentBlock
    const label = token.type.label;
    if (label === 'eof') continue;
    while (d < dropped.length && dropped[d][0] <= token.start) {
      dropEnd = Math.max(dropEnd, dropped[d][1]);
      d++;
    }
    if (token.start < dropEnd) continue;
    const raw = text.slice(token.start, token.end);
    if (label === 'jsxText' && raw.trim() === '') continue;
    if (dropTypes && label === 'name' && MODIFIERS.has(raw) && isModifierToken(token, text)) continue;
    pushToken(tokens, token.start, token.end, raw, LABEL_CLASS[label] ?? 'other');
  }
  return { tokens, spans, syntaxErrors: ast.errors?.length ?? 0 };
}

/**
 * Drops a modifier word only where TypeScript uses it as one: followed by a member name, `#` or
 * `[`. The same word used as a variable (`declare = 1`, `abstract(x)`) stays.
 */
function isModifierToken(token: BabelToken, text: string): boolean {
  const rest = text.slice(token.end, token.end + 40).trimStart();
  return /^[A-Za-z_$#[]/.test(rest);
}

/** Records the source ranges of a node that exist only for the type checker. */
function collectTypeRanges(node: BabelNode, text: string, out: Array<[number, number]>): void {
  if (TYPE_ONLY.has(node.type)) {
    out.push([node.start, node.end]);
    return;
  }
  switch (node.type) {
    case 'TSAsExpression':
    case 'TSSatisfiesExpression':
    case 'TSNonNullExpression':
      if (isNode(node.expression)) out.push([node.expression.end, node.end]);
      break;
    case 'TSParameterProperty':
      if (isNode(node.parameter)) out.push([node.start, node.parameter.start]);
      break;
    case 'Identifier':
    case 'ObjectPattern':
    case 'ArrayPattern':
    case 'ClassProperty':
    case 'ClassMethod':
      // `x?: T` / `m?()`: the `?` is not covered by the annotation node.
      if (node.optional === true) {
        const q = text.indexOf('?', node.type === 'Identifier' ? node.start + String(node.name).length : node.start);
        if (q >= 0 && q < node.end) out.push([q, q + 1]);
      }
      if (node.definite === true) {
        const bang = text.indexOf('!', node.start);
        if (bang >= 0 && bang < node.end) out.push([bang, bang + 1]);
      }
      break;
    default:
      break;
  }
}
