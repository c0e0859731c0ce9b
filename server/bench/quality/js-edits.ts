/**
 * The edit operators of the quality benchmark for JavaScript and TypeScript: each makes one kind
 * of copy-and-edit change to a planted function. The kinds follow the editing taxonomy of the
 * mutation-based evaluation of clone detectors by Roy and Cordy (layout and comments; renaming
 * identifiers systematically or arbitrarily; literals; small insertions, deletions and
 * modifications of lines; reordering; wrapping in a control statement), recalled from memory,
 * not copied from their tool.
 *
 * Layout, comment and whitespace edits rewrite only the text between tokens (Babel's token
 * list), so the token stream is provably unchanged. Every other edit changes the syntax tree and
 * is printed with recast, which reprints only the nodes that changed and keeps the rest of the
 * function byte for byte, so a copy differs from its original exactly by the edit.
 */
import * as recast from 'recast';
import {
  findFunction, isNode, isSimpleStatement, newExpression, newStatement, parseStrict, readsAndWrites,
  recastParser, statementLists, variablesOf, walk, type Node, type Snippet, type StatementList, type Variables,
} from './syntax';
import { pick, pickSome } from './pick';

/** The JavaScript/TypeScript edit kinds, in the order the tables print them. */
export const JS_EDIT_KINDS = [
  'layout',
  'whitespace',
  'rename-one',
  'rename-all',
  'rename-inconsistent',
  'literals',
  'types',
  'insert-1',
  'insert-2',
  'insert-5',
  'delete-1',
  'modify-1',
  'reorder-2',
  'wrap',
  'combined',
] as const;

/** One JavaScript/TypeScript edit kind. */
export type JsEditKind = (typeof JS_EDIT_KINDS)[number];

/** What an edit gives: the edited snippet, or why the function cannot carry it. */
export type EditResult = { text: string } | { skipped: string };

/** What each kind does, for the tables. */
export const JS_EDIT_DESCRIPTIONS: Record<JsEditKind, string> = {
  layout: 'indentation doubled, a blank line and a comment before each statement of the body, old comments removed',
  whitespace: 'a space added between every two tokens that touch, single spaces between two punctuators removed',
  'rename-one': 'one local variable renamed everywhere',
  'rename-all': 'every local variable renamed consistently',
  'rename-inconsistent': 'up to three variables renamed at some of their uses only',
  literals: 'up to three string or number literals changed (same kind)',
  types: 'up to three type annotations added or changed (TypeScript only)',
  'insert-1': 'one statement inserted',
  'insert-2': 'two statements inserted',
  'insert-5': 'five statements inserted',
  'delete-1': 'one single-line statement deleted',
  'modify-1': 'the expression of one single-line statement replaced',
  'reorder-2': 'two adjacent independent single-line statements swapped',
  wrap: 'one to three statements wrapped in an if',
  combined: 'one variable renamed, one statement inserted, one literal changed',
};

/**
 * Applies one edit kind to the function of `snippet`. Random choices (which variable, where to
 * insert) come from `random`, so a seeded stream repeats the same copies.
 *
 * @example
 * applyJsEdit('insert-1', { text: 'function f(a) {\n  a.x = 1;\n  return a;\n}', line: 1, column: 0, dialect }, random(1))
 * // { text: 'function f(a) {\n  a.x = 1;\n  console.debug("checkpoint", a);\n  return a;\n}' } (which statement, and where, depends on the seed)
 */
export function applyJsEdit(kind: JsEditKind, snippet: Snippet, random: () => number): EditResult {
  switch (kind) {
    case 'layout':
      return relayout(snippet);
    case 'whitespace':
      return respace(snippet);
    case 'types':
      if (!snippet.dialect.typescript) return { skipped: 'not TypeScript' };
      return treeEdit(snippet, random, changeTypes);
    case 'rename-one':
      return spliceEdit(snippet, random, renameOne);
    case 'rename-all':
      return spliceEdit(snippet, random, renameAll);
    case 'rename-inconsistent':
      return spliceEdit(snippet, random, renameInconsistently);
    case 'literals':
      return spliceEdit(snippet, random, (edit) => changeLiterals(edit, 3));
    case 'insert-1':
      return treeEdit(snippet, random, (edit) => insertStatements(edit, 1));
    case 'insert-2':
      return treeEdit(snippet, random, (edit) => insertStatements(edit, 2));
    case 'insert-5':
      return treeEdit(snippet, random, (edit) => insertStatements(edit, 5));
    case 'delete-1':
      return treeEdit(snippet, random, deleteStatement);
    case 'modify-1':
      return treeEdit(snippet, random, modifyStatement);
    case 'reorder-2':
      return treeEdit(snippet, random, reorderStatements);
    case 'wrap':
      return treeEdit(snippet, random, wrapInCondition);
    case 'combined': {
      // The literal first, so it is one of the function's own and not one of the inserted statement's.
      const renamed = spliceEdit(snippet, random, (edit) => changeLiterals(edit, 1) ?? renameOne(edit));
      if ('skipped' in renamed) return renamed;
      return treeEdit({ ...snippet, text: renamed.text }, random, (edit) => insertStatements(edit, 1));
    }
    default:
      throw new Error(`unknown edit kind "${String(kind)}"`);
  }
}

// ---------------------------------------------------------------------------------------------
// Edits between tokens

interface Token {
  start: number;
  end: number;
  label: string;
}

/** The code tokens of a parsed snippet (comments left out), with Babel's labels. */
function codeTokens(ast: Node): Token[] {
  const out: Token[] = [];
  for (const token of ast.tokens as Array<{ type: string | { label: string }; start: number; end: number }>) {
    if (typeof token.type === 'string') continue;
    if (token.type.label === 'eof') continue;
    out.push({ start: token.start, end: token.end, label: token.type.label });
  }
  return out;
}

/** The raw text of every code token: equal for two texts that differ only in layout and comments. */
export function tokenTexts(text: string, dialect: Snippet['dialect']): string[] {
  return codeTokens(parseStrict(text, dialect)).map((t) => text.slice(t.start, t.end));
}

const LINE_BREAK = /[\n\r\u2028\u2029]/;

function functionTokens(snippet: Snippet): { ast: Node; fn: Node; tokens: Token[] } {
  const ast = parseStrict(snippet.text, snippet.dialect);
  const fn = findFunction(ast, snippet);
  if (!fn) throw new Error(`no function at ${snippet.line}:${snippet.column} of the snippet`);
  const tokens = codeTokens(ast).filter((t) => t.start >= fn.start && t.end <= fn.end);
  return { ast, fn, tokens };
}

/** Rewrites the gaps between the function's tokens; `gap` returns the new text of gap i (between tokens i and i+1). */
function rewriteGaps(text: string, tokens: Token[], gap: (i: number, old: string) => string): string {
  let out = text.slice(0, tokens[0]!.start);
  for (let i = 0; i < tokens.length; i++) {
    out += text.slice(tokens[i]!.start, tokens[i]!.end);
    if (i + 1 < tokens.length) out += gap(i, text.slice(tokens[i]!.end, tokens[i + 1]!.start));
  }
  return out + text.slice(tokens[tokens.length - 1]!.end);
}

/** Layout and comments: re-indented at twice the width, comments removed, a comment and a blank line before each statement of the body. */
function relayout(snippet: Snippet): EditResult {
  const { fn, tokens } = functionTokens(snippet);
  const text = snippet.text;
  const bodyStarts = new Set<number>(fn.body?.type === 'BlockStatement' ? (fn.body.body as Node[]).map((s) => s.start as number) : []);
  const result = rewriteGaps(text, tokens, (i, old) => {
    if (!LINE_BREAK.test(old)) return old.includes('/') ? ' ' : old;
    const next = tokens[i + 1]!;
    const lineStart = Math.max(text.lastIndexOf('\n', next.start - 1), text.lastIndexOf('\r', next.start - 1)) + 1;
    const width = /^[ \t]*/.exec(text.slice(lineStart, next.start))![0].replace(/\t/g, '  ').length;
    const indent = ' '.repeat(width * 2);
    const note = bodyStarts.has(next.start) ? `\n\n${indent}// step ${[...bodyStarts].indexOf(next.start) + 1}\n` : '\n';
    return `${note}${indent}`;
  });
  return result === text ? { skipped: 'nothing to re-lay out' } : { text: result };
}

/** Whitespace inside lines: a space between touching tokens, single spaces between punctuators removed. */
function respace(snippet: Snippet): EditResult {
  const { fn, tokens } = functionTokens(snippet);
  const text = snippet.text;
  // JSX text is made of the spaces between tags, and template strings of the spaces inside them:
  // neither is layout, so both are left alone.
  const jsx: Array<[number, number]> = [];
  walk(fn, (node) => {
    if (node.type === 'JSXElement' || node.type === 'JSXFragment') {
      jsx.push([node.start, node.end]);
      return false;
    }
    return true;
  });
  const fixed = (i: number) => {
    const left = tokens[i]!;
    const right = tokens[i + 1]!;
    if (jsx.some(([s, e]) => left.end > s && right.start < e)) return true;
    return ['`', 'template', '#', '@'].includes(left.label) || ['`', 'template'].includes(right.label);
  };
  const punctuator = (token: Token) => !/[\w$'"`\\]/.test(text.slice(token.start, token.end)) && token.label !== 'regexp';
  const both = rewriteGaps(text, tokens, (i, old) => {
    if (old === '' && !fixed(i)) return ' ';
    if (old === ' ' && !fixed(i) && punctuator(tokens[i]!) && punctuator(tokens[i + 1]!)) return '';
    return old;
  });
  let result = both;
  // Removing a space can glue two punctuators into another one (`a - -b`): keep only additions then.
  if (!sameTokens(snippet, both)) result = rewriteGaps(text, tokens, (i, old) => (old === '' && !fixed(i) ? ' ' : old));
  return result === text ? { skipped: 'no space to change' } : { text: result };
}

function sameTokens(snippet: Snippet, text: string): boolean {
  try {
    const a = tokenTexts(snippet.text, snippet.dialect);
    const b = tokenTexts(text, snippet.dialect);
    return a.length === b.length && a.every((t, i) => t === b[i]);
  } catch {
    return false;
  }
}

// ---------------------------------------------------------------------------------------------
// Edits on the syntax tree

/** What a tree edit works on. Returns a reason when the function cannot carry the edit. */
interface TreeEdit {
  root: Node;
  fn: Node;
  random: () => number;
  variables: Variables;
  /** The snippet's text (spliceEdit's offsets point into it). */
  text: string;
  /** Text replacements at Babel's offsets (names and literals), for spliceEdit. */
  splices: Array<{ start: number; end: number; text: string }>;
}

/**
 * Renames and literal changes are written into the text at the nodes' offsets, not reprinted:
 * a reprinted statement can gain a semicolon it did not have (recast prints its own style), and
 * these edits must change nothing but the names and literals.
 */
function spliceEdit(snippet: Snippet, random: () => number, edit: (e: TreeEdit) => string | undefined): EditResult {
  const root = parseStrict(snippet.text, snippet.dialect);
  const fn = findFunction(root, snippet);
  if (!fn) throw new Error(`no function at ${snippet.line}:${snippet.column} of the snippet`);
  const splices: TreeEdit['splices'] = [];
  const skipped = edit({ root, fn, random, variables: variablesOf(fn, root), splices, text: snippet.text });
  if (skipped) return { skipped };
  let text = snippet.text;
  for (const s of [...splices].sort((a, b) => b.start - a.start)) text = text.slice(0, s.start) + s.text + text.slice(s.end);
  return { text };
}

function treeEdit(snippet: Snippet, random: () => number, edit: (e: TreeEdit) => string | undefined): EditResult {
  const root = recast.parse(snippet.text, { parser: recastParser(snippet.dialect) }) as Node;
  const fn = findFunction(root, snippet);
  if (!fn) throw new Error(`no function at ${snippet.line}:${snippet.column} of the snippet`);
  const skipped = edit({ root, fn, random, variables: variablesOf(fn, root), splices: [], text: snippet.text });
  if (skipped) return { skipped };
  return { text: recast.print(root).code };
}

const NEW_NAMES = [
  'entry', 'record', 'payload', 'cursor', 'buffer', 'target', 'origin', 'current', 'handle', 'holder',
  'subject', 'element', 'detail', 'marker', 'tally', 'slot', 'ledger', 'cargo', 'manifest', 'consignment',
];

/** A name nobody in the snippet uses yet (it is then taken). */
function freshName(variables: Variables, random: () => number): string {
  const start = Math.floor(random() * NEW_NAMES.length);
  for (let round = 0; ; round++) {
    for (let i = 0; i < NEW_NAMES.length; i++) {
      const name = NEW_NAMES[(start + i) % NEW_NAMES.length]! + (round === 0 ? '' : String(round + 1));
      if (!variables.taken.has(name)) {
        variables.taken.add(name);
        return name;
      }
    }
  }
}

/** Local variables that can be renamed without touching anything but their own identifiers. */
function renamable(variables: Variables, minUses: number): string[] {
  return [...variables.declared]
    .filter((name) => !variables.shorthand.has(name) && (variables.occurrences.get(name)?.length ?? 0) >= minUses)
    .sort();
}

function renameOne(edit: TreeEdit): string | undefined {
  const names = renamable(edit.variables, 2);
  if (names.length === 0) return 'no local variable used twice';
  const name = pick(names, edit.random);
  const to = freshName(edit.variables, edit.random);
  renameVariable(edit, name, to);
  return undefined;
}

/** Renames one identifier (its name only: a type annotation inside the node's range stays). */
function renameNode(edit: TreeEdit, node: Node, to: string): void {
  edit.splices.push({ start: node.start, end: node.start + String(node.name).length, text: to });
  node.name = to;
}

/** Renames every use of a variable, and keeps the record of variables up to date for a later edit. */
function renameVariable(edit: TreeEdit, name: string, to: string): void {
  const { variables } = edit;
  const uses = variables.occurrences.get(name)!;
  for (const node of uses) renameNode(edit, node, to);
  variables.occurrences.delete(name);
  variables.occurrences.set(to, uses);
  variables.declared.delete(name);
  variables.declared.add(to);
}

function renameAll(edit: TreeEdit): string | undefined {
  const names = renamable(edit.variables, 1);
  if (names.length < 2) return 'fewer than two local variables';
  for (const name of names) renameVariable(edit, name, freshName(edit.variables, edit.random));
  return undefined;
}

function renameInconsistently(edit: TreeEdit): string | undefined {
  const names = renamable(edit.variables, 2);
  if (names.length === 0) return 'no local variable used twice';
  for (const name of pickSome(names, 3, edit.random)) {
    const uses = edit.variables.occurrences.get(name)!;
    const to = freshName(edit.variables, edit.random);
    // A non-empty proper subset of the uses: some renamed, at least one not.
    const count = 1 + Math.floor(edit.random() * (uses.length - 1));
    for (const node of pickSome(uses, count, edit.random)) renameNode(edit, node, to);
  }
  return undefined;
}

const WORDS = ['pending', 'ready', 'railhead', 'consignee', 'siding', 'wagon', 'depot', 'tariff'];

function changeLiterals(edit: TreeEdit, most: number): string | undefined {
  const literals: Node[] = [];
  walk(edit.fn, (node, place) => {
    if (node.type !== 'StringLiteral' && node.type !== 'NumericLiteral') return true;
    const parent = place.parent?.type ?? '';
    if (place.key === 'source' || parent === 'JSXAttribute' || parent.startsWith('Import') || parent.startsWith('Export')) return true;
    // `1..toFixed()`: another number written in its place could lose the dot the member access needs.
    if (edit.text[node.end] === '.') return true;
    literals.push(node);
    return true;
  });
  if (literals.length === 0) return 'no string or number literal';
  for (const node of pickSome(literals, most, edit.random)) {
    if (node.type === 'NumericLiteral') {
      const value = Number(node.value);
      node.value = Number.isInteger(value) ? value + 1 + Math.floor(edit.random() * 9) : value * 2 + 0.5;
    } else {
      const value = String(node.value);
      node.value = WORDS.find((w) => w !== value && !value.includes(w)) ?? `${value}-edited`;
      node.value = node.value === value ? `${value}-edited` : node.value;
    }
    delete node.extra;
    // The words are plain letters, so the literal needs no escapes; it keeps its own quote character.
    const quote = edit.text[node.start] === "'" ? "'" : '"';
    const raw = node.type === 'NumericLiteral' ? String(node.value) : `${quote}${String(node.value)}${quote}`;
    edit.splices.push({ start: node.start, end: node.end, text: raw });
  }
  return undefined;
}

const TYPE_BUILDERS = ['tsUnknownKeyword', 'tsStringKeyword', 'tsNumberKeyword', 'tsBooleanKeyword', 'tsAnyKeyword'] as const;
const KEYWORD_TYPES: Record<string, (typeof TYPE_BUILDERS)[number]> = {
  TSUnknownKeyword: 'tsUnknownKeyword',
  TSStringKeyword: 'tsStringKeyword',
  TSNumberKeyword: 'tsNumberKeyword',
  TSBooleanKeyword: 'tsBooleanKeyword',
  TSAnyKeyword: 'tsAnyKeyword',
};

/** Adds a type where there is none, changes it where there is one: parameters, local variables, the return type. */
function changeTypes(edit: TreeEdit): string | undefined {
  const b = recast.types.builders as unknown as Record<string, (...args: unknown[]) => Node>;
  const { fn } = edit;
  const targets: Array<{ node: Node; key: 'typeAnnotation' | 'returnType' }> = [];
  // `x => …` needs parentheses before it can carry a type; such arrows keep their parameters as they are.
  const bareArrow = fn.type === 'ArrowFunctionExpression' && fn.params.length === 1 && fn.params[0].type === 'Identifier';
  if (!bareArrow) {
    for (const param of fn.params as Node[]) {
      const target = param.type === 'TSParameterProperty' ? param.parameter : param;
      const slot = target.type === 'AssignmentPattern' ? target.left : target;
      if (slot && slot.type !== 'Identifier' && slot.type !== 'ObjectPattern' && slot.type !== 'ArrayPattern' && slot.type !== 'RestElement') continue;
      if (slot) targets.push({ node: slot, key: 'typeAnnotation' });
    }
    if (fn.kind !== 'constructor' && fn.kind !== 'set') targets.push({ node: fn, key: 'returnType' });
  }
  walk(fn, (node, place) => {
    // `for (const x of …)` cannot carry a type.
    if (node.type === 'VariableDeclaration' && (place.key === 'left' || node.declare)) return false;
    if (node.type === 'VariableDeclarator' && node.id.type === 'Identifier') targets.push({ node: node.id, key: 'typeAnnotation' });
    return true;
  });
  if (targets.length === 0) return 'nothing that can carry a type';
  for (const { node, key } of pickSome(targets, 3, edit.random)) {
    const old = node[key] as Node | null | undefined;
    const oldKeyword = old && isNode(old.typeAnnotation) ? KEYWORD_TYPES[old.typeAnnotation.type] : undefined;
    const choices = TYPE_BUILDERS.filter((t) => t !== oldKeyword);
    const type = b[pick(choices, edit.random)]!();
    node[key] = b.tsTypeAnnotation!(type);
  }
  return undefined;
}

function localNames(edit: TreeEdit): [string, string] {
  const names = renamable(edit.variables, 1).filter((n) => n !== 'arguments' && n !== 'eval');
  if (names.length === 0) return ['value', 'items'];
  return [pick(names, edit.random), pick(names, edit.random)];
}

/** A plausible new statement that uses the function's own variables. */
function insertedStatement(edit: TreeEdit): Node {
  const [v, w] = localNames(edit);
  const menu = [
    () => `console.debug("checkpoint", ${v});`,
    () => `if (${v} == null) { throw new TypeError("missing value"); }`,
    () => `const ${freshName(edit.variables, edit.random)} = ${v} + 1;`,
    () => 'metrics.count += 1;',
    () => `assertValid(${v}, "input");`,
    () => `let ${freshName(edit.variables, edit.random)} = ${w}.length > 0 ? ${w}[0] : null;`,
  ];
  return newStatement(pick(menu, edit.random)());
}

function insertStatements(edit: TreeEdit, count: number): string | undefined {
  const lists = statementLists(edit.fn);
  if (lists.length === 0) return 'no block to insert into';
  for (let i = 0; i < count; i++) {
    // Each insertion point (a slot between statements of any block) is equally likely.
    const slots = lists.reduce((sum, list) => sum + list.length + 1, 0);
    let slot = Math.floor(edit.random() * slots);
    for (const list of lists) {
      if (slot <= list.length) {
        list.splice(slot, 0, insertedStatement(edit));
        break;
      }
      slot -= list.length + 1;
    }
  }
  return undefined;
}

function simpleStatements(fn: Node): Array<{ list: StatementList; index: number }> {
  const out: Array<{ list: StatementList; index: number }> = [];
  for (const list of statementLists(fn)) list.forEach((statement, index) => isSimpleStatement(statement) && out.push({ list, index }));
  return out;
}

function deleteStatement(edit: TreeEdit): string | undefined {
  const candidates = simpleStatements(edit.fn);
  if (candidates.length === 0) return 'no single-line statement';
  const { list, index } = pick(candidates, edit.random);
  list.splice(index, 1);
  return undefined;
}

/** The expression a simple statement is about, with the setter that replaces it. */
function mainExpression(statement: Node): ((expression: Node) => void) | undefined {
  switch (statement.type) {
    case 'ExpressionStatement':
      return (e) => (statement.expression = e);
    case 'VariableDeclaration': {
      const declarator = statement.declarations[0] as Node;
      return statement.declarations.length === 1 && declarator.init ? (e) => (declarator.init = e) : undefined;
    }
    case 'ReturnStatement':
    case 'ThrowStatement':
      return statement.argument ? (e) => (statement.argument = e) : undefined;
    default:
      return undefined;
  }
}

function modifyStatement(edit: TreeEdit): string | undefined {
  const candidates = simpleStatements(edit.fn).filter(({ list, index }) => mainExpression(list[index]!) !== undefined);
  if (candidates.length === 0) return 'no single-line statement with an expression';
  const { list, index } = pick(candidates, edit.random);
  const [v, w] = localNames(edit);
  const menu = [
    `normalize(${v}, options)`,
    `${v}.get(key) ?? fallback`,
    'state.pending.length > 0',
    `format(${v}, ${w}).trim()`,
    `compute(${v}) + offset`,
  ];
  mainExpression(list[index]!)!(newExpression(pick(menu, edit.random)));
  return undefined;
}

function reorderStatements(edit: TreeEdit): string | undefined {
  const pairs: Array<{ list: StatementList; index: number }> = [];
  const movable = (s: Node) => (s.type === 'ExpressionStatement' || s.type === 'VariableDeclaration') && isSimpleStatement(s);
  for (const list of statementLists(edit.fn)) {
    for (let i = 0; i + 1 < list.length; i++) {
      const a = list[i]!;
      const b = list[i + 1]!;
      if (!movable(a) || !movable(b) || recast.print(a).code === recast.print(b).code) continue;
      const ra = readsAndWrites(a);
      const rb = readsAndWrites(b);
      const touches = (x: Set<string>, y: Set<string>) => [...x].some((name) => y.has(name));
      // Independent: neither reads or writes what the other writes.
      if (touches(ra.writes, rb.reads) || touches(rb.writes, ra.reads)) continue;
      pairs.push({ list, index: i });
    }
  }
  if (pairs.length === 0) return 'no two adjacent independent statements';
  const { list, index } = pick(pairs, edit.random);
  const first = list[index]!;
  list[index] = list[index + 1]!;
  list[index + 1] = first;
  return undefined;
}

const DECLARATIONS = new Set(['VariableDeclaration', 'FunctionDeclaration', 'ClassDeclaration']);

function wrapInCondition(edit: TreeEdit): string | undefined {
  const runs: Array<{ list: StatementList; index: number; length: number }> = [];
  for (const list of statementLists(edit.fn)) {
    for (let i = 0; i < list.length; i++) {
      // A declaration inside the `if` would hide its name from the statements after it.
      for (let length = 1; length <= 3 && i + length <= list.length && !DECLARATIONS.has(list[i + length - 1]!.type); length++) {
        runs.push({ list, index: i, length });
      }
    }
  }
  if (runs.length === 0) return 'no statement to wrap';
  const { list, index, length } = pick(runs, edit.random);
  const [v] = localNames(edit);
  const condition = pick([`options.enabled`, `${v} !== undefined`, `!state.done`, `${v}.length > 0`], edit.random);
  const wrapper = newStatement(`if (${condition}) {}`);
  wrapper.consequent.body = list.slice(index, index + length);
  list.splice(index, length, wrapper);
  return undefined;
}
