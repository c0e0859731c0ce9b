/** What the three printers share: case conversions, precedence, and facts about a function body. */
import type { Expr, Module, Stmt, Type } from '../ir';

export const snake = (name: string) => name.replace(/([A-Z])/g, '_$1').toLowerCase();
export const pascal = (name: string) => name.split(/[-_/ ]/).filter(Boolean).map((w) => w[0].toUpperCase() + w.slice(1)).join('');
export const kebabToCamel = (name: string) => name.replace(/-([a-z])/g, (_, ch: string) => ch.toUpperCase());

/** Binding strength of an expression (higher binds tighter); the printers parenthesise by it. */
export function precedence(x: Expr): number {
  switch (x.e) {
    case 'or':
      return 1;
    case 'and':
      return 2;
    case 'choose':
      return 0.5;
    case 'equals':
    case 'oneOf':
      return 3;
    case 'binary':
      return ['<', '<=', '>', '>='].includes(x.op) ? 3.5 : x.op === '+' || x.op === '-' ? 4 : 5;
    case 'concat':
      return 4;
    case 'not':
    case 'blank':
      return 6;
    default:
      return 9;
  }
}

/** Names a body assigns again after declaring them (TypeScript writes those with `let`). */
export function reassigned(body: Stmt[], out = new Set<string>()): Set<string> {
  for (const s of body) {
    if (s.s === 'set' || s.s === 'update') out.add(s.name);
    if (s.s === 'if') {
      reassigned(s.then, out);
      if (s.else) reassigned(s.else, out);
    }
    if (s.s === 'for') reassigned(s.body, out);
  }
  return out;
}

/** Record types a module's signatures and bodies name, minus the module's own. */
export function recordsUsed(module: Module): string[] {
  const found = new Set<string>();
  const visitType = (t: Type) => {
    if (t.kind === 'record') found.add(t.name);
    if (t.kind === 'list' || t.kind === 'optional') visitType(t.of);
  };
  const visit = (body: Stmt[]) => {
    for (const s of body) {
      if (s.s === 'let') visitType(s.type);
      if (s.s === 'newList') visitType(s.of);
      if (s.s === 'for') {
        visitType(s.itemType);
        visit(s.body);
      }
      if (s.s === 'if') {
        visit(s.then);
        if (s.else) visit(s.else);
      }
    }
  };
  for (const fn of module.functions) {
    fn.params.forEach((p) => visitType(p.type));
    visitType(fn.returns);
    visit(fn.body);
  }
  for (const r of module.records) found.delete(r.name);
  return [...found].sort();
}

/** Whether any statement of the module's functions satisfies the test. */
export function anyStatement(module: Module, test: (s: Stmt) => boolean): boolean {
  const visit = (body: Stmt[]): boolean =>
    body.some((s) => test(s) || (s.s === 'if' && (visit(s.then) || visit(s.else ?? []))) || (s.s === 'for' && visit(s.body)));
  return module.functions.some((fn) => visit(fn.body));
}

/** Wraps a printed child in parentheses when it binds less tightly than its place needs. */
export const wrap = (text: string, child: Expr, needed: number) => (precedence(child) < needed ? `(${text})` : text);

/** A comparison written constant first: `x > 90` as `90 < x`. */
export function constantFirst(x: Expr): Expr {
  if (x.e !== 'binary' || !['<', '<=', '>', '>='].includes(x.op)) return x;
  if (!['num', 'int', 'str'].includes(x.right.e) || ['num', 'int', 'str'].includes(x.left.e)) return x;
  const flipped = { '<': '>', '<=': '>=', '>': '<', '>=': '<=' } as const;
  return { e: 'binary', op: flipped[x.op as keyof typeof flipped], left: x.right, right: x.left };
}

/** Whether a statement fits on one line after a braceless `if`. */
export const simpleStatement = (s: Stmt) => ['return', 'continue', 'break', 'fail', 'set', 'update', 'push'].includes(s.s);
