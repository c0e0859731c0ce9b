/**
 * Modules and their history: a new module of a repository's domain, and the small edits a
 * release makes to code (a function added or dropped, a guard added, a figure changed).
 */
import { ENTITIES, fieldsWith, type Entity } from './domain';
import { anyFunction, KIND_WEIGHTS, type KindContext } from './functions';
import { eq, f, int, num, str, v, type Expr, type FunctionDecl, type Module, type Stmt, type Type } from './ir';
import type { Random } from './random';

/** A part of a repository: its folder, the records its modules are about, and the words of their names. */
export interface Area {
  folder: string;
  entities: string[];
  topics: string[];
}

const kebab = (s: string) => s.replace(/([a-z])([A-Z])/g, '$1-$2').replace(/ /g, '-').toLowerCase();

/** Everything a module's functions may refer to. */
function context(rng: Random, entity: Entity, module: Module, partners: string[]): KindContext {
  const others = partners.filter((p) => p !== entity.name);
  return {
    rng,
    entity,
    partner: ENTITIES[others.length ? rng.pick(others) : entity.name],
    taken: new Set([...module.functions.map((x) => x.name), ...module.records.map((r) => r.name[0].toLowerCase() + r.name.slice(1))]),
    records: module.records,
  };
}

/** What tells apart two modules on one topic. */
const VARIANTS = ['legacy', 'regional', 'bulk', 'night', 'export', 'batch', 'manual', 'v2'];

/** A module of an area about one of its records, with `size` functions; a fixed name is taken as it is (the story reserves it). */
export function newModule(rng: Random, area: Area, partners: string[], taken: Set<string>, size: number, fixedName?: string): Module {
  let entity = ENTITIES[area.entities[0]];
  let name = fixedName ?? '';
  for (let attempt = 0; attempt < 50 && (!name || taken.has(name)) && !fixedName; attempt++) {
    entity = ENTITIES[rng.pick(area.entities)];
    name = `${area.folder}/${kebab(entity.noun)}-${rng.pick(area.topics)}`;
  }
  const base = name;
  for (let i = 0; taken.has(name) && !fixedName; i++) name = i < VARIANTS.length ? `${base}-${VARIANTS[i]}` : `${base}-${i}`;
  taken.add(name);
  const module: Module = { name, doc: `${entity.noun[0].toUpperCase()}${entity.noun.slice(1)} ${name.slice(name.lastIndexOf('-') + 1)} for ${area.folder}.`, records: [], functions: [] };
  const order = kindOrder(rng);
  for (let i = 0; i < size; i++) module.functions.push(anyFunction(context(rng, entity, module, partners), i, order));
  return module;
}

/** A module's kinds in a shuffled order, each as often as its weight says. */
const kindOrder = (rng: Random) => rng.shuffle(KIND_WEIGHTS.flatMap((w, i) => Array<number>(w).fill(i)));

/** Adds one function about the entity to the module. */
export function addFunction(rng: Random, module: Module, entity: Entity, partners: string[]): FunctionDecl {
  const order = kindOrder(rng);
  const fn = anyFunction(context(rng, entity, module, partners), module.functions.length + rng.int(0, order.length - 1), order);
  module.functions.push(fn);
  return fn;
}

/** The module's main record: the one its functions take first most often. */
export function mainEntity(module: Module): Entity {
  const counts = new Map<string, number>();
  for (const fn of module.functions) {
    const t = fn.params[0]?.type;
    const name = t?.kind === 'record' ? t.name : t?.kind === 'list' && t.of.kind === 'record' ? t.of.name : undefined;
    if (name && ENTITIES[name]) counts.set(name, (counts.get(name) ?? 0) + 1);
  }
  const best = [...counts.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))[0];
  return ENTITIES[best?.[0] ?? 'Wagon'];
}

function defaultFor(t: Type): Expr | undefined | null {
  if (t.kind === 'void') return null;
  if (t.kind === 'optional') return { e: 'null' };
  if (t.kind !== 'scalar') return undefined;
  return { num: num(0), int: int(0), str: str(''), bool: { e: 'bool', value: false } as Expr }[t.name];
}

/**
 * A guard at the top of a function: a record without its code, or an empty list, is refused or
 * answered at once. Returns false when the function has no parameter such a guard fits.
 */
export function addGuard(rng: Random, fn: FunctionDecl): boolean {
  const first = fn.params[0];
  if (!first) return false;
  const answer = defaultFor(fn.returns);
  let test: Expr;
  let message: string;
  if (first.type.kind === 'record' && ENTITIES[first.type.name]) {
    const entity = ENTITIES[first.type.name];
    const numeric = fieldsWith(entity, 'quantity', 'count', 'money');
    if (numeric.length && rng.chance(0.6)) {
      const x = rng.pick(numeric);
      test = { e: 'binary', op: '<', left: f(first.name, x.name), right: x.type === 'int' ? int(0) : num(0) };
      message = `${x.words} cannot be negative`;
    } else {
      const x = entity.fields[0];
      test = { e: 'blank', of: f(first.name, x.name) };
      message = `${entity.noun} without ${x.words}`;
    }
  } else if (first.type.kind === 'list') {
    test = eq({ e: 'length', of: v(first.name) }, int(0), false);
    message = `no ${first.name} given`;
  } else {
    return false;
  }
  const then: Stmt[] = answer === undefined || rng.chance(0.4) ? [{ s: 'fail', message: str(message) }] : [answer === null ? { s: 'return' } : { s: 'return', value: answer }];
  fn.body.unshift({ s: 'if', test, then });
  return true;
}

/** Changes one number of the function (a limit, a rate, a buffer); false when it has none. */
export function changeFigure(rng: Random, fn: FunctionDecl): boolean {
  const found: Extract<Expr, { e: 'num' | 'int' }>[] = [];
  const visitExpr = (x: Expr): void => {
    if (x.e === 'num' || x.e === 'int') {
      if (x.value !== 0 && x.value !== 1) found.push(x);
      return;
    }
    for (const value of Object.values(x)) {
      if (Array.isArray(value)) value.forEach((y) => typeof y === 'object' && y && 'e' in y && visitExpr(y as Expr));
      else if (typeof value === 'object' && value && 'e' in value) visitExpr(value as Expr);
    }
  };
  const visit = (body: Stmt[]) => {
    for (const s of body) {
      for (const value of Object.values(s)) if (typeof value === 'object' && value && 'e' in value) visitExpr(value as Expr);
      if (s.s === 'if') {
        visit(s.then);
        visit(s.else ?? []);
      }
      if (s.s === 'for') visit(s.body);
    }
  };
  visit(fn.body);
  if (found.length === 0) return false;
  const x = rng.pick(found);
  x.value = x.e === 'int' ? x.value + rng.pick([1, 2, 5, -1]) : Math.round(x.value * rng.pick([0.8, 0.9, 1.1, 1.25]) * 100) / 100;
  if (x.value === 0 || x.value === 1) x.value += 2;
  return true;
}
