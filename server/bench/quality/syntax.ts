/**
 * Babel syntax trees for the quality benchmark's JavaScript/TypeScript edits: parsing a planted
 * function (wrapped so it parses alone), walking its nodes, and the few questions the edit
 * operators ask of a node (is it a binding, a reference, a type, a simple statement).
 */
import { parse, parseExpression, type ParserPlugin } from '@babel/parser';

/** A Babel node as the edits see it: a type and any fields. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- Babel and recast nodes are read and written field by field across dozens of node types; every edited copy is re-parsed, which is the check
export type Node = { type: string; loc?: { start: { line: number; column: number }; end: { line: number; column: number } } } & Record<string, any>;

/** How a source is parsed: the same dialects the analyzer uses for the file's extension. */
export interface Dialect {
  typescript: boolean;
  jsx: boolean;
}

/**
 * A function cut out of its file, wrapped in just enough code to parse alone (a class for a
 * method, parentheses for a function expression); `line`/`column` (1-based line, 0-based column,
 * as Babel counts) is where the function itself starts inside `text`.
 */
export interface Snippet {
  text: string;
  line: number;
  column: number;
  dialect: Dialect;
}

/** The dialect of a path, by extension, as analyzers/languages/{javascript,typescript}.ts decide it. */
export function dialectForPath(path: string): Dialect {
  const lower = path.toLowerCase();
  const typescript = /\.[cm]?tsx?$/.test(lower);
  return { typescript, jsx: typescript ? lower.endsWith('.tsx') : true };
}

function plugins(dialect: Dialect): ParserPlugin[] {
  const list: ParserPlugin[] = dialect.typescript ? ['typescript', 'decorators-legacy'] : ['decorators-legacy'];
  if (dialect.jsx) list.push('jsx');
  return list;
}

/**
 * Parses strictly (no error recovery): a planted copy must be valid code, not code the analyzer
 * happens to recover from. Falls back to a sloppy-mode script like the analyzer does.
 * @throws the parser's error when the text is not valid in the dialect
 */
export function parseStrict(text: string, dialect: Dialect): Node {
  const options = {
    plugins: plugins(dialect),
    tokens: true,
    errorRecovery: false,
    allowReturnOutsideFunction: true,
    allowAwaitOutsideFunction: true,
    allowSuperOutsideMethod: true,
    allowUndeclaredExports: true,
    allowNewTargetOutsideFunction: true,
  } as const;
  try {
    return parse(text, { ...options, sourceType: 'module' }) as unknown as Node;
  } catch (error) {
    try {
      return parse(text, { ...options, sourceType: 'script' }) as unknown as Node;
    } catch {
      throw error;
    }
  }
}

/** A parser object for recast: Babel with tokens, in the snippet's dialect. */
export function recastParser(dialect: Dialect): { parse(source: string): Node } {
  return { parse: (source: string) => parseStrict(source, dialect) };
}

/** Parses one statement written by an edit, without locations (so recast prints it fresh). */
export function newStatement(code: string): Node {
  const program = parse(code, { sourceType: 'module', allowReturnOutsideFunction: true }).program as unknown as Node;
  return stripLocations(program.body[0] as Node);
}

/** Parses one expression written by an edit, without locations. */
export function newExpression(code: string): Node {
  return stripLocations(parseExpression(code) as unknown as Node);
}

/** Removes position data in place, so a printer treats the node as new. */
export function stripLocations<T>(node: T): T {
  if (Array.isArray(node)) {
    for (const item of node) stripLocations(item);
  } else if (node && typeof node === 'object') {
    const record = node as Record<string, unknown>;
    delete record.loc;
    delete record.start;
    delete record.end;
    delete record.range;
    delete record.leadingComments;
    delete record.trailingComments;
    delete record.innerComments;
    delete record.comments;
    for (const key of Object.keys(record)) stripLocations(record[key]);
  }
  return node;
}

const NOT_CHILDREN = new Set([
  'type', 'loc', 'start', 'end', 'range', 'extra', 'comments', 'leadingComments', 'trailingComments',
  'innerComments', 'original', 'tokens', 'errors',
]);

/** Node types that hold values although TypeScript-only; every other `TS…` node is a type. */
const TS_VALUE_NODES = new Set([
  'TSAsExpression', 'TSSatisfiesExpression', 'TSNonNullExpression', 'TSParameterProperty',
  'TSTypeAssertion', 'TSInstantiationExpression', 'TSExportAssignment',
]);

/** Whether a node exists only for the type checker (the analyzer drops its tokens). */
export function isTypeOnly(node: Node): boolean {
  return node.type.startsWith('TS') && !TS_VALUE_NODES.has(node.type);
}

/** Whether a value is a syntax tree node (an object with a string `type`). */
export function isNode(value: unknown): value is Node {
  return typeof value === 'object' && value !== null && typeof (value as { type?: unknown }).type === 'string';
}

/** Where a node sits: its parent, the key of the parent that holds it, and the index in an array key. */
export interface Place {
  parent: Node | undefined;
  key: string | undefined;
  index: number | undefined;
}

/**
 * Visits `root` and its descendants in source order. `visit` returns false to skip a node's
 * children. Type-only subtrees are skipped unless `types` is set.
 */
export function walk(root: Node, visit: (node: Node, place: Place) => boolean | void, types = false): void {
  const stack: Array<[Node, Place]> = [[root, { parent: undefined, key: undefined, index: undefined }]];
  while (stack.length > 0) {
    const [node, place] = stack.pop()!;
    if (!types && isTypeOnly(node)) continue;
    if (visit(node, place) === false) continue;
    const keys = Object.keys(node).filter((k) => !NOT_CHILDREN.has(k));
    for (let k = keys.length - 1; k >= 0; k--) {
      const key = keys[k]!;
      const value = node[key];
      if (Array.isArray(value)) {
        for (let i = value.length - 1; i >= 0; i--) if (isNode(value[i])) stack.push([value[i], { parent: node, key, index: i }]);
      } else if (isNode(value)) {
        stack.push([value, { parent: node, key, index: undefined }]);
      }
    }
  }
}

/** Function node types that become fragments (analyzers/languages/babel.ts). */
export const FUNCTION_TYPES = new Set([
  'FunctionDeclaration', 'FunctionExpression', 'ArrowFunctionExpression', 'ObjectMethod', 'ClassMethod', 'ClassPrivateMethod',
]);

/** The function that starts at the snippet's position. */
export function findFunction(root: Node, snippet: Pick<Snippet, 'line' | 'column'>): Node | undefined {
  let found: Node | undefined;
  walk(root, (node) => {
    if (found) return false;
    if (FUNCTION_TYPES.has(node.type) && node.loc?.start.line === snippet.line && node.loc.start.column === snippet.column) {
      found = node;
      return false;
    }
    return true;
  });
  return found;
}

/**
 * Whether an Identifier at this place is a name that is not a variable: a property after `.`,
 * a non-computed key, a label, an import/export name, a meta property.
 */
export function isPropertyName(place: Place): boolean {
  const { parent, key } = place;
  if (!parent) return false;
  switch (parent.type) {
    case 'MemberExpression':
    case 'OptionalMemberExpression':
      return key === 'property' && !parent.computed;
    case 'ObjectProperty':
    case 'ObjectMethod':
    case 'ClassProperty':
    case 'ClassMethod':
    case 'ClassPrivateProperty':
    case 'ClassAccessorProperty':
    case 'ClassPrivateMethod':
      return key === 'key' && !parent.computed;
    case 'LabeledStatement':
    case 'BreakStatement':
    case 'ContinueStatement':
    case 'MetaProperty':
    case 'ImportSpecifier':
    case 'ImportDefaultSpecifier':
    case 'ImportNamespaceSpecifier':
    case 'ExportSpecifier':
      return true;
    default:
      return false;
  }
}

/** The variables of a function: every occurrence of a name used as a variable, by name. */
export interface Variables {
  /** Name → the Identifier nodes that use it as a variable (declarations and references). */
  occurrences: Map<string, Node[]>;
  /** Names declared inside the function (parameters, declarations, catch parameters, inner functions and classes). */
  declared: Set<string>;
  /** Names that appear in a shorthand property (`{ x }`): renaming them would change the tokens around them. */
  shorthand: Set<string>;
  /** Every identifier-like name anywhere in the snippet, properties too: new names avoid them. */
  taken: Set<string>;
}

/** Collects the variables of `fn` (and of the functions inside it). */
export function variablesOf(fn: Node, root: Node): Variables {
  const occurrences = new Map<string, Node[]>();
  const declared = new Set<string>();
  const shorthand = new Set<string>();
  const taken = new Set<string>();
  walk(root, (node) => {
    if (node.type === 'Identifier' || node.type === 'JSXIdentifier' || node.type === 'PrivateName') {
      const name = node.type === 'PrivateName' ? String(node.id?.name) : String(node.name);
      taken.add(name);
    }
  }, true);
  walk(fn, (node, place) => {
    if (FUNCTION_TYPES.has(node.type)) {
      for (const param of node.params as Node[]) for (const name of patternNames(param)) declared.add(name);
      if (node !== fn && node.type === 'FunctionDeclaration' && node.id) declared.add(String(node.id.name));
    }
    if (node.type === 'VariableDeclarator') for (const name of patternNames(node.id)) declared.add(name);
    if (node.type === 'CatchClause' && node.param) for (const name of patternNames(node.param)) declared.add(name);
    if (node.type === 'ClassDeclaration' && node.id) declared.add(String(node.id.name));
    if (node.type === 'ObjectProperty' && node.shorthand && isNode(node.value)) {
      for (const name of patternNames(node.value)) shorthand.add(name);
    }
    if (node.type === 'Identifier' && !isPropertyName(place) && node !== fn.id) {
      const name = String(node.name);
      const list = occurrences.get(name);
      if (list) list.push(node);
      else occurrences.set(name, [node]);
    }
  });
  return { occurrences, declared, shorthand, taken };
}

/** The names a binding pattern declares. */
export function patternNames(pattern: Node | null | undefined): string[] {
  if (!pattern) return [];
  switch (pattern.type) {
    case 'Identifier':
      return [String(pattern.name)];
    case 'AssignmentPattern':
      return patternNames(pattern.left);
    case 'RestElement':
      return patternNames(pattern.argument);
    case 'TSParameterProperty':
      return patternNames(pattern.parameter);
    case 'ArrayPattern':
      return (pattern.elements as Array<Node | null>).flatMap((element) => patternNames(element));
    case 'ObjectPattern':
      return (pattern.properties as Node[]).flatMap((property) =>
        property.type === 'RestElement' ? patternNames(property) : patternNames(property.value),
      );
    default:
      return [];
  }
}

/** A statement list inside the function: a block's body or a switch case's statements. */
export type StatementList = Node[];

/** Every statement list in `fn`, the function's own body first. */
export function statementLists(fn: Node): StatementList[] {
  const lists: StatementList[] = [];
  walk(fn, (node) => {
    if (node.type === 'BlockStatement' || node.type === 'StaticBlock') lists.push(node.body as Node[]);
    else if (node.type === 'SwitchCase') lists.push(node.consequent as Node[]);
  });
  return lists;
}

const SIMPLE_STATEMENTS = new Set(['ExpressionStatement', 'VariableDeclaration', 'ReturnStatement', 'ThrowStatement']);

/**
 * A statement a person would call one line of code: an expression, a declaration, a return or a
 * throw on a single line, with no function inside it.
 */
export function isSimpleStatement(node: Node): boolean {
  if (!SIMPLE_STATEMENTS.has(node.type) || !node.loc || node.loc.start.line !== node.loc.end.line) return false;
  let hasFunction = false;
  walk(node, (inner) => {
    if (FUNCTION_TYPES.has(inner.type)) hasFunction = true;
    return !hasFunction;
  });
  return !hasFunction;
}

/** The variables a statement reads (every variable occurrence) and writes (declares or assigns). */
export function readsAndWrites(statement: Node): { reads: Set<string>; writes: Set<string> } {
  const reads = new Set<string>();
  const writes = new Set<string>();
  walk(statement, (node, place) => {
    if (node.type === 'Identifier' && !isPropertyName(place)) reads.add(String(node.name));
    if (node.type === 'VariableDeclarator') for (const name of patternNames(node.id)) writes.add(name);
    if (node.type === 'AssignmentExpression') for (const name of rootNames(node.left)) writes.add(name);
    if (node.type === 'UpdateExpression') for (const name of rootNames(node.argument)) writes.add(name);
  });
  return { reads, writes };
}

/** The variable at the root of an assignment target: `a` for `a`, `a.b.c`, `a[i]`; pattern names for destructuring. */
function rootNames(target: Node): string[] {
  let node = target;
  while (node.type === 'MemberExpression' || node.type === 'OptionalMemberExpression' || node.type === 'TSNonNullExpression') {
    node = node.type === 'TSNonNullExpression' ? node.expression : node.object;
  }
  if (node.type === 'Identifier') return [String(node.name)];
  return patternNames(node);
}
