/**
 * The kinds of function a freight company's code is made of (checks, totals, selections, tallies,
 * charges, labels, look-ups, status changes, summaries, time windows, rankings), each built from
 * seeded choices so that no two come out alike unless the story copies one.
 */
import { ENTITIES, fieldsWith, type Entity, type EntityField } from './domain';
import {
  bin, eq, f, int, listOf, num, record, scalar, str, v,
  type Expr, type FunctionDecl, type Param, type RecordDecl, type Stmt, type Style, type Type,
} from './ir';
import type { Random } from './random';

/** What a kind needs to build one function. */
export interface KindContext {
  rng: Random;
  /** the module's main record */
  entity: Entity;
  /** a second record, for functions over two (a consignment and its tariff) */
  partner: Entity;
  /** names already used in the module */
  taken: Set<string>;
  /** result records the module declares (a kind may add one) */
  records: RecordDecl[];
}

type Kind = (c: KindContext) => Omit<FunctionDecl, 'style'> & { style?: Style };

const capital = (s: string) => (s ? s[0].toUpperCase() + s.slice(1) : s);
const camel = (...words: string[]) => words.map((w, i) => (i === 0 ? w : capital(w))).join('');
const typeOf = (x: EntityField): Type => scalar(x.type);
const QUALIFIERS = ['forBooking', 'forExport', 'forNightRun', 'strict', 'forReport', 'forDepot', 'forPlanning', 'forAudit', 'legacy', 'forWeekend'];

/** A name not yet used in the module: the plain one, else the plain one with a qualifier. */
function uniqueName(c: KindContext, ...words: string[]): string {
  const plain = camel(...words);
  let name = plain;
  for (let i = 0; c.taken.has(name); i++) name = i < QUALIFIERS.length ? plain + capital(QUALIFIERS[(i + c.taken.size) % QUALIFIERS.length]) : `${plain}${i}`;
  c.taken.add(name);
  return name;
}

/** Parameters a function gathers while its conditions ask for them. */
class Params {
  readonly list: Param[] = [];
  need(name: string, type: Type): Expr {
    if (!this.list.some((p) => p.name === name)) this.list.push({ name, type });
    return v(name);
  }
}

const pickField = (c: KindContext, entity: Entity, ...roles: EntityField['role'][]): EntityField | undefined => {
  const found = fieldsWith(entity, ...roles);
  return found.length ? c.rng.pick(found) : undefined;
};

/** A literal a field may sensibly be compared with. */
function literalFor(c: KindContext, x: EntityField): Expr {
  const { rng } = c;
  switch (x.role) {
    case 'quantity':
    case 'money':
      return num(Math.round((x.limit ?? 100) * rng.pick([0.1, 0.25, 0.5, 0.75, 0.9])));
    case 'rate':
      return num(rng.pick([0.05, 0.1, 0.15, 0.2, 0.35]));
    case 'count':
      return int(Math.max(1, Math.round((x.limit ?? 10) * rng.pick([0.2, 0.5, 0.8]))));
    case 'day':
      return int(rng.pick([7, 14, 30, 90, 180, 365]));
    case 'minute':
      return int(rng.pick([240, 360, 420, 1080, 1320]));
    default:
      return str(rng.pick(['A', 'B', 'X']));
  }
}

/** One test on a record's field: a status, a flag, a bound, a code or a date. */
function condition(c: KindContext, entity: Entity, item: string, params: Params, x: EntityField = c.rng.pick(entity.fields)): Expr {
  const { rng } = c;
  const field = f(item, x.name);
  switch (x.role) {
    case 'status':
      return rng.chance(0.5)
        ? eq(field, str(rng.pick(entity.statuses)), true, rng.chance(0.4))
        : { e: 'oneOf', item: field, values: rng.some(entity.statuses, 2) };
    case 'flag':
      return rng.chance(0.6) ? field : { e: 'not', of: field };
    case 'code':
    case 'label':
      return eq(field, params.need(x.name, scalar('str')), true, rng.chance(0.2));
    case 'day':
      return bin(rng.pick(['<', '>=']), field, bin('-', params.need('today', scalar('int')), literalFor(c, x)));
    case 'minute':
      return rng.chance(0.5)
        ? bin(rng.pick(['<', '>=']), field, literalFor(c, x))
        : bin('<=', field, params.need(camel('latest', x.name.replace(/Minute$/, '')), scalar('int')));
    default: {
      const roll = rng.int(0, 4);
      const other = entity.fields.find((y) => y !== x && y.type === x.type && y.role === x.role);
      if (roll === 0 && other) return bin(rng.pick(['>', '<']), bin('-', field, f(item, other.name)), literalFor(c, x));
      if (roll === 1) return bin(rng.pick(['>', '<=']), bin('*', field, num(rng.pick([1.1, 1.5, 2]))), params.need(camel('max', x.name), typeOf(x)));
      return roll === 2
        ? bin(rng.pick(['>=', '<']), field, params.need(camel('min', x.name), typeOf(x)))
        : bin(rng.pick(['>', '>=', '<', '<=']), field, literalFor(c, x));
    }
  }
}

function conditions(c: KindContext, entity: Entity, item: string, params: Params, n: number): Expr {
  const items = c.rng.some(entity.fields, n).map((x) => condition(c, entity, item, params, x));
  return items.length === 1 ? items[0] : { e: c.rng.chance(0.75) ? 'and' : 'or', items };
}

const message = (...parts: Expr[]): Expr => ({ e: 'concat', parts });

/** The checks of a record: problems gathered in a list, or the first one thrown. */
const validate: Kind = (c) => {
  const { rng, entity: E } = c;
  const params = new Params();
  params.need(E.one, record(E.name));
  const collect = rng.chance(0.6);
  const body: Stmt[] = collect ? [{ s: 'newList', name: 'problems', of: scalar('str') }] : [];
  // how this author reports a problem: a plain push, a push with the record's code, a log line first
  const habits = rng.some([0, 1, 2, 3], 2);
  const code = fieldsWith(E, 'code')[0] ?? E.fields[0];
  const report = (...parts: Expr[]): Stmt[] => {
    const habit = rng.pick(habits);
    const text = habit === 1 ? message(f(E.one, code.name), str(': '), ...parts) : message(...parts);
    const done: Stmt = collect ? { s: 'push', list: 'problems', value: text } : { s: 'fail', message: text };
    if (habit === 2) return [{ s: 'log', level: 'warn', message: `${E.noun} rejected`, values: [f(E.one, code.name)] }, done];
    if (habit === 3 && collect) return [done, { s: 'if', test: bin('>=', { e: 'length', of: v('problems') }, int(rng.int(3, 8))), then: [{ s: 'return', value: v('problems') }] }];
    return [done];
  };
  const checked = rng.some(E.fields, rng.int(2, Math.min(6, E.fields.length)));
  for (const x of checked) {
    const field = f(E.one, x.name);
    if (x.role === 'code' || x.role === 'label') {
      body.push({ s: 'if', test: { e: 'blank', of: field }, then: report(str(`${x.words} is required`)) });
    } else if (x.role === 'status' && E.statuses.length) {
      body.push({ s: 'if', test: { e: 'not', of: { e: 'oneOf', item: field, values: E.statuses } }, then: report(str('unknown status '), field) });
    } else if (x.role === 'flag') {
      const other = pickField(c, E, 'code', 'label');
      if (other) body.push({ s: 'if', test: { e: 'and', items: [field, { e: 'blank', of: f(E.one, other.name) }] }, then: report(str(`${other.words} is required when ${x.words}`)) });
    } else if (x.role === 'minute' || x.role === 'day') {
      const later = E.fields.find((y) => y.role === x.role && y !== x);
      const test = later ? bin('<', f(E.one, later.name), field) : bin('<', field, int(0));
      body.push({ s: 'if', test, then: report(str(later ? `${later.words} is before ${x.words}` : `${x.words} is negative`)) });
    } else {
      const limit = literalFor(c, { ...x, role: x.role === 'rate' ? 'rate' : x.role });
      const tooHigh = x.limit !== undefined && rng.chance(0.6);
      const test: Expr = tooHigh
        ? { e: 'or', items: [bin('<', field, x.type === 'int' ? int(0) : num(0)), bin('>', field, x.type === 'int' ? int(x.limit!) : num(x.limit!))] }
        : bin('<=', field, x.role === 'rate' ? num(0) : limit.e === 'int' ? int(0) : num(0));
      body.push({ s: 'if', test, then: report(str(`${x.words} out of range: `), field) });
    }
  }
  if (collect) body.push({ s: 'return', value: v('problems') });
  return {
    name: uniqueName(c, collect ? 'problemsWith' : 'assertValid', E.name),
    params: params.list,
    returns: collect ? listOf(scalar('str')) : { kind: 'void' },
    body,
    doc: collect ? `Every problem with a ${E.noun}, in the order they are checked.` : `Throws on the first problem with a ${E.noun}.`,
  };
};

/** A total or an average of a quantity over a list, some items left out. */
const total: Kind = (c) => {
  const { rng, entity: E } = c;
  const x = pickField(c, E, 'quantity', 'money', 'count') ?? E.fields[0];
  const params = new Params();
  params.need(E.many, listOf(record(E.name)));
  const average = rng.chance(0.35);
  const weight = rng.chance(0.3) ? pickField(c, E, 'count', 'rate') : undefined;
  const loop: Stmt[] = [];
  if (rng.chance(0.7)) loop.push({ s: 'if', test: { e: 'not', of: conditions(c, E, E.one, params, rng.int(1, 2)) }, then: [{ s: 'continue' }] });
  const amount = weight && weight !== x ? bin('*', f(E.one, x.name), f(E.one, weight.name)) : f(E.one, x.name);
  loop.push({ s: 'update', name: 'total', op: '+', value: amount });
  if (average) loop.push({ s: 'update', name: 'counted', op: '+', value: int(1) });
  if (rng.chance(0.3)) loop.push({ s: 'if', test: bin('>', v('total'), params.need('cap', scalar('num'))), then: [{ s: 'break' }] });
  const body: Stmt[] = [{ s: 'let', name: 'total', type: scalar('num'), value: num(0) }];
  if (average) body.push({ s: 'let', name: 'counted', type: scalar('int'), value: int(0) });
  body.push({ s: 'for', item: E.one, itemType: record(E.name), list: v(E.many), body: loop });
  if (average) {
    body.push({ s: 'if', test: eq(v('counted'), int(0), false), then: [{ s: 'return', value: num(0) }] });
    body.push({ s: 'return', value: { e: 'lib', fn: 'round2', args: [bin('/', v('total'), v('counted'))] } });
  } else {
    body.push({ s: 'return', value: rng.chance(0.6) ? { e: 'lib', fn: 'round2', args: [v('total')] } : v('total') });
  }
  return {
    name: uniqueName(c, average ? 'average' : 'total', ...x.name.split(/(?=[A-Z])/).map((w) => w.toLowerCase())),
    params: params.list,
    returns: scalar('num'),
    body,
    doc: `${average ? 'Average' : 'Total'} ${x.words} of the ${E.many} that count.`,
  };
};

/** The items of a list that pass a test, perhaps only the first few. */
const select: Kind = (c) => {
  const { rng, entity: E } = c;
  const params = new Params();
  params.need(E.many, listOf(record(E.name)));
  const test = conditions(c, E, E.one, params, rng.int(1, 3));
  const loop: Stmt[] = [];
  if (rng.chance(0.35)) {
    loop.push({ s: 'if', test: eq(f(E.one, E.fields[0].name), str(''), true), then: [{ s: 'continue' }] });
  }
  const limited = rng.chance(0.35);
  loop.push({ s: 'if', test, then: [{ s: 'push', list: 'selected', value: v(E.one) }] });
  if (limited) loop.push({ s: 'if', test: bin('>=', { e: 'length', of: v('selected') }, params.need('limit', scalar('int'))), then: [{ s: 'break' }] });
  const adjective = rng.pick(['eligible', 'due', 'pending', 'matching', 'flagged', 'blocked', 'available', 'late']);
  return {
    name: uniqueName(c, adjective, capital(E.many)),
    params: params.list,
    returns: listOf(record(E.name)),
    body: [{ s: 'newList', name: 'selected', of: record(E.name) }, { s: 'for', item: E.one, itemType: record(E.name), list: v(E.many), body: loop }, { s: 'return', value: v('selected') }],
    doc: `The ${E.many} that are ${adjective}${limited ? ', at most `limit` of them' : ''}.`,
  };
};

/** How many items (or how much) per code or status. */
const tally: Kind = (c) => {
  const { rng, entity: E } = c;
  const key = pickField(c, E, 'code', 'status', 'label') ?? E.fields[0];
  const amountField = rng.chance(0.4) ? pickField(c, E, 'count') : undefined;
  const params = new Params();
  params.need(E.many, listOf(record(E.name)));
  const loop: Stmt[] = [];
  if (rng.chance(0.6)) loop.push({ s: 'if', test: conditions(c, E, E.one, params, 1), then: [{ s: 'continue' }] });
  loop.push({ s: 'tally', map: 'counts', key: f(E.one, key.name), amount: amountField ? f(E.one, amountField.name) : int(1) });
  if (rng.chance(0.3)) {
    loop.push({ s: 'if', test: bin('>', { e: 'countOf', map: 'counts', key: f(E.one, key.name) }, int(rng.int(5, 50))), then: [{ s: 'fail', message: message(str('too many for '), f(E.one, key.name)) }] });
  }
  return {
    name: uniqueName(c, amountField ? amountField.name : E.one, 'countBy', capital(key.name)),
    params: params.list,
    returns: { kind: 'counts' },
    body: [{ s: 'newCounts', name: 'counts' }, { s: 'for', item: E.one, itemType: record(E.name), list: v(E.many), body: loop }, { s: 'return', value: v('counts') }],
    doc: `${amountField ? capital(amountField.words) : capital(E.many)} per ${key.words}.`,
  };
};

/** A charge or a cost from two records, step by step: base, floor, surcharges, bands, rounding. */
const charge: Kind = (c) => {
  const { rng, entity: E, partner: P } = c;
  const params = new Params();
  params.need(E.one, record(E.name));
  params.need(P.one, record(P.name));
  const quantities = fieldsWith(E, 'quantity', 'count', 'money');
  const rates = fieldsWith(P, 'rate', 'money', 'quantity');
  const a = rng.pick(quantities.length ? quantities : E.fields);
  const b = rng.pick(rates.length ? rates : P.fields);
  const body: Stmt[] = [{ s: 'let', name: 'amount', type: scalar('num'), value: bin('*', f(E.one, a.name), f(P.one, b.name)) }];
  const steps = rng.shuffle(['floor', 'flag', 'band', 'factor', 'cap', 'extra', 'status']).slice(0, rng.int(2, 5));
  for (const step of steps) {
    if (step === 'floor') {
      const floor = pickField(c, P, 'money') ?? pickField(c, E, 'money');
      if (floor) {
        const owner = P.fields.includes(floor) ? P.one : E.one;
        body.push({ s: 'if', test: bin('<', v('amount'), f(owner, floor.name)), then: [{ s: 'set', name: 'amount', value: f(owner, floor.name) }] });
      }
    } else if (step === 'flag') {
      const flag = pickField(c, E, 'flag');
      const rate = pickField(c, P, 'rate');
      if (flag) body.push({ s: 'if', test: f(E.one, flag.name), then: [{ s: 'update', name: 'amount', op: '+', value: bin('*', v('amount'), rate ? f(P.one, rate.name) : num(rng.pick([0.1, 0.15, 0.25]))) }] });
    } else if (step === 'band') {
      const count = pickField(c, E, 'count', 'quantity');
      if (count) {
        const high = literalFor(c, count);
        body.push({
          s: 'if', test: bin('>=', f(E.one, count.name), high),
          then: [{ s: 'update', name: 'amount', op: '*', value: num(rng.pick([0.9, 0.92, 0.95])) }],
          else: rng.chance(0.5) ? [{ s: 'update', name: 'amount', op: '+', value: num(rng.pick([25, 40, 75, 120])) }] : undefined,
        });
      }
    } else if (step === 'factor') {
      const rate = pickField(c, P, 'rate');
      if (rate) body.push({ s: 'set', name: 'amount', value: bin('*', v('amount'), bin('+', num(1), bin('/', f(P.one, rate.name), num(100)))) });
    } else if (step === 'cap') {
      body.push({ s: 'set', name: 'amount', value: { e: 'lib', fn: 'min', args: [v('amount'), params.need('ceiling', scalar('num'))] } });
    } else if (step === 'extra') {
      const count = pickField(c, E, 'count');
      if (count) body.push({ s: 'update', name: 'amount', op: '+', value: bin('*', f(E.one, count.name), num(rng.pick([3, 4.5, 12, 18]))) });
    } else if (step === 'status' && E.statuses.length) {
      body.push({ s: 'if', test: eq(f(E.one, 'status'), str(rng.pick(E.statuses)), true), then: [{ s: 'return', value: num(0) }] });
    }
  }
  body.push({ s: 'return', value: { e: 'lib', fn: 'round2', args: [v('amount')] } });
  return {
    name: uniqueName(c, rng.pick(['charge', 'cost', 'price', 'fee']), 'for', E.name),
    params: params.list,
    returns: scalar('num'),
    body,
    doc: `What a ${E.noun} costs under a ${P.noun}, rounded to the cent.`,
  };
};

/** A line of text about a record, as a screen or a report shows it. */
const describe: Kind = (c) => {
  const { rng, entity: E } = c;
  const params = new Params();
  params.need(E.one, record(E.name));
  const textual = fieldsWith(E, 'code', 'label');
  const numbers = fieldsWith(E, 'quantity', 'count', 'money');
  const first = rng.some(textual.length ? textual : E.fields, 2);
  // one author adds to a string, another gathers parts and joins them
  const parts = rng.chance(0.45);
  const add = (...pieces: Expr[]): Stmt => (parts ? { s: 'push', list: 'parts', value: message(...pieces) } : { s: 'set', name: 'text', value: message(v('text'), ...pieces) });
  const opening = message(...first.flatMap((x, i) => (i ? [str(rng.pick([' / ', ' ', ' - '])), f(E.one, x.name)] : [f(E.one, x.name)])));
  const body: Stmt[] = parts ? [{ s: 'newList', name: 'parts', of: scalar('str') }, { s: 'push', list: 'parts', value: opening }] : [{ s: 'let', name: 'text', type: scalar('str'), value: opening }];
  for (const x of rng.some(E.fields.filter((y) => !first.includes(y)), rng.int(1, 5))) {
    const roll = rng.int(0, 2);
    if (x.role === 'flag') {
      body.push(roll === 0 ? { s: 'if', test: f(E.one, x.name), then: [add(str(` [${x.words}]`))] } : add({ e: 'choose', test: f(E.one, x.name), then: str(` ${x.words}`), else: str('') }));
    } else if (x.role === 'status' && E.statuses.length) {
      body.push({ s: 'if', test: eq(f(E.one, x.name), str(rng.pick(E.statuses)), true, true), then: [add(str(' ('), { e: 'text', op: 'upper', of: f(E.one, x.name) }, str(')'))] });
    } else if (numbers.includes(x)) {
      const unit = str(` ${x.words.split(' ').pop()}`);
      body.push(roll === 0 ? add(str(', '), { e: 'lib', fn: 'round2', args: [f(E.one, x.name)] }, unit) : { s: 'if', test: bin('>', f(E.one, x.name), literalFor(c, x)), then: [add(str(', '), f(E.one, x.name), unit)] });
    } else if (x.role === 'code' || x.role === 'label') {
      body.push({ s: 'if', test: { e: 'not', of: { e: 'blank', of: f(E.one, x.name) } }, then: [add(str(` ${x.words} `), f(E.one, x.name))] });
    }
  }
  if (rng.chance(0.3)) body.unshift({ s: 'if', test: { e: 'blank', of: f(E.one, first[0].name) }, then: [{ s: 'return', value: str(`(unnamed ${E.noun})`) }] });
  body.push({ s: 'return', value: parts ? { e: 'text', op: 'join', of: v('parts'), arg: str(rng.pick([' ', ', ', ' | '])) } : v('text') });
  return {
    name: uniqueName(c, rng.pick(['describe', 'label', 'format', 'summary']), E.name),
    params: params.list,
    returns: scalar('str'),
    body,
    doc: `A one-line description of a ${E.noun}.`,
  };
};

/** The first record with a code, perhaps skipping some, or a clear failure. */
const find: Kind = (c) => {
  const { rng, entity: E } = c;
  const key = pickField(c, E, 'code') ?? E.fields[0];
  const params = new Params();
  params.need(E.many, listOf(record(E.name)));
  const wanted = params.need(key.name, scalar('str'));
  const match: Expr = rng.chance(0.6) ? { e: 'and', items: [eq(f(E.one, key.name), wanted, true), condition(c, E, E.one, params)] } : eq(f(E.one, key.name), wanted, true);
  const strict = rng.chance(0.5);
  const body: Stmt[] = [
    { s: 'for', item: E.one, itemType: record(E.name), list: v(E.many), body: [{ s: 'if', test: match, then: [{ s: 'return', value: v(E.one) }] }] },
    strict ? { s: 'fail', message: message(str(`no ${E.noun} with ${key.words} `), wanted) } : { s: 'return', value: { e: 'null' } },
  ];
  if (rng.chance(0.4)) body.unshift({ s: 'if', test: { e: 'blank', of: wanted }, then: [strict ? { s: 'fail', message: str(`${key.words} is required`) } : { s: 'return', value: { e: 'null' } }] });
  return {
    name: uniqueName(c, 'find', E.name, 'by', capital(key.name)),
    params: params.list,
    returns: strict ? record(E.name) : { kind: 'optional', of: record(E.name) },
    body,
    doc: `The ${E.noun} with this ${key.words}${strict ? '' : ', if there is one'}.`,
  };
};

/** The next status of a record after an event, or a failure for an event that does not apply. */
const transition: Kind = (c) => {
  const { rng, entity: E } = c;
  if (E.statuses.length < 3) return total(c);
  const params = new Params();
  params.need(E.one, record(E.name));
  params.need('event', scalar('str'));
  const events = ['load', 'release', 'depart', 'arrive', 'hold', 'repair', 'close', 'cancel', 'confirm', 'return'];
  const flat = rng.chance(0.4);
  const body: Stmt[] = [];
  const flag = pickField(c, E, 'flag');
  // each step written a little differently: some guarded by a flag, some logged, some through a variable
  const outcome = (to: string): Stmt[] => {
    const roll = rng.int(0, 5);
    if (roll === 0) return [{ s: 'log', level: 'info', message: `${E.noun} moves`, values: [f(E.one, 'status'), str(to)] }, { s: 'return', value: str(to) }];
    if (roll === 1 && flag) return [{ s: 'return', value: { e: 'choose', test: f(E.one, flag.name), then: str(rng.pick(E.statuses)), else: str(to) } }];
    return [{ s: 'return', value: str(to) }];
  };
  for (const from of rng.some(E.statuses, rng.int(2, E.statuses.length))) {
    const inner: Stmt[] = [];
    for (const event of rng.some(events, rng.int(1, 3))) {
      const test: Expr = flag && rng.chance(0.25) ? { e: 'and', items: [eq(v('event'), str(event), true), { e: 'not', of: f(E.one, flag.name) }] } : eq(v('event'), str(event), true);
      if (flat) body.push({ s: 'if', test: { e: 'and', items: [eq(f(E.one, 'status'), str(from), true), test] }, then: outcome(rng.pick(E.statuses)) });
      else inner.push({ s: 'if', test, then: outcome(rng.pick(E.statuses)) });
    }
    if (!flat) body.push({ s: 'if', test: eq(f(E.one, 'status'), str(from), true), then: inner });
  }
  if (rng.chance(0.3)) body.unshift({ s: 'if', test: { e: 'blank', of: v('event') }, then: [{ s: 'return', value: f(E.one, 'status') }] });
  body.push({ s: 'fail', message: message(str(`cannot `), v('event'), str(` a ${E.noun} that is `), f(E.one, 'status')) });
  return {
    name: uniqueName(c, 'next', E.name, 'status'),
    params: params.list,
    returns: scalar('str'),
    body,
    doc: `The status a ${E.noun} moves to when an event happens to it.`,
  };
};

/** Several figures over a list gathered in one result record the module declares. */
const summarise: Kind = (c) => {
  const { rng, entity: E } = c;
  const params = new Params();
  params.need(E.many, listOf(record(E.name)));
  const measured = rng.some(fieldsWith(E, 'quantity', 'money', 'count'), rng.int(1, 3));
  const recordName = uniqueName(c, E.name[0].toLowerCase() + E.name.slice(1), rng.pick(['Summary', 'Totals', 'Figures', 'Overview']));
  const fields = [{ name: 'count', type: scalar('int') }, ...measured.map((x) => ({ name: camel('total', capital(x.name)), type: scalar('num') }))];
  const loop: Stmt[] = [{ s: 'update', name: 'count', op: '+', value: int(1) }, ...measured.map((x): Stmt => ({ s: 'update', name: camel('total', capital(x.name)), op: '+', value: f(E.one, x.name) }))];
  const flag = pickField(c, E, 'flag');
  if (flag && rng.chance(0.6)) {
    fields.push({ name: camel(flag.name, 'Count'), type: scalar('int') });
    loop.push({ s: 'if', test: f(E.one, flag.name), then: [{ s: 'update', name: camel(flag.name, 'Count'), op: '+', value: int(1) }] });
  }
  if (rng.chance(0.5)) loop.unshift({ s: 'if', test: conditions(c, E, E.one, params, 1), then: [{ s: 'continue' }] });
  c.records.push({ name: capital(recordName), fields });
  const body: Stmt[] = [
    ...fields.map((x): Stmt => ({ s: 'let', name: x.name, type: x.type, value: x.type.kind === 'scalar' && x.type.name === 'int' ? int(0) : num(0) })),
    { s: 'for', item: E.one, itemType: record(E.name), list: v(E.many), body: loop },
    { s: 'return', value: { e: 'new', type: capital(recordName), fields: fields.map((x) => (x.name === 'count' || x.type.kind !== 'scalar' || x.type.name === 'int' ? v(x.name) : { e: 'lib', fn: 'round2', args: [v(x.name)] })) } },
  ];
  return {
    name: uniqueName(c, 'summarise', capital(E.many)),
    params: params.list,
    returns: record(capital(recordName)),
    body,
    doc: `Counts and totals of the ${E.many}, for the daily report.`,
  };
};

/** Whether a time window fits: opening hours, buffers, a longest duration. */
const window: Kind = (c) => {
  const { rng, entity: E, partner: P } = c;
  const mine = fieldsWith(E, 'minute', 'day');
  const theirs = fieldsWith(P, 'minute', 'day');
  if (mine.length < 1) return select(c);
  const params = new Params();
  params.need(E.one, record(E.name));
  const start = mine[0];
  const end = mine[1] ?? mine[0];
  const buffer = int(rng.pick([10, 15, 20, 30, 45]));
  const body: Stmt[] = [
    { s: 'let', name: 'start', type: scalar('int'), value: bin('-', f(E.one, start.name), rng.chance(0.5) ? buffer : params.need('bufferMinutes', scalar('int'))) },
    { s: 'let', name: 'end', type: scalar('int'), value: bin('+', f(E.one, end.name), buffer) },
  ];
  if (rng.chance(0.6)) body.push({ s: 'if', test: bin('<', v('end'), v('start')), then: [{ s: 'update', name: 'end', op: '+', value: int(1440) }] });
  if (theirs.length >= 2) {
    params.need(P.one, record(P.name));
    body.push({ s: 'if', test: { e: 'or', items: [bin('<', v('start'), f(P.one, theirs[0].name)), bin('>', v('end'), f(P.one, theirs[1].name))] }, then: [{ s: 'return', value: { e: 'bool', value: false } }] });
  }
  if (rng.chance(0.5)) {
    const flag = pickField(c, E, 'flag');
    if (flag) body.push({ s: 'if', test: f(E.one, flag.name), then: [{ s: 'update', name: 'end', op: '+', value: int(rng.pick([20, 30, 60])) }] });
  }
  body.push({ s: 'return', value: bin('<=', bin('-', v('end'), v('start')), params.need('longestMinutes', scalar('int'))) });
  return {
    name: uniqueName(c, 'fits', rng.pick(['Window', 'Hours', 'Slot', 'Shift']), 'for', E.name),
    params: params.list,
    returns: scalar('bool'),
    body,
    doc: `Whether a ${E.noun} fits its window, buffers included.`,
  };
};

/** A score that ranks records against each other: weighted fields, penalties, a clamp. */
const rank: Kind = (c) => {
  const { rng, entity: E } = c;
  const params = new Params();
  params.need(E.one, record(E.name));
  const numeric = fieldsWith(E, 'quantity', 'count', 'money', 'day');
  const body: Stmt[] = [{ s: 'let', name: 'score', type: scalar('num'), value: num(rng.pick([0, 50, 100])) }];
  for (const x of rng.some(numeric.length ? numeric : E.fields, rng.int(2, 4))) {
    const roll = rng.int(0, 4);
    const weight = num(rng.pick([0.5, 1.5, 2, 0.25]));
    if (roll === 0) body.push({ s: 'update', name: 'score', op: rng.pick(['+', '-']), value: bin('*', f(E.one, x.name), weight) });
    else if (roll === 1) body.push({ s: 'update', name: 'score', op: '-', value: { e: 'lib', fn: 'min', args: [f(E.one, x.name), literalFor(c, x)] } });
    else if (roll === 2) body.push({ s: 'if', test: bin('>', f(E.one, x.name), literalFor(c, x)), then: [{ s: 'update', name: 'score', op: '-', value: num(rng.pick([5, 10, 20])) }], else: [{ s: 'update', name: 'score', op: '+', value: num(rng.pick([2, 5])) }] });
    else if (roll === 3) body.push({ s: 'update', name: 'score', op: '+', value: bin('/', f(E.one, x.name), { e: 'lib', fn: 'max', args: [num(1), params.need(camel('typical', capital(x.name)), scalar('num'))] }) });
    else body.push({ s: 'if', test: bin('>', f(E.one, x.name), literalFor(c, x)), then: [{ s: 'update', name: 'score', op: '-', value: num(rng.pick([5, 10, 20])) }] });
  }
  for (const x of rng.some(fieldsWith(E, 'flag', 'status'), rng.int(0, 2))) {
    const test = x.role === 'flag' ? f(E.one, x.name) : eq(f(E.one, x.name), str(rng.pick(E.statuses)), true);
    body.push({ s: 'if', test, then: [{ s: 'update', name: 'score', op: '*', value: num(rng.pick([0.5, 0.8])) }] });
  }
  body.push({ s: 'return', value: { e: 'lib', fn: 'max', args: [num(0), { e: 'lib', fn: 'min', args: [num(100), v('score')] }] } });
  return {
    name: uniqueName(c, 'score', E.name, rng.pick(['forAllocation', 'forPriority', 'forRepair', 'forDispatch', ''])),
    params: params.list,
    returns: scalar('num'),
    body,
    doc: `A score from 0 to 100 that puts the best ${E.many} first.`,
  };
};

export const KINDS: readonly Kind[] = [validate, total, select, tally, charge, describe, find, transition, summarise, window, rank];
/** How often each kind turns up, by KINDS index: state machines and tallies are rarer than checks and sums. */
export const KIND_WEIGHTS: readonly number[] = [3, 3, 3, 1, 3, 2, 2, 1, 1, 2, 2];

/** The record a function's first parameter holds (or its list holds), with the expression for one of them. */
function subject(fn: Omit<FunctionDecl, 'style'>): { entity: Entity; list?: string; one?: string } | undefined {
  const first = fn.params[0];
  if (!first) return undefined;
  if (first.type.kind === 'record' && ENTITIES[first.type.name]) return { entity: ENTITIES[first.type.name], one: first.name };
  if (first.type.kind === 'list' && first.type.of.kind === 'record' && ENTITIES[first.type.of.name]) return { entity: ENTITIES[first.type.of.name], list: first.name };
  return undefined;
}

/**
 * The incidental lines real functions carry besides their main work: a log line, a ratio worked
 * out on the way, a key built for a message, an age in days, a factor chosen by a flag. They make
 * functions of one kind differ as much as hand-written ones do.
 */
function incidental(c: KindContext, entity: Entity, item: string, params: Params, at: number): Stmt[] {
  const { rng } = c;
  const code = fieldsWith(entity, 'code')[0] ?? entity.fields[0];
  const numbers = fieldsWith(entity, 'quantity', 'money', 'count');
  const name = (base: string) => `${base}${at || ''}`;
  const shape = rng.int(0, 10);
  if (shape === 0 || numbers.length < 2) {
    const values = rng.some([f(item, code.name), ...entity.fields.filter((x) => x.role !== 'flag').map((x) => f(item, x.name))], rng.int(1, 3));
    return [{ s: 'log', level: rng.pick(['info', 'warn']), message: rng.pick([`${entity.noun} checked`, `looking at ${entity.noun}`, `${entity.noun} skipped`, `${entity.noun} over limit`, `using ${entity.noun}`]), values }];
  }
  // two figures of one kind where the record has them: tonnes against tonnes, money against money
  const alike = numbers.filter((x) => numbers.some((y) => y !== x && y.role === x.role));
  const a = rng.pick(alike.length ? alike : numbers);
  const b = rng.pick(numbers.filter((y) => y !== a && (!alike.length || y.role === a.role)));
  switch (shape) {
    case 1:
      return [
        { s: 'let', name: name('ratio'), type: scalar('num'), value: bin('/', f(item, a.name), { e: 'lib', fn: 'max', args: [num(1), f(item, b.name)] }) },
        { s: 'if', test: bin('>', v(name('ratio')), num(rng.pick([0.8, 0.9, 1.2, 2]))), then: [{ s: 'log', level: 'warn', message: `${a.words} high against ${b.words}`, values: [f(item, code.name), v(name('ratio'))] }] },
      ];
    case 2: {
      const day = fieldsWith(entity, 'day')[0];
      if (!day) return incidental(c, entity, item, params, at);
      return [
        { s: 'let', name: name('ageDays'), type: scalar('int'), value: bin('-', params.need('today', scalar('int')), f(item, day.name)) },
        { s: 'if', test: bin('>', v(name('ageDays')), int(rng.pick([30, 60, 90, 365]))), then: [{ s: 'log', level: 'info', message: `old ${entity.noun}`, values: [f(item, code.name), v(name('ageDays'))] }] },
      ];
    }
    case 3: {
      const other = rng.pick(entity.fields.filter((x) => x.role !== 'flag' && x !== code));
      return [
        { s: 'let', name: name('key'), type: scalar('str'), value: { e: 'concat', parts: [f(item, code.name), str(rng.pick([':', '/', '-'])), f(item, other.name)] } },
        { s: 'log', level: 'info', message: rng.pick(['key', 'handling', 'seen']), values: [v(name('key'))] },
      ];
    }
    case 4: {
      const flag = fieldsWith(entity, 'flag')[0];
      const test = flag ? f(item, flag.name) : bin('>', f(item, a.name), literalFor(c, a));
      return [
        { s: 'let', name: name('factor'), type: scalar('num'), value: { e: 'choose', test, then: num(rng.pick([1.25, 1.5, 2])), else: num(1) } },
        { s: 'log', level: 'info', message: `${a.words} factor`, values: [v(name('factor')), f(item, a.name)] },
      ];
    }
    case 5:
      return [{ s: 'if', test: { e: 'and', items: [bin('>', f(item, a.name), literalFor(c, a)), bin('<', f(item, b.name), literalFor(c, b))] }, then: [{ s: 'log', level: 'warn', message: `${entity.noun} needs a look`, values: [f(item, code.name), f(item, a.name), f(item, b.name)] }] }];
    case 6:
      return [
        { s: 'let', name: name('headroom'), type: scalar('num'), value: bin('-', literalFor(c, a), bin('*', f(item, a.name), num(rng.pick([1.1, 1.2, 0.9])))) },
        { s: 'if', test: bin('<', v(name('headroom')), num(0)), then: [{ s: 'log', level: 'warn', message: `no headroom on ${a.words}`, values: [f(item, code.name), v(name('headroom'))] }] },
      ];
    case 8: {
      const prefix = str(rng.pick(['BRF', 'X', 'TMP', 'NW', 'SC']));
      return [
        { s: 'let', name: name('normalised'), type: scalar('str'), value: { e: 'text', op: 'upper', of: { e: 'text', op: 'trim', of: f(item, code.name) } } },
        { s: 'if', test: { e: 'text', op: 'startsWith', of: v(name('normalised')), arg: prefix }, then: [{ s: 'log', level: rng.pick(['info', 'warn']), message: `${code.words} with a temporary prefix`, values: [v(name('normalised'))] }] },
      ];
    }
    case 9:
      return [{ s: 'if', test: bin('>', { e: 'lib', fn: 'abs', args: [bin('-', f(item, a.name), f(item, b.name))] }, literalFor(c, a)), then: [{ s: 'log', level: 'info', message: `${a.words} and ${b.words} far apart`, values: [f(item, a.name), f(item, b.name)] }] }];
    default:
      return [{ s: 'if', test: { e: 'blank', of: f(item, code.name) }, then: [{ s: 'log', level: 'warn', message: `${entity.noun} without ${code.words}`, values: rng.chance(0.5) ? [f(item, b.name)] : [] }] }];
  }
}

/** Incidental lines about a whole list: codes picked out for a message, a check that any item is odd. */
function listIncidental(c: KindContext, entity: Entity, list: string, params: Params): Stmt[] {
  const { rng } = c;
  const code = fieldsWith(entity, 'code')[0] ?? entity.fields[0];
  const it = entity.one[0];
  const size: Expr = { e: 'length', of: v(list) };
  switch (rng.int(0, 3)) {
    case 0:
      return [{ s: 'log', level: 'info', message: rng.pick([`${list} in`, `checking ${list}`, `${list} to go through`]), values: [size] }];
    case 1:
      return [{ s: 'if', test: bin('>', size, params.need(rng.pick(['batchLimit', 'maxItems', 'warnAbove']), scalar('int'))), then: [{ s: 'log', level: 'warn', message: `many ${list}`, values: [size] }] }];
    case 2: {
      const test = condition(c, entity, it, params);
      return [
        { s: 'let', name: 'noted', type: listOf(scalar('str')), value: { e: 'pluck', list: v(list), item: it, test, value: f(it, code.name) } },
        { s: 'if', test: bin('>', { e: 'length', of: v('noted') }, int(0)), then: [{ s: 'log', level: 'info', message: `${entity.many} to note`, values: [v('noted')] }] },
      ];
    }
    default:
      return [{ s: 'if', test: { e: 'some', list: v(list), item: it, test: condition(c, entity, it, params) }, then: [{ s: 'log', level: 'warn', message: `some ${entity.many} need a look`, values: rng.chance(0.5) ? [size] : [] }] }];
  }
}

/** Adds a few incidental lines to a function: at its top for a record, inside its first loop for a list. */
function decorate<F extends Omit<FunctionDecl, 'style'>>(c: KindContext, fn: F): F {
  const { rng } = c;
  const about = subject(fn);
  if (!about) return fn;
  const params = new Params();
  params.list.push(...fn.params);
  const insert = (body: Stmt[], item: string, n: number) => {
    for (let i = 0; i < n; i++) {
      const lines = incidental(c, about.entity, item, params, i);
      const at = rng.int(0, Math.max(0, body.length - 1));
      body.splice(at, 0, ...lines);
    }
  };
  if (about.one) insert(fn.body, about.one, rng.int(0, 2));
  if (about.list && rng.chance(0.6)) fn.body.splice(rng.int(0, 1), 0, ...listIncidental(c, about.entity, about.list, params));
  const loop = fn.body.find((s): s is Extract<Stmt, { s: 'for' }> => s.s === 'for');
  if (loop) insert(loop.body, loop.item, rng.int(0, 2));
  fn.params = params.list;
  return fn;
}

/** One function: the next kind of the module's shuffled order, so a module mixes its kinds. */
export function anyFunction(c: KindContext, index: number, order: readonly number[]): FunctionDecl {
  const { rng } = c;
  const style: Style = { bracelessIf: rng.chance(0.4), indexLoop: rng.chance(0.3), longUpdate: rng.chance(0.35), constantFirst: rng.chance(0.1) };
  return { ...decorate(c, KINDS[order[index % order.length]](c)), style };
}
