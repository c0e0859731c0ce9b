/** Prints a module as Java: one final class of static methods, its records nested, models from the model package. */
import type { Entity } from '../domain';
import type { Expr, FunctionDecl, Module, RecordDecl, Stmt, Style, Type } from '../ir';
import { anyStatement, constantFirst, simpleStatement, pascal, precedence, recordsUsed, wrap } from './common';

const quote = (s: string) => `"${s.replace(/\\/g, '\\\\').replace(/"/g, '\\"')}"`;

function typeText(t: Type, boxed = false): string {
  switch (t.kind) {
    case 'scalar':
      return (boxed ? { num: 'Double', int: 'Integer', str: 'String', bool: 'Boolean' } : { num: 'double', int: 'int', str: 'String', bool: 'boolean' })[t.name];
    case 'record':
      return t.name;
    case 'list':
      return `List<${typeText(t.of, true)}>`;
    case 'optional':
      return typeText(t.of, boxed);
    case 'counts':
      return 'Map<String, Integer>';
    case 'void':
      return 'void';
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
      return x.name;
    case 'field':
      return `${sub(x.of, 9)}.${x.field}`;
    case 'num':
      return number(x.value);
    case 'int':
      return String(x.value);
    case 'str':
      return quote(x.value);
    case 'bool':
      return String(x.value);
    case 'null':
      return 'null';
    case 'binary':
      return `${sub(x.left, p)} ${x.op} ${sub(x.right, p + 0.5)}`;
    case 'equals':
      if (x.strings) return `${x.negate ? '!' : ''}${sub(x.left, 9)}.equals(${expr(x.right, records)})`;
      return `${sub(x.left, 3.5)} ${x.negate ? '!=' : '=='} ${sub(x.right, 3.5)}`;
    case 'and':
    case 'or':
      return x.items.map((y) => sub(y, p + 0.5)).join(x.e === 'and' ? ' && ' : ' || ');
    case 'not':
      return `!${sub(x.of, 9)}`;
    case 'call':
      return `${x.name}(${x.args.map((y) => expr(y, records)).join(', ')})`;
    case 'lib':
      if (x.fn === 'round2') return `Math.round(${sub(x.args[0], 5)} * 100.0) / 100.0`;
      return `Math.${x.fn}(${x.args.map((y) => expr(y, records)).join(', ')})`;
    case 'length':
      return `${sub(x.of, 9)}.size()`;
    case 'blank':
      return `${sub(x.of, 9)}.isBlank()`;
    case 'oneOf':
      return `List.of(${x.values.map(quote).join(', ')}).contains(${expr(x.item, records)})`;
    case 'concat': {
      const parts = x.parts.map((y) => sub(y, 5));
      // text first, so that + joins strings rather than adding numbers
      return x.parts.length > 1 && x.parts[0].e !== 'str' && x.parts[1].e !== 'str' ? ['""', ...parts].join(' + ') : parts.join(' + ');
    }
    case 'new':
      return `new ${x.type}(${x.fields.map((y) => expr(y, records)).join(', ')})`;
    case 'countOf':
      return `${x.map}.getOrDefault(${expr(x.key, records)}, 0)`;
    case 'choose':
      return `${sub(x.test, 1)} ? ${sub(x.then, 1)} : ${sub(x.else, 1)}`;
    case 'pluck':
      return `${sub(x.list, 9)}.stream().filter(${x.item} -> ${expr(x.test, records)}).map(${x.item} -> ${expr(x.value, records)}).toList()`;
    case 'some':
      return `${sub(x.list, 9)}.stream().anyMatch(${x.item} -> ${expr(x.test, records)})`;
    case 'text':
      if (x.op === 'join') return `String.join(${expr(x.arg!, records)}, ${expr(x.of, records)})`;
      return x.op === 'upper' ? `${sub(x.of, 9)}.toUpperCase()` : x.op === 'trim' ? `${sub(x.of, 9)}.strip()` : `${sub(x.of, 9)}.startsWith(${expr(x.arg!, records)})`;
  }
}

const sub5 = (y: Expr, records: Map<string, RecordDecl>) => wrap(expr(y, records), y, 5);

function statements(body: Stmt[], indent: string, records: Map<string, RecordDecl>): string[] {
  const e = (x: Expr) => expr(x, records);
  const lines: string[] = [];
  for (const s of body) {
    switch (s.s) {
      case 'let':
        lines.push(`${indent}${s.value.e === 'pluck' ? 'var' : typeText(s.type)} ${s.name} = ${e(s.value)};`);
        break;
      case 'newList':
        lines.push(`${indent}List<${typeText(s.of, true)}> ${s.name} = new ArrayList<>();`);
        break;
      case 'newCounts':
        lines.push(`${indent}Map<String, Integer> ${s.name} = new HashMap<>();`);
        break;
      case 'set':
        lines.push(`${indent}${s.name} = ${e(s.value)};`);
        break;
      case 'update':
        lines.push(style.longUpdate ? `${indent}${s.name} = ${s.name} ${s.op} ${wrap(e(s.value), s.value, s.op === '*' ? 5.5 : 4.5)};` : `${indent}${s.name} ${s.op}= ${e(s.value)};`);
        break;
      case 'push':
        lines.push(`${indent}${s.list}.add(${e(s.value)});`);
        break;
      case 'tally':
        lines.push(`${indent}${s.map}.merge(${e(s.key)}, ${e(s.amount)}, Integer::sum);`);
        break;
      case 'if': {
        if (style.bracelessIf && !s.else && s.then.length === 1 && simpleStatement(s.then[0])) {
          lines.push(`${indent}if (${e(s.test)}) ${statements(s.then, '', records)[0]}`);
          break;
        }
        lines.push(`${indent}if (${e(s.test)}) {`, ...statements(s.then, indent + '    ', records));
        if (s.else) lines.push(`${indent}} else {`, ...statements(s.else, indent + '    ', records));
        lines.push(`${indent}}`);
        break;
      }
      case 'for':
        if (style.indexLoop) {
          const list = e(s.list);
          lines.push(`${indent}for (int i = 0; i < ${list}.size(); i++) {`, `${indent}    ${typeText(s.itemType)} ${s.item} = ${list}.get(i);`);
        } else {
          lines.push(`${indent}for (${typeText(s.itemType)} ${s.item} : ${e(s.list)}) {`);
        }
        lines.push(...statements(s.body, indent + '    ', records), `${indent}}`);
        break;
      case 'return':
        lines.push(`${indent}return${s.value ? ' ' + e(s.value) : ''};`);
        break;
      case 'fail':
        lines.push(`${indent}throw new IllegalArgumentException(${e(s.message)});`);
        break;
      case 'continue':
      case 'break':
        lines.push(`${indent}${s.s};`);
        break;
      case 'log':
        lines.push(`${indent}LOG.${s.level === 'warn' ? 'warning' : 'info'}(${[quote(s.message + (s.values.length ? ' ' : '')), ...s.values.map((y, i) => (i ? `" " + ${sub5(y, records)}` : sub5(y, records)))].join(' + ')});`);
        break;
    }
  }
  return lines;
}

function method(decl: FunctionDecl, records: Map<string, RecordDecl>): string {
  style = decl.style;
  const params = decl.params.map((p) => `${typeText(p.type)} ${p.name}`).join(', ');
  return [
    `    /** ${decl.doc} */`,
    `    public static ${typeText(decl.returns)} ${decl.name}(${params}) {`,
    ...statements(decl.body, '        ', records),
    '    }',
  ].join('\n');
}

/** The class's simple name for a module name (`allocation/wagon-allocation` → `WagonAllocation`). */
export const javaClassName = (moduleName: string) => pascal(moduleName.slice(moduleName.lastIndexOf('/') + 1));

/** The module's text, in package `pkg`, with its models from `modelPackage`. */
export function printJava(module: Module, pkg: string, modelPackage: string): string {
  const records = new Map(module.records.map((r) => [r.name, r]));
  const name = javaClassName(module.name);
  const lists = anyStatement(module, (s) => s.s === 'newList') || module.functions.some((x) => x.params.some((p) => p.type.kind === 'list') || x.returns.kind === 'list');
  const maps = anyStatement(module, (s) => s.s === 'newCounts');
  const logs = anyStatement(module, (s) => s.s === 'log');
  const imports = [
    ...(lists || /"(oneOf|pluck)"/.test(JSON.stringify(module)) ? ['java.util.List'] : []),
    ...(anyStatement(module, (s) => s.s === 'newList') ? ['java.util.ArrayList'] : []),
    ...(maps ? ['java.util.HashMap', 'java.util.Map'] : []),
    ...(logs ? ['java.util.logging.Logger'] : []),
    ...recordsUsed(module).map((r) => `${modelPackage}.${r}`),
  ].sort();
  const body = [
    ...(logs ? [`    private static final Logger LOG = Logger.getLogger(${name}.class.getName());`] : []),
    `    private ${name}() {\n    }`,
    ...module.records.map((r) => `    public record ${r.name}(${r.fields.map((x) => `${typeText(x.type)} ${x.name}`).join(', ')}) {\n    }`),
    ...module.functions.map((x) => method(x, records)),
  ];
  return [
    `package ${pkg};`,
    imports.map((i) => `import ${i};`).join('\n'),
    `/** ${module.doc} */\npublic final class ${name} {\n\n${body.join('\n\n')}\n}`,
  ]
    .filter(Boolean)
    .join('\n\n') + '\n';
}

export function printJavaModel(entity: Entity, modelPackage: string): string {
  const fields = entity.fields.map((x) => `    public final ${typeText({ kind: 'scalar', name: x.type })} ${x.name};`).join('\n');
  const params = entity.fields.map((x) => `${typeText({ kind: 'scalar', name: x.type })} ${x.name}`).join(', ');
  const assignments = entity.fields.map((x) => `        this.${x.name} = ${x.name};`).join('\n');
  return `package ${modelPackage};\n\n/** A ${entity.noun} as every module of this repository passes it around (immutable). */\npublic final class ${entity.name} {\n\n${fields}\n\n    public ${entity.name}(${params}) {\n${assignments}\n    }\n}\n`;
}
