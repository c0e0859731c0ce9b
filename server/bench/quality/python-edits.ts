/**
 * The quality benchmark's edits for Python: text edits on whole statements and on identifier and
 * literal nodes, located with the same tree-sitter grammar the Python analyzer uses
 * (@repomix/tree-sitter-wasms). A smaller set than for JavaScript: Python's layout is syntax, so
 * the layout edit only adds and removes comments and blank lines.
 */
import fs from 'node:fs';
import { createRequire } from 'node:module';
import { Language, Parser, type Node } from 'web-tree-sitter';
import type { EditResult } from './js-edits';
import { pick, pickSome } from './pick';

/** The Python edit kinds, in the order the tables print them. */
export const PY_EDIT_KINDS = ['layout', 'rename-one', 'rename-all', 'literals', 'insert-1', 'insert-5', 'delete-1', 'reorder-2'] as const;

/** One Python edit kind. */
export type PyEditKind = (typeof PY_EDIT_KINDS)[number];

/**
 * A Python function cut out of its file: `text` holds it (under `if True:` when it was indented,
 * so it keeps its own indentation), and `line` (1-based) is the line where it starts (its first
 * decorator, or `def`).
 */
export interface PySnippet {
  text: string;
  line: number;
}

const requireFromHere = createRequire(import.meta.url);
let parser: Promise<Parser> | undefined;

/** The tree-sitter Python parser (loaded once). */
export function pythonParser(): Promise<Parser> {
  parser ??= (async () => {
    await Parser.init();
    const language = await Language.load(fs.readFileSync(requireFromHere.resolve('@repomix/tree-sitter-wasms/out/tree-sitter-python.wasm')));
    const p = new Parser();
    p.setLanguage(language);
    return p;
  })();
  return parser;
}

interface Splice {
  start: number;
  end: number;
  text: string;
}

/** Applies non-overlapping splices (any order). */
function splice(text: string, edits: Splice[]): string {
  let out = text;
  for (const edit of [...edits].sort((a, b) => b.start - a.start)) out = out.slice(0, edit.start) + edit.text + out.slice(edit.end);
  return out;
}

/**
 * Applies one edit kind to the function of `snippet`; random choices come from `random`.
 *
 * @example
 * await applyPyEdit('delete-1', { text: 'def f(a):\n    b = a + 1\n    return b\n', line: 1 }, random(1))
 * // { text: 'def f(a):\n    return b\n' } (or the other line gone, depending on the seed)
 */
export async function applyPyEdit(kind: PyEditKind, snippet: PySnippet, random: () => number): Promise<EditResult> {
  const tree = (await pythonParser()).parse(snippet.text);
  if (!tree) throw new Error('the Python parser returned no tree');
  try {
    const fn = findDef(tree.rootNode, snippet.line - 1);
    if (!fn) throw new Error(`no function at line ${snippet.line} of the snippet`);
    const context: PyEdit = { text: snippet.text, fn, random };
    let edits: Splice[] | string;
    switch (kind) {
      case 'layout':
        edits = layout(context);
        break;
      case 'rename-one':
        edits = rename(context, 1);
        break;
      case 'rename-all':
        edits = rename(context, Infinity);
        break;
      case 'literals':
        edits = literals(context, 3);
        break;
      case 'insert-1':
        edits = insert(context, 1);
        break;
      case 'insert-5':
        edits = insert(context, 5);
        break;
      case 'delete-1':
        edits = remove(context);
        break;
      case 'reorder-2':
        edits = reorder(context);
        break;
      default:
        throw new Error(`unknown edit kind "${String(kind)}"`);
    }
    return typeof edits === 'string' ? { skipped: edits } : { text: splice(snippet.text, edits) };
  } finally {
    tree.delete();
  }
}

interface PyEdit {
  text: string;
  /** The function_definition node. */
  fn: Node;
  random: () => number;
}

function findDef(root: Node, row: number): Node | undefined {
  const stack: Node[] = [root];
  while (stack.length > 0) {
    const node = stack.pop()!;
    if (node.startPosition.row === row) {
      if (node.type === 'function_definition') return node;
      if (node.type === 'decorated_definition') {
        const def = node.childForFieldName('definition');
        if (def?.type === 'function_definition') return def;
      }
    }
    for (const child of node.namedChildren) if (child && child.startPosition.row <= row && child.endPosition.row >= row) stack.push(child);
  }
  return undefined;
}

function descendants(node: Node, type: string): Node[] {
  return node.descendantsOfType(type).filter((n): n is Node => n !== null);
}

/** Start of the line that holds `index`. */
function lineStart(text: string, index: number): number {
  return text.lastIndexOf('\n', index - 1) + 1;
}

/** End of the line that holds `index`, after its line break. */
function lineEnd(text: string, index: number): number {
  const end = text.indexOf('\n', index);
  return end < 0 ? text.length : end + 1;
}

/** The statements of a block: its named children, comments left out. */
function statements(block: Node): Node[] {
  return block.namedChildren.filter((n): n is Node => n !== null && n.type !== 'comment');
}

/** A statement alone on its line (nothing but indentation before it, nothing but a comment after it). */
function ownLine(text: string, statement: Node): boolean {
  if (statement.startPosition.row !== statement.endPosition.row) return false;
  const before = text.slice(lineStart(text, statement.startIndex), statement.startIndex);
  const after = text.slice(statement.endIndex, lineEnd(text, statement.endIndex)).trim();
  return /^[ \t]*$/.test(before) && (after === '' || after.startsWith('#'));
}

const SIMPLE = new Set(['expression_statement', 'return_statement']);

function blocks(fn: Node): Node[] {
  return descendants(fn, 'block');
}

function layout(edit: PyEdit): Splice[] | string {
  const { text, fn } = edit;
  const edits: Splice[] = [];
  for (const comment of descendants(fn, 'comment')) {
    const start = lineStart(text, comment.startIndex);
    if (/^[ \t]*$/.test(text.slice(start, comment.startIndex))) {
      edits.push({ start, end: lineEnd(text, comment.endIndex), text: '' });
    } else {
      let from = comment.startIndex;
      while (from > 0 && (text[from - 1] === ' ' || text[from - 1] === '\t')) from--;
      edits.push({ start: from, end: comment.endIndex, text: '' });
    }
  }
  const body = fn.childForFieldName('body');
  let step = 0;
  for (const statement of body ? statements(body) : []) {
    const start = lineStart(text, statement.startIndex);
    const indent = text.slice(start, statement.startIndex);
    if (!/^[ \t]*$/.test(indent)) continue;
    edits.push({ start, end: start, text: `\n${indent}# step ${++step}\n` });
  }
  return edits.length === 0 ? 'nothing to re-lay out' : edits;
}

/** Names bound in the function: parameters, assignment and loop targets. */
function localNames(fn: Node): Set<string> {
  const names = new Set<string>();
  const parameters = fn.childForFieldName('parameters');
  for (const param of parameters?.namedChildren ?? []) {
    if (!param) continue;
    const id = param.type === 'identifier' ? param : (param.childForFieldName('name') ?? param.namedChildren.find((c) => c?.type === 'identifier'));
    if (id?.type === 'identifier') names.add(id.text);
  }
  for (const type of ['assignment', 'augmented_assignment', 'for_statement']) {
    for (const node of descendants(fn, type)) {
      const left = node.childForFieldName('left');
      if (!left) continue;
      if (left.type === 'identifier') names.add(left.text);
      else for (const id of descendants(left, 'identifier')) if (id.parent === left || id.parent?.type === 'pattern_list' || id.parent?.type === 'tuple_pattern') names.add(id.text);
    }
  }
  names.delete('self');
  names.delete('cls');
  return names;
}

/** Identifier nodes that use a name as a variable (not `x.name`, not `f(name=…)`). */
function variableUses(fn: Node): Map<string, Node[]> {
  const uses = new Map<string, Node[]>();
  const own = fn.childForFieldName('name');
  for (const id of descendants(fn, 'identifier')) {
    const parent = id.parent;
    if (own && id.equals(own)) continue;
    if (parent?.type === 'attribute' && parent.childForFieldName('attribute')?.equals(id)) continue;
    if (parent?.type === 'keyword_argument' && parent.childForFieldName('name')?.equals(id)) continue;
    const list = uses.get(id.text);
    if (list) list.push(id);
    else uses.set(id.text, [id]);
  }
  return uses;
}

const NEW_NAMES = ['entry', 'record', 'payload', 'cursor', 'holder', 'subject', 'marker', 'tally', 'ledger', 'cargo'];

function freshName(taken: Set<string>, random: () => number): string {
  const start = Math.floor(random() * NEW_NAMES.length);
  for (let round = 0; ; round++) {
    for (let i = 0; i < NEW_NAMES.length; i++) {
      const name = NEW_NAMES[(start + i) % NEW_NAMES.length]! + (round === 0 ? '' : `_${round + 1}`);
      if (!taken.has(name)) {
        taken.add(name);
        return name;
      }
    }
  }
}

function rename(edit: PyEdit, most: number): Splice[] | string {
  const uses = variableUses(edit.fn);
  const taken = new Set(descendants(edit.fn, 'identifier').map((n) => n.text));
  const minUses = most === 1 ? 2 : 1;
  const names = [...localNames(edit.fn)].filter((n) => (uses.get(n)?.length ?? 0) >= minUses).sort();
  if (most === 1 && names.length === 0) return 'no local variable used twice';
  if (most > 1 && names.length < 2) return 'fewer than two local variables';
  const chosen = most === 1 ? [pick(names, edit.random)] : names;
  return chosen.flatMap((name) => {
    const to = freshName(taken, edit.random);
    return uses.get(name)!.map((node) => ({ start: node.startIndex, end: node.endIndex, text: to }));
  });
}

const WORDS = ['pending', 'ready', 'railhead', 'consignee', 'siding', 'wagon'];

function literals(edit: PyEdit, most: number): Splice[] | string {
  const candidates = [
    ...descendants(edit.fn, 'integer'),
    // Plain one-line strings only: prefixes (b'', f'') and interpolations keep their own rules.
    ...descendants(edit.fn, 'string').filter((s) => /^(['"])[^'"\n\\]*\1$/.test(s.text)),
  ];
  if (candidates.length === 0) return 'no plain number or string literal';
  return pickSome(candidates, most, edit.random).map((node) => {
    if (node.type === 'integer') {
      const value = /^\d+$/.test(node.text) ? Number(node.text) : 0;
      return { start: node.startIndex, end: node.endIndex, text: String(value + 1 + Math.floor(edit.random() * 9)) };
    }
    const quote = node.text[0]!;
    const value = node.text.slice(1, -1);
    return { start: node.startIndex, end: node.endIndex, text: `${quote}${WORDS.find((w) => w !== value) ?? 'edited'}${quote}` };
  });
}

function insert(edit: PyEdit, count: number): Splice[] | string {
  const { text, fn, random } = edit;
  const slots = blocks(fn).flatMap((block) => statements(block).filter((s) => ownLine(text, s) || s.startPosition.row !== s.endPosition.row));
  const anchors = slots.filter((s) => /^[ \t]*$/.test(text.slice(lineStart(text, s.startIndex), s.startIndex)));
  if (anchors.length === 0) return 'no statement to insert before';
  const names = [...localNames(fn)].sort();
  const taken = new Set(descendants(fn, 'identifier').map((n) => n.text));
  const edits: Splice[] = [];
  for (let i = 0; i < count; i++) {
    const anchor = pick(anchors, random);
    const start = lineStart(text, anchor.startIndex);
    const indent = text.slice(start, anchor.startIndex);
    const v = names.length > 0 ? pick(names, random) : 'value';
    const step = indent.includes('\t') ? '\t' : '    ';
    const menu = [
      () => `log.debug("checkpoint %s", ${v})`,
      () => `${freshName(taken, random)} = ${v} + 1`,
      () => 'stats["count"] += 1',
      () => `assert ${v} is not None, "input"`,
      () => `if ${v} is None:\n${indent}${step}raise ValueError("missing value")`,
    ];
    edits.push({ start, end: start, text: `${indent}${pick(menu, random)()}\n` });
  }
  // Insertions at one place keep their order of drawing.
  const merged = new Map<number, string>();
  for (const e of edits) merged.set(e.start, (merged.get(e.start) ?? '') + e.text);
  return [...merged].map(([start, inserted]) => ({ start, end: start, text: inserted }));
}

function simpleStatements(edit: PyEdit): Array<{ block: Node; index: number; statement: Node }> {
  const out: Array<{ block: Node; index: number; statement: Node }> = [];
  for (const block of blocks(edit.fn)) {
    const list = statements(block);
    list.forEach((statement, index) => {
      if (SIMPLE.has(statement.type) && ownLine(edit.text, statement)) out.push({ block, index, statement });
    });
  }
  return out;
}

function remove(edit: PyEdit): Splice[] | string {
  // A block must keep one statement, or it is not Python any more.
  const candidates = simpleStatements(edit).filter(({ block }) => statements(block).length >= 2);
  if (candidates.length === 0) return 'no single-line statement in a block of two or more';
  const { statement } = pick(candidates, edit.random);
  return [{ start: lineStart(edit.text, statement.startIndex), end: lineEnd(edit.text, statement.endIndex), text: '' }];
}

function readsAndWrites(statement: Node): { reads: Set<string>; writes: Set<string> } {
  const reads = new Set(descendants(statement, 'identifier').map((n) => n.text));
  const writes = new Set<string>();
  for (const type of ['assignment', 'augmented_assignment']) {
    for (const node of [...descendants(statement, type), ...(statement.namedChildren[0]?.type === type ? [statement.namedChildren[0]] : [])]) {
      const left = node?.childForFieldName('left');
      if (!left) continue;
      let root: Node | null = left;
      while (root && (root.type === 'attribute' || root.type === 'subscript')) root = root.namedChildren[0] ?? null;
      if (root?.type === 'identifier') writes.add(root.text);
      for (const id of descendants(left, 'identifier')) if (left.type === 'pattern_list' || left.type === 'tuple_pattern') writes.add(id.text);
    }
  }
  return { reads, writes };
}

function reorder(edit: PyEdit): Splice[] | string {
  const { text } = edit;
  const pairs: Array<[Node, Node]> = [];
  for (const block of blocks(edit.fn)) {
    const list = statements(block);
    for (let i = 0; i + 1 < list.length; i++) {
      const [a, b] = [list[i]!, list[i + 1]!];
      if (a.type !== 'expression_statement' || b.type !== 'expression_statement' || !ownLine(text, a) || !ownLine(text, b)) continue;
      if (b.startPosition.row !== a.endPosition.row + 1 || a.text === b.text) continue;
      const ra = readsAndWrites(a);
      const rb = readsAndWrites(b);
      const touches = (x: Set<string>, y: Set<string>) => [...x].some((n) => y.has(n));
      if (touches(ra.writes, rb.reads) || touches(rb.writes, ra.reads)) continue;
      pairs.push([a, b]);
    }
  }
  if (pairs.length === 0) return 'no two adjacent independent statements';
  const [a, b] = pick(pairs, edit.random);
  const lineA = text.slice(lineStart(text, a.startIndex), lineEnd(text, a.endIndex));
  const lineB = text.slice(lineStart(text, b.startIndex), lineEnd(text, b.endIndex));
  const withBreak = (line: string) => (line.endsWith('\n') ? line : `${line}\n`);
  return [{ start: lineStart(text, a.startIndex), end: lineEnd(text, b.endIndex), text: withBreak(lineB) + (lineA.endsWith('\n') && !lineB.endsWith('\n') ? lineA.slice(0, -1) : lineA) }];
}
