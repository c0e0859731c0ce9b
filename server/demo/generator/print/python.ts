/** Prints a module as Python: dataclasses for its records, functions with type hints, models from the package. */
import type { Entity } from '../domain';
import type { Expr, FunctionDecl, Module, RecordDecl, Stmt, Style, Type } from '../ir';
import { anyStatement, constantFirst, precedence, recordsUsed, snake, wrap } from './common';

const quote = (s: string) => `"${s.replace(/\\/g, '\\\\').replace(/"/g, '\\"')}"`;

function typeText(t: Type): string {
  switch (t.kind) {
    case 'scalar':
      return { num: 'float', int: 'int', str: 'str', bool: 'bool' }[t.name];
    case 'record':
      return t.name;
    case 'list':
      return `list[${typeText(t.of)}]`;
    case 'optional':
      return `${typeText(t.of)} | None`;
    case 'counts':
      return 'dict[str, int]';
    case 'void':
      return 'None';
  }
}

const number = (value: number) => (Number.isInteger(value) ? `${value}.0` : String(value));

/** The style of the function being printed. */
let style: Style = { bracelessIf: false, indexLoop: false, longUpdate: false, constantFirst: false };

function expr(x: Expr, records: Map<string, RecordDecl>): string {
  if (style.constantFirst) x = constantFirst(x);
  const sub = (y: Expr, needed: number) => wrap(expr(y, records), y, needed);
  const p = precedence(x);
  switch (x.e) {
    case 'var':
      return snake(x.name);
    case 'field':
      return `${sub(x.of, 9)}.${snake(x.field)}`;
    case 'num':
      return number(x.value);
    case 'int':
      return String(x.value);
    case 'str':
      return quote(x.value);
    case 'bool':
      return x.value ? 'True' : 'False';
    case 'null':
      return 'None';
    case 'binary':
      return `${sub(x.left, p)} ${x.op} ${sub(x.right, p + 0.5)}`;
    case 'equals':
      return `${sub(x.left, 3.5)} ${x.negate ? '!=' : '=='} ${sub(x.right, 3.5)}`;
    case 'and':
    case 'or':
      return x.items.map((y) => sub(y, p + 0.5)).join(` ${x.e} `);
    case 'not':
      if (x.of.e === 'oneOf') return `${sub(x.of.item, 4)} not in (${x.of.values.map(quote).join(', ')})`;
      return `not ${sub(x.of, 6)}`;
    case 'call':
      return `${snake(x.name)}(${x.args.map((y) => expr(y, records)).join(', ')})`;
    case 'lib':
      if (x.fn === 'round2') return `round(${expr(x.args[0], records)}, 2)`;
      return `${x.fn}(${x.args.map((y) => expr(y, records)).join(', ')})`;
    case 'length':
      return `len(${expr(x.of, records)})`;
    case 'blank':
      return `not ${sub(x.of, 9)}.strip()`;
    case 'oneOf':
      return `${sub(x.item, 4)} in (${x.values.map(quote).join(', ')})`;
    case 'concat':
      if (x.parts.length === 1 && x.parts[0].e === 'str') return quote(x.parts[0].value);
      return 'f"' + x.parts.map((y) => (y.e === 'str' ? y.value.replace(/[{}]/g, '$&$&').replace(/"/g, '\\"') : `{${expr(y, records)}}`)).join('') + '"';
    case 'new': {
      const decl = records.get(x.type)!;
      if (decl.fields.length !== x.fields.length) throw new Error(JSON.stringify({ decl, x }));
      return `${x.type}(${decl.fields.map((d, i) => `${snake(d.name)}=${expr(x.fields[i], records)}`).join(', ')})`;
    }
    case 'countOf':
      return `${snake(x.map)}.get(${expr(x.key, records)}, 0)`;
    case 'choose':
      return `${sub(x.then, 1)} if ${sub(x.test, 1)} else ${sub(x.else, 1)}`;
    case 'pluck':
      return `[${expr(x.value, records)} for ${snake(x.item)} in ${expr(x.list, records)} if ${expr(x.test, records)}]`;
    case 'some':
      return `any(${expr(x.test, records)} for ${snake(x.item)} in ${expr(x.list, records)})`;
    case 'text':
      if (x.op === 'join') return `${expr(x.arg!, records)}.join(${expr(x.of, records)})`;
      return x.op === 'upper' ? `${sub(x.of, 9)}.upper()` : x.op === 'trim' ? `${sub(x.of, 9)}.strip()` : `${sub(x.of, 9)}.startswith(${expr(x.arg!, records)})`;
  }
}

function statements(body: Stmt[], indent: string, records: Map<string, RecordDecl>): string[] {
  const e = (x: Expr) => expr(x, records);
  const lines: string[] = [];
  for (const s of body) {
    switch (s.s) {
      case 'let':
        lines.push(`${indent}${snake(s.name)}${s.value.e === 'null' ? `: ${typeText(s.type)} | None` : ''} = ${e(s.value)}`);
        break;
      case 'newList':
        lines.push(`${indent}${snake(s.name)}: list[${typeText(s.of)}] = []`);
        break;
      case 'newCounts':
        lines.push(`${indent}${snake(s.name)}: dict[str, int] = {}`);
        break;
      case 'set':
        lines.push(`${indent}${snake(s.name)} = ${e(s.value)}`);
        break;
      case 'update': {
        const name = snake(s.name);
        lines.push(style.longUpdate ? `${indent}${name} = ${name} ${s.op} ${wrap(e(s.value), s.value, s.op === '*' ? 5.5 : 4.5)}` : `${indent}${name} ${s.op}= ${e(s.value)}`);
        break;
      }
      case 'push':
        lines.push(`${indent}${snake(s.list)}.append(${e(s.value)})`);
        break;
      case 'tally': {
        const map = snake(s.map);
        lines.push(`${indent}${map}[${e(s.key)}] = ${map}.get(${e(s.key)}, 0) + ${e(s.amount)}`);
        break;
      }
      case 'if': {
        lines.push(`${indent}if ${e(s.test)}:`, ...statements(s.then, indent + '    ', records));
        if (s.else) lines.push(`${indent}else:`, ...statements(s.else, indent + '    ', records));
        break;
      }
      case 'for':
        if (style.indexLoop) {
          const list = e(s.list);
          lines.push(`${indent}for index in range(len(${list})):`, `${indent}    ${snake(s.item)} = ${list}[index]`);
        } else {
          lines.push(`${indent}for ${snake(s.item)} in ${e(s.list)}:`);
        }
        lines.push(...statements(s.body, indent + '    ', records));
        break;
      case 'return':
        lines.push(`${indent}return${s.value ? ' ' + e(s.value) : ''}`);
        break;
      case 'fail':
        lines.push(`${indent}raise ValueError(${e(s.message)})`);
        break;
      case 'continue':
      case 'break':
        lines.push(`${indent}${s.s}`);
        break;
      case 'log':
        lines.push(`${indent}log.${s.level === 'warn' ? 'warning' : 'info'}(${[quote(s.message + ' %s'.repeat(s.values.length)), ...s.values.map(e)].join(', ')})`);
        break;
    }
  }
  return lines;
}

function fn(decl: FunctionDecl, records: Map<string, RecordDecl>): string {
  style = decl.style;
  const params = decl.params.map((p) => `${snake(p.name)}: ${typeText(p.type)}`).join(', ');
  return [`def ${snake(decl.name)}(${params}) -> ${typeText(decl.returns)}:`, `    """${decl.doc}"""`, ...statements(decl.body, '    ', records)].join('\n');
}

/** The module's text; `modelModule` is the dotted name of the package's model module. */
export function printPython(module: Module, modelModule: string): string {
  const records = new Map(module.records.map((r) => [r.name, r]));
  const used = recordsUsed(module);
  const head = [`"""${module.doc}"""`];
  const logs = anyStatement(module, (s) => s.s === 'log');
  const imports = ['from __future__ import annotations', ''];
  if (logs) imports.push('import logging');
  if (module.records.length) imports.push('from dataclasses import dataclass');
  if (used.length) imports.push('', `from ${modelModule} import ${used.join(', ')}`);
  if (logs) imports.push('', 'log = logging.getLogger(__name__)');
  const parts = [`${head.join('\n')}\n\n${imports.join('\n').replace(/\n\n$/, '')}`];
  for (const r of module.records) {
    parts.push(`@dataclass(frozen=True)\nclass ${r.name}:\n${r.fields.map((x) => `    ${snake(x.name)}: ${typeText(x.type)}`).join('\n')}`);
  }
  for (const decl of module.functions) parts.push(fn(decl, records));
  return parts.join('\n\n\n') + '\n';
}

export function printPythonModel(entities: Entity[]): string {
  const blocks = entities.map(
    (x) => `@dataclass\nclass ${x.name}:\n${x.fields.map((y) => `    ${snake(y.name)}: ${typeText({ kind: 'scalar', name: y.type })}`).join('\n')}`,
  );
  return `"""The records every module of this package passes around."""\n\nfrom dataclasses import dataclass\n\n\n${blocks.join('\n\n\n')}\n`;
}
