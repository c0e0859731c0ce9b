import { describe, expect, it } from 'vitest';
import { analyzeSnippet } from '../../../../analyzers';
import { applyJsEdit, JS_EDIT_KINDS, tokenTexts, type EditResult, type JsEditKind } from '../../../../server/bench/quality/js-edits';
import { findFunction, parseStrict, type Node, type Snippet } from '../../../../server/bench/quality/syntax';
import { random } from '../../../../server/bench/synthetic';

// A hand-written function of the invented Brackenfold Rail Freight scenario. Its body is one flat
// list of statements, so every insertion, deletion or swap lands in that list and can be checked
// statement by statement.
const QUOTE = `function quoteFreight(consignment: Consignment, rates: RateTable, options: QuoteOptions): Quote {
  // Base price by weight band.
  const band = rates.bands.find((b) => consignment.tonnes <= b.maxTonnes);
  const base = band ? band.pricePerTonne * consignment.tonnes : 0;
  const surcharge = consignment.hazardous ? 125 : 0;
  let total = base + surcharge;
  total = total * (1 + rates.fuelIndex / 100);
  const label = "standard";
  audit.record(consignment.id, total);
  notify(options.channel, "quoted");
  return { id: consignment.id, total: Math.round(total), label };
}
`;
const TS: Snippet = { text: QUOTE, line: 1, column: 0, dialect: { typescript: true, jsx: false } };

/** Uses of each variable as a variable, counted by hand (`label` only appears in a shorthand property, so it is never renamed). */
const USES: Record<string, number> = { consignment: 6, rates: 3, options: 2, band: 3, base: 2, surcharge: 2, total: 5, b: 2 };

/** Statement indexes (0-based, in the body) of adjacent pairs that neither reads nor writes what the other writes. */
const INDEPENDENT_PAIRS = [1, 4, 5, 6];

function edited(kind: JsEditKind, seed: number, snippet: Snippet = TS): string {
  const result: EditResult = applyJsEdit(kind, snippet, random(seed));
  if ('skipped' in result) throw new Error(`${kind} skipped: ${result.skipped}`);
  return result.text;
}

/** The body's statements as source text, whitespace removed (comments are not part of a statement's range). */
function bodyStatements(text: string): string[] {
  const fn = findFunction(parseStrict(text, TS.dialect), TS)!;
  return (fn.body.body as Node[]).map((s) => text.slice(s.start, s.end).replace(/\s+/g, ''));
}

/** Positions where two token lists of equal length differ, as [original, copy]. */
function changedTokens(a: string[], b: string[]): Array<[string, string]> {
  expect(b).toHaveLength(a.length);
  return a.flatMap((token, i) => (token === b[i] ? [] : [[token, b[i]!] as [string, string]]));
}

const isIdentifier = (token: string) => /^[A-Za-z_$][\w$]*$/.test(token);

async function rawHash(text: string): Promise<string> {
  const [fragment] = await analyzeSnippet('typescript', text, { minTokens: 1 });
  return fragment!.rawHash;
}

describe('JavaScript/TypeScript edit operators on a hand-written function', () => {
  const original = tokenTexts(QUOTE, TS.dialect);

  it('every kind gives a copy that parses strictly and differs from the original', () => {
    for (const kind of JS_EDIT_KINDS) {
      const text = edited(kind, 3);
      expect(() => parseStrict(text, TS.dialect), kind).not.toThrow();
      expect(text, kind).not.toBe(QUOTE);
    }
  });

  it('layout: same tokens, old comment gone, a comment before each of the nine statements, indentation doubled', async () => {
    const text = edited('layout', 1);
    expect(tokenTexts(text, TS.dialect)).toEqual(original);
    expect(await rawHash(text)).toBe(await rawHash(QUOTE));
    expect(text).not.toContain('Base price');
    expect(text.match(/\/\/ step \d/g)).toHaveLength(9);
    expect(text).toContain('\n    const band = rates');
    expect(text).toContain('\n\n    // step 9\n    return {');
  });

  it('whitespace: same tokens and the same lines, only spaces inside lines changed', () => {
    const text = edited('whitespace', 1);
    expect(tokenTexts(text, TS.dialect)).toEqual(original);
    const squeeze = (s: string) => s.split('\n').map((line) => line.replace(/ /g, ''));
    expect(squeeze(text)).toEqual(squeeze(QUOTE));
    expect(text).toContain('rates . bands . find (');
  });

  it('rename-one: every use of exactly one variable, and nothing else', () => {
    for (const seed of [1, 2, 3, 4, 5]) {
      const changes = changedTokens(original, tokenTexts(edited('rename-one', seed), TS.dialect));
      const olds = new Set(changes.map(([from]) => from));
      const news = new Set(changes.map(([, to]) => to));
      expect(olds.size).toBe(1);
      expect(news.size).toBe(1);
      const [name] = [...olds];
      expect(USES[name!]).toBeGreaterThanOrEqual(2);
      expect(changes).toHaveLength(USES[name!]!);
      expect(original).not.toContain([...news][0]);
    }
  });

  it('rename-all: each local variable renamed consistently to its own new name; properties, types and the shorthand kept', () => {
    const changes = changedTokens(original, tokenTexts(edited('rename-all', 1), TS.dialect));
    const mapping = new Map<string, Set<string>>();
    for (const [from, to] of changes) mapping.set(from, (mapping.get(from) ?? new Set()).add(to));
    expect([...mapping.keys()].sort()).toEqual(Object.keys(USES).sort());
    for (const [from, targets] of mapping) {
      expect(targets.size, from).toBe(1);
      expect(changes.filter(([f]) => f === from), from).toHaveLength(USES[from]!);
    }
    expect(new Set([...mapping.values()].map((s) => [...s][0])).size).toBe(mapping.size);
  });

  it('rename-inconsistent: some uses of a variable renamed and others not', () => {
    const changes = changedTokens(original, tokenTexts(edited('rename-inconsistent', 2), TS.dialect));
    expect(changes.length).toBeGreaterThan(0);
    expect(changes.every(([from, to]) => isIdentifier(from) && isIdentifier(to))).toBe(true);
    const byName = new Map<string, number>();
    for (const [from] of changes) byName.set(from, (byName.get(from) ?? 0) + 1);
    expect(byName.size).toBeLessThanOrEqual(3);
    for (const [name, renamed] of byName) {
      expect(renamed, name).toBeGreaterThan(0);
      expect(renamed, name).toBeLessThan(USES[name]!);
    }
  });

  it('literals: one to three literals changed, each to another of the same kind; nothing else', () => {
    const changes = changedTokens(original, tokenTexts(edited('literals', 1), TS.dialect));
    expect(changes.length).toBeGreaterThanOrEqual(1);
    expect(changes.length).toBeLessThanOrEqual(3);
    for (const [from, to] of changes) {
      if (/^\d/.test(from)) expect(to).toMatch(/^\d/);
      else expect([from[0], to[0]]).toEqual(['"', '"']);
    }
  });

  it('types: annotations added or changed; the analyzer (types dropped) sees the same tokens', async () => {
    const text = edited('types', 1);
    expect(tokenTexts(text, TS.dialect)).not.toEqual(original);
    expect(await rawHash(text)).toBe(await rawHash(QUOTE));
    // A JavaScript function has no types to change.
    const js: Snippet = { text: 'function f(a, b) {\n  return a + b;\n}\n', line: 1, column: 0, dialect: { typescript: false, jsx: true } };
    expect(applyJsEdit('types', js, random(1))).toEqual({ skipped: 'not TypeScript' });
  });

  it.each([
    ['insert-1', 1],
    ['insert-2', 2],
    ['insert-5', 5],
  ] as const)('%s: the original statements kept in order, %i new ones among them', (kind, count) => {
    const before = bodyStatements(QUOTE);
    const after = bodyStatements(edited(kind, 4));
    expect(after).toHaveLength(before.length + count);
    let i = 0;
    for (const statement of after) if (statement === before[i]) i++;
    expect(i).toBe(before.length);
  });

  it('delete-1: exactly one single-line statement gone, the rest kept in order', () => {
    for (const seed of [1, 2, 3]) {
      const before = bodyStatements(QUOTE);
      const after = bodyStatements(edited('delete-1', seed));
      expect(after).toHaveLength(before.length - 1);
      const gone = before.findIndex((s, i) => s !== after[i]);
      expect(before.filter((_, i) => i !== gone)).toEqual(after);
      // The first statement holds an arrow function: not a single-line statement of its own.
      expect(gone).toBeGreaterThan(0);
    }
  });

  it('modify-1: exactly one statement changed, of the same kind', () => {
    const before = bodyStatements(QUOTE);
    const after = bodyStatements(edited('modify-1', 1));
    expect(after).toHaveLength(before.length);
    const changed = before.flatMap((s, i) => (s === after[i] ? [] : [i]));
    expect(changed).toHaveLength(1);
    const kind = (s: string) => /^(const|let|return|throw)/.exec(s)?.[1] ?? 'expression';
    expect(kind(after[changed[0]!]!)).toBe(kind(before[changed[0]!]!));
  });

  it('reorder-2: two adjacent independent statements swapped, nothing else', () => {
    const seen = new Set<number>();
    for (const seed of [1, 2, 3, 4, 5, 6, 7, 8]) {
      const before = bodyStatements(QUOTE);
      const after = bodyStatements(edited('reorder-2', seed));
      const changed = before.flatMap((s, i) => (s === after[i] ? [] : [i]));
      expect(changed).toHaveLength(2);
      const [i, j] = changed as [number, number];
      expect(j).toBe(i + 1);
      expect([after[i], after[j]]).toEqual([before[j], before[i]]);
      expect(INDEPENDENT_PAIRS).toContain(i);
      seen.add(i);
    }
    expect(seen.size).toBeGreaterThan(1);
  });

  it('wrap: one to three statements, none a declaration, moved unchanged into an if', () => {
    const before = bodyStatements(QUOTE);
    const text = edited('wrap', 2);
    const fn = findFunction(parseStrict(text, TS.dialect), TS)!;
    const body = fn.body.body as Node[];
    const at = body.findIndex((s) => s.type === 'IfStatement');
    const wrapped = (body[at]!.consequent.body as Node[]).map((s) => text.slice(s.start, s.end).replace(/\s+/g, ''));
    expect(wrapped.length).toBeGreaterThanOrEqual(1);
    expect(wrapped.length).toBeLessThanOrEqual(3);
    expect(wrapped.some((s) => /^(const|let)/.test(s))).toBe(false);
    expect([...before.slice(0, at), ...wrapped, ...before.slice(at + wrapped.length)]).toEqual(before);
    expect(body).toHaveLength(before.length - wrapped.length + 1);
  });

  it('combined: one statement inserted, one variable renamed everywhere, one literal changed', () => {
    const text = edited('combined', 1);
    const fn = findFunction(parseStrict(text, TS.dialect), TS)!;
    const body = fn.body.body as Node[];
    expect(body).toHaveLength(bodyStatements(QUOTE).length + 1);
    // Drop the statement whose removal leaves the original's tokens up to renamed identifiers and
    // changed literals: that is the inserted one.
    const fits = body
      .map((s) => changedTokensOrNull(original, tokenTexts(text.slice(0, s.start) + text.slice(s.end), TS.dialect)))
      .filter((c): c is Array<[string, string]> => c !== null && c.every(([from, to]) => isIdentifier(from) === isIdentifier(to)))
      .sort((x, y) => x.length - y.length);
    expect(fits.length).toBeGreaterThan(0);
    const changes = fits[0]!;
    const literals = changes.filter(([from]) => !isIdentifier(from));
    const names = changes.filter(([from]) => isIdentifier(from));
    expect(literals).toHaveLength(1);
    expect(new Set(names.map(([from]) => from)).size).toBe(1);
    expect(new Set(names.map(([, to]) => to)).size).toBe(1);
    expect(names).toHaveLength(USES[names[0]![0]]!);
  });

  describe('edge cases', () => {
    it('a function with nothing to rename, no literal and no block is skipped with a reason, not broken', () => {
      const arrow: Snippet = { text: '(() => go());\n', line: 1, column: 1, dialect: { typescript: false, jsx: true } };
      expect(applyJsEdit('rename-one', arrow, random(1))).toEqual({ skipped: 'no local variable used twice' });
      expect(applyJsEdit('literals', arrow, random(1))).toEqual({ skipped: 'no string or number literal' });
      expect(applyJsEdit('insert-1', arrow, random(1))).toEqual({ skipped: 'no block to insert into' });
      expect(applyJsEdit('delete-1', arrow, random(1))).toEqual({ skipped: 'no single-line statement' });
    });

    it('whitespace never glues two operators into another one', () => {
      const text = 'function f(a, b) {\n  return a - -b + +a;\n}\n';
      const snippet: Snippet = { text, line: 1, column: 0, dialect: { typescript: false, jsx: true } };
      const result = applyJsEdit('whitespace', snippet, random(1));
      expect('text' in result && tokenTexts(result.text, snippet.dialect)).toEqual(tokenTexts(text, snippet.dialect));
    });

    it('layout leaves template strings and JSX text as they were', () => {
      const text = 'function Row(props) {\n  const title = `${props.a}  and\n  ${props.b}`;\n  return <li>  {title}  </li>;\n}\n';
      const snippet: Snippet = { text, line: 1, column: 0, dialect: { typescript: false, jsx: true } };
      const result = applyJsEdit('layout', snippet, random(1));
      expect('text' in result && tokenTexts(result.text, snippet.dialect)).toEqual(tokenTexts(text, snippet.dialect));
      expect('text' in result && result.text).toContain('`${props.a}  and\n  ${props.b}`');
    });

    it('renaming in code without semicolons adds none: names are written in place, not reprinted', () => {
      const text = 'function listen() {\n  var server = http.createServer(this)\n  var args = slice.call(arguments)\n  return server.listen.apply(server, args)\n}\n';
      const snippet: Snippet = { text, line: 1, column: 0, dialect: { typescript: false, jsx: true } };
      const result = applyJsEdit('rename-all', snippet, random(1));
      const copy = 'text' in result ? result.text : '';
      expect(copy).not.toContain(';');
      const changes = changedTokens(tokenTexts(text, snippet.dialect), tokenTexts(copy, snippet.dialect));
      expect(changes.map(([from]) => from).sort()).toEqual(['args', 'args', 'server', 'server', 'server']);
    });

    it('the same seed gives the same copy', () => {
      expect(edited('insert-5', 9)).toBe(edited('insert-5', 9));
    });
  });
});

function changedTokensOrNull(a: string[], b: string[]): Array<[string, string]> | null {
  if (a.length !== b.length) return null;
  return a.flatMap((token, i) => (token === b[i] ? [] : [[token, b[i]!] as [string, string]]));
}
