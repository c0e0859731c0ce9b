/**
 * The language-neutral form of the generated code: a module is a list of record types and
 * functions, a function a list of statements. The printers (print/) write it as TypeScript,
 * Python or Java; the story edits it (renames, fixes, copies) before printing.
 * Names are written in camelCase here; each printer applies its language's case.
 */

export type Scalar = 'num' | 'int' | 'str' | 'bool';

export type Type =
  | { kind: 'scalar'; name: Scalar }
  | { kind: 'record'; name: string }
  | { kind: 'list'; of: Type }
  | { kind: 'optional'; of: Type }
  /** string → whole number */
  | { kind: 'counts' }
  | { kind: 'void' };

export type BinaryOperator = '+' | '-' | '*' | '/' | '<' | '<=' | '>' | '>=';

export type Expr =
  | { e: 'var'; name: string }
  | { e: 'field'; of: Expr; field: string }
  | { e: 'num'; value: number }
  | { e: 'int'; value: number }
  | { e: 'str'; value: string }
  | { e: 'bool'; value: boolean }
  | { e: 'null' }
  | { e: 'binary'; op: BinaryOperator; left: Expr; right: Expr }
  /** equality; `strings` because Java compares strings with equals() */
  | { e: 'equals'; left: Expr; right: Expr; negate: boolean; strings: boolean }
  | { e: 'and' | 'or'; items: Expr[] }
  | { e: 'not'; of: Expr }
  /** a function of the same module */
  | { e: 'call'; name: string; args: Expr[] }
  | { e: 'lib'; fn: 'round2' | 'max' | 'min' | 'abs'; args: Expr[] }
  | { e: 'length'; of: Expr }
  | { e: 'blank'; of: Expr }
  /** one of a few string constants */
  | { e: 'oneOf'; item: Expr; values: string[] }
  /** text built from pieces: literal strings and values */
  | { e: 'concat'; parts: Expr[] }
  /** a new value of a record type declared in the module, its fields in declaration order */
  | { e: 'new'; type: string; fields: Expr[] }
  | { e: 'countOf'; map: string; key: Expr }
  | { e: 'choose'; test: Expr; then: Expr; else: Expr }
  /** the values of the items of a list that pass a test (a filter and a map) */
  | { e: 'pluck'; list: Expr; item: string; test: Expr; value: Expr }
  /** whether any item of a list passes a test */
  | { e: 'some'; list: Expr; item: string; test: Expr }
  /** a text operation; `join` joins a list of texts with `arg` between them */
  | { e: 'text'; op: 'upper' | 'trim' | 'startsWith' | 'join'; of: Expr; arg?: Expr };

export type Stmt =
  | { s: 'let'; name: string; type: Type; value: Expr }
  | { s: 'newList'; name: string; of: Type }
  | { s: 'newCounts'; name: string }
  | { s: 'set'; name: string; value: Expr }
  | { s: 'update'; name: string; op: '+' | '-' | '*'; value: Expr }
  | { s: 'push'; list: string; value: Expr }
  | { s: 'tally'; map: string; key: Expr; amount: Expr }
  | { s: 'if'; test: Expr; then: Stmt[]; else?: Stmt[] }
  | { s: 'for'; item: string; itemType: Type; list: Expr; body: Stmt[] }
  | { s: 'return'; value?: Expr }
  | { s: 'fail'; message: Expr }
  | { s: 'continue' }
  | { s: 'break' }
  /** a line in the module's log: a message and up to three values */
  | { s: 'log'; level: 'info' | 'warn'; message: string; values: Expr[] };

export interface Param {
  name: string;
  type: Type;
}

/** How one function is written: habits that differ from one author to another. */
export interface Style {
  /** TypeScript and Java: a one-line `if` without braces */
  bracelessIf: boolean;
  /** loops over indexes rather than items */
  indexLoop: boolean;
  /** `total = total + x` rather than `total += x` */
  longUpdate: boolean;
  /** the constant first in comparisons (`90 < x.load`) */
  constantFirst: boolean;
}

export interface FunctionDecl {
  name: string;
  style: Style;
  params: Param[];
  returns: Type;
  body: Stmt[];
  /** one line saying what it is for, printed as the language's doc comment */
  doc: string;
}

export interface RecordField {
  name: string;
  type: Type;
}

export interface RecordDecl {
  name: string;
  fields: RecordField[];
}

/** One source file: its own result records and its functions, over the repository's model records. */
export interface Module {
  /** path without extension, words separated by '/' and '-' (`tariffs/domestic-charges`) */
  name: string;
  doc: string;
  records: RecordDecl[];
  functions: FunctionDecl[];
}

export const scalar = (name: Scalar): Type => ({ kind: 'scalar', name });
export const record = (name: string): Type => ({ kind: 'record', name });
export const listOf = (of: Type): Type => ({ kind: 'list', of });
export const v = (name: string): Expr => ({ e: 'var', name });
export const f = (of: Expr | string, field: string): Expr => ({ e: 'field', of: typeof of === 'string' ? v(of) : of, field });
export const str = (value: string): Expr => ({ e: 'str', value });
export const int = (value: number): Expr => ({ e: 'int', value });
export const num = (value: number): Expr => ({ e: 'num', value });
export const bin = (op: BinaryOperator, left: Expr, right: Expr): Expr => ({ e: 'binary', op, left, right });
export const eq = (left: Expr, right: Expr, strings: boolean, negate = false): Expr => ({ e: 'equals', left, right, strings, negate });

/** A deep copy, for edits that must not touch the original. */
export function cloneModule(module: Module): Module {
  return structuredClone(module);
}
