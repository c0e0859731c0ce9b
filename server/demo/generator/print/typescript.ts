/** Prints a module as TypeScript: interfaces for its records, exported functions, types from `model`. */
import type { Entity } from '../domain';
import type { Expr, FunctionDecl, Module, RecordDecl, Stmt, Style, Type } from '../ir';
import { anyStatement, constantFirst, simpleStatement, precedence, recordsUsed, reassigned, wrap } from './common';

const quote = (s: string) => `'${s.replace(/\\/g, '\\\\').replace(/'/g, "\\'")}'`;

export function typeText(t: Type): string {
  switch (t.kind) {
    case 'scalar':
      return { num: 'number', int: 'number', str: 'string', bool: 'boolean' }[t.name];
    case 'record':
      return t.name;
    case 'list':
      return `${typeText(t.of)}[]`;
    case 'optional':
      return `${typeText(t.of)} | undefined`;
    case 'counts':
      return 'Map<string, number>';
    case 'void':
      return 'void';
  }
}

/** The style of the function being printed. */
let style: Style = { bracelessIf: false, indexLoop: false, longUpdate: false, constantFirst: false };

function expr(x: Expr, records: Map<string, RecordDecl>): string {
  if (style.constantFirst) x = constantFirst(x);
  const sub = (y: Expr, needed: number) => wrap(expr(y, records), y, needed);
  const p = precedence(x);
  switch (x.e) {
    case 'var':
      return x.name;
    case 'field':
      return `${sub(x.of, 9)}.${x.field}`;
    case 'num':
    case 'int':
      return String(x.value);
    case 'str':
      return quote(x.value);
    case 'bool':
      return String(x.value);
    case 'null':
      return 'undefined';
    case 'binary':
      return `${sub(x.left, p)} ${x.op} ${sub(x.right, p + 0.5)}`;
    case 'equals':
      return `${sub(x.left, 3.5)} ${x.negate ? '!==' : '==='} ${sub(x.right, 3.5)}`;
    case 'and':
    case 'or':
      return x.items.map((y) => sub(y, p + 0.5)).join(x.e === 'and' ? ' && ' : ' || ');
    case 'not':
      return `!${sub(x.of, 9)}`;
    case 'call':
      return `${x.name}(${x.args.map((y) => expr(y, records)).join(', ')})`;
    case 'lib':
      if (x.fn === 'round2') return `Math.round(${sub(x.args[0], 5)} * 100) / 100`;
      return `Math.${x.fn}(${x.args.map((y) => expr(y, records)).join(', ')})`;
    case 'length':
      return `${sub(x.of, 9)}.length`;
    case 'blank':
      return `!${sub(x.of, 9)}.trim()`;
    case 'oneOf':
      return `[${x.values.map(quote).join(', ')}].includes(${expr(x.item, records)})`;
    case 'concat':
      if (x.parts.length === 1 && x.parts[0].e === 'str') return quote(x.parts[0].value);
      return '`' + x.parts.map((y) => (y.e === 'str' ? y.value.replace(/[`$\\]/g, '\\$&') : `\${${expr(y, records)}}`)).join('') + '`';
    case 'new': {
      const decl = records.get(x.type)!;
      const fields = decl.fields.map((d, i) => {
        const value = x.fields[i];
        return value.e === 'var' && value.name === d.name ? d.name : `${d.name}: ${expr(value, records)}`;
      });
      return `{ ${fields.join(', ')} }`;
    }
    case 'countOf':
      return `(${x.map}.get(${expr(x.key, records)}) ?? 0)`;
    case 'choose':
      return `${sub(x.test, 1)} ? ${sub(x.then, 1)} : ${sub(x.else, 1)}`;
    case 'pluck':
      return `${sub(x.list, 9)}.filter((${x.item}) => ${expr(x.test, records)}).map((${x.item}) => ${expr(x.value, records)})`;
    case 'some':
      return `${sub(x.list, 9)}.some((${x.item}) => ${expr(x.test, records)})`;
    case 'text':
      if (x.op === 'join') return `${sub(x.of, 9)}.join(${expr(x.arg!, records)})`;
      return x.op === 'upper' ? `${sub(x.of, 9)}.toUpperCase()` : x.op === 'trim' ? `${sub(x.of, 9)}.trim()` : `${sub(x.of, 9)}.startsWith(${expr(x.arg!, records)})`;
  }
}

function statements(body: Stmt[], indent: string, mutable: Set<string>, records: Map<string, RecordDecl>): string[] {
  const e = (x: Expr) => expr(x, records);
  const lines: string[] = [];
  for (const s of body) {
    switch (s.s) {
      case 'let': {
        const annotate = s.value.e === 'null';
        lines.push(`${indent}${mutable.has(s.name) ? 'let' : 'const'} ${s.name}${annotate ? `: ${typeText(s.type)}` : ''} = ${e(s.value)};`);
        break;
      }
      case 'newList':
        lines.push(`${indent}const ${s.name}: ${typeText(s.of)}[] = [];`);
        break;
      case 'newCounts':
        lines.push(`${indent}const ${s.name} = new Map<string, number>();`);
        break;
      case 'set':
        lines.push(`${indent}${s.name} = ${e(s.value)};`);
        break;
      case 'update':
        lines.push(style.longUpdate ? `${indent}${s.name} = ${s.name} ${s.op} ${wrap(e(s.value), s.value, s.op === '*' ? 5.5 : 4.5)};` : `${indent}${s.name} ${s.op}= ${e(s.value)};`);
        break;
      case 'push':
        lines.push(`${indent}${s.list}.push(${e(s.value)});`);
        break;
      case 'tally':
        lines.push(`${indent}${s.map}.set(${e(s.key)}, (${s.map}.get(${e(s.key)}) ?? 0) + ${e(s.amount)});`);
        break;
      case 'if': {
        if (style.bracelessIf && !s.else && s.then.length === 1 && simpleStatement(s.then[0])) {
          lines.push(`${indent}if (${e(s.test)}) ${statements(s.then, '', mutable, records)[0]}`);
          break;
        }
        lines.push(`${indent}if (${e(s.test)}) {`, ...statements(s.then, indent + '  ', mutable, records));
        if (s.else) lines.push(`${indent}} else {`, ...statements(s.else, indent + '  ', mutable, records));
        lines.push(`${indent}}`);
        break;
      }
      case 'for':
        if (style.indexLoop) {
          const list = e(s.list);
          lines.push(`${indent}for (let i = 0; i < ${list}.length; i++) {`, `${indent}  const ${s.item} = ${list}[i];`);
        } else {
          lines.push(`${indent}for (const ${s.item} of ${e(s.list)}) {`);
        }
        lines.push(...statements(s.body, indent + '  ', mutable, records), `${indent}}`);
        break;
      case 'return':
        lines.push(`${indent}return${s.value ? ' ' + e(s.value) : ''};`);
        break;
      case 'fail':
        lines.push(`${indent}throw new Error(${e(s.message)});`);
        break;
      case 'continue':
      case 'break':
        lines.push(`${indent}${s.s};`);
        break;
      case 'log':
        lines.push(`${indent}log.${s.level}(${[quote(s.message), ...s.values.map(e)].join(', ')});`);
        break;
    }
  }
  return lines;
}

function fn(decl: FunctionDecl, records: Map<string, RecordDecl>): string {
  style = decl.style;
  const params = decl.params.map((p) => `${p.name}: ${typeText(p.type)}`).join(', ');
  return [
    `/** ${decl.doc} */`,
    `export function ${decl.name}(${params}): ${typeText(decl.returns)} {`,
    ...statements(decl.body, '  ', reassigned(decl.body), records),
    '}',
  ].join('\n');
}

/** The module's text; `modelImport` is the relative path of the model file from it. */
export function printTypeScript(module: Module, modelImport: string): string {
  const records = new Map(module.records.map((r) => [r.name, r]));
  const used = recordsUsed(module);
  const parts = [`/** ${module.doc} */`];
  const imports = [];
  if (anyStatement(module, (s) => s.s === 'log')) imports.push(`import { log } from '${modelImport.replace(/model$/, 'log')}';`);
  if (used.length) imports.push(`import type { ${used.join(', ')} } from '${modelImport}';`);
  if (imports.length) parts.push(imports.join('\n'));
  for (const r of module.records) {
    parts.push(`export interface ${r.name} {\n${r.fields.map((x) => `  ${x.name}: ${typeText(x.type)};`).join('\n')}\n}`);
  }
  for (const decl of module.functions) parts.push(fn(decl, records));
  return parts.join('\n\n') + '\n';
}

export function printTypeScriptModel(entities: Entity[]): string {
  const blocks = entities.map((x) => `export interface ${x.name} {\n${x.fields.map((y) => `  ${y.name}: ${typeText({ kind: 'scalar', name: y.type })};`).join('\n')}\n}`);
  return `/** The records every module of this repository passes around. */\n\n${blocks.join('\n\n')}\n`;
}
