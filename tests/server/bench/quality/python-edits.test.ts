import { describe, expect, it } from 'vitest';
import type { Node } from 'web-tree-sitter';
import { analyzeSnippet } from '../../../../analyzers';
import { applyPyEdit, PY_EDIT_KINDS, pythonParser, type PyEditKind, type PySnippet } from '../../../../server/bench/quality/python-edits';
import { random } from '../../../../server/bench/synthetic';

// A hand-written function of the invented Brackenfold Rail Freight scenario, inside a class (so
// the copy sits under `if True:` as planted methods do). Its body is one flat block.
const QUOTE = `if True:
    def quote_freight(self, consignment, rates, options):
        # Base price by weight band.
        band = find_band(rates.bands, consignment.tonnes)
        base = band.price_per_tonne * consignment.tonnes
        surcharge = 125 if consignment.hazardous else 0
        total = base + surcharge
        total = total * (1 + rates.fuel_index / 100)
        label = "standard"
        audit.record(consignment.id, total)
        notify(options.channel, "quoted")
        return {"id": consignment.id, "total": round(total), "label": label}
`;
const SNIPPET: PySnippet = { text: QUOTE, line: 2 };

/** Uses of each local variable, counted by hand (`self` is never renamed). */
const USES: Record<string, number> = { consignment: 6, rates: 3, options: 2, band: 2, base: 2, surcharge: 2, total: 5, label: 2 };
/** Body statement indexes of adjacent independent pairs. */
const INDEPENDENT_PAIRS = [1, 4, 5, 6];

async function edited(kind: PyEditKind, seed: number): Promise<string> {
  const result = await applyPyEdit(kind, SNIPPET, random(seed));
  if ('skipped' in result) throw new Error(`${kind} skipped: ${result.skipped}`);
  return result.text;
}

async function fragment(text: string) {
  const fragments = await analyzeSnippet('python', text, { minTokens: 1 });
  return fragments.find((f) => f.startLine === 2)!;
}

async function tree(text: string) {
  const parsed = (await pythonParser()).parse(text)!;
  return parsed;
}

/** The function body's statements, whitespace removed. */
async function bodyStatements(text: string): Promise<string[]> {
  const parsed = await tree(text);
  const fn = parsed.rootNode.descendantsOfType('function_definition')[0]!;
  const out = fn.childForFieldName('body')!.namedChildren.filter((n): n is Node => n !== null && n.type !== 'comment').map((n) => n.text.replace(/\s+/g, ''));
  parsed.delete();
  return out;
}

async function identifiers(text: string): Promise<string[]> {
  const parsed = await tree(text);
  const out = parsed.rootNode.descendantsOfType('identifier').map((n) => n!.text);
  parsed.delete();
  return out;
}

function changed(a: string[], b: string[]): Array<[string, string]> {
  expect(b).toHaveLength(a.length);
  return a.flatMap((x, i) => (x === b[i] ? [] : [[x, b[i]!] as [string, string]]));
}

describe('Python edit operators on a hand-written function', () => {
  it('every kind gives a copy the Python analyzer parses without error, different from the original', async () => {
    for (const kind of PY_EDIT_KINDS) {
      const text = await edited(kind, 3);
      expect(text, kind).not.toBe(QUOTE);
      const parsed = await tree(text);
      expect(parsed.rootNode.hasError, kind).toBe(false);
      parsed.delete();
    }
  });

  it('layout: same raw tokens, old comment gone, a comment before each of the nine statements', async () => {
    const text = await edited('layout', 1);
    expect((await fragment(text)).rawHash).toBe((await fragment(QUOTE)).rawHash);
    expect(text).not.toContain('Base price');
    expect(text.match(/# step \d/g)).toHaveLength(9);
  });

  it('rename-one: every use of one local variable, nothing else', async () => {
    const before = await identifiers(QUOTE);
    for (const seed of [1, 2, 3, 4]) {
      const text = await edited('rename-one', seed);
      const changes = changed(before, await identifiers(text));
      expect(new Set(changes.map(([from]) => from)).size).toBe(1);
      expect(new Set(changes.map(([, to]) => to)).size).toBe(1);
      expect(changes).toHaveLength(USES[changes[0]![0]]!);
      expect((await fragment(text)).normalizedHash).toBe((await fragment(QUOTE)).normalizedHash);
    }
  });

  it('rename-all: every local variable renamed consistently; attributes, keywords and self kept', async () => {
    const changes = changed(await identifiers(QUOTE), await identifiers(await edited('rename-all', 1)));
    const mapping = new Map<string, Set<string>>();
    for (const [from, to] of changes) mapping.set(from, (mapping.get(from) ?? new Set()).add(to));
    expect([...mapping.keys()].sort()).toEqual(Object.keys(USES).sort());
    for (const [from, targets] of mapping) {
      expect(targets.size, from).toBe(1);
      expect(changes.filter(([f]) => f === from), from).toHaveLength(USES[from]!);
    }
  });

  it('literals: one to three literals changed, same kinds; normalised tokens equal', async () => {
    const text = await edited('literals', 1);
    const before = (await fragment(QUOTE));
    const after = (await fragment(text));
    expect(after.rawHash).not.toBe(before.rawHash);
    expect(after.normalizedHash).toBe(before.normalizedHash);
    const a = QUOTE.split('\n');
    const b = text.split('\n');
    const lines = a.flatMap((line, i) => (line === b[i] ? [] : [i]));
    expect(lines.length).toBeGreaterThanOrEqual(1);
    expect(lines.length).toBeLessThanOrEqual(3);
  });

  it.each([
    ['insert-1', 1],
    ['insert-5', 5],
  ] as const)('%s: the original statements kept in order, %i new ones among them', async (kind, count) => {
    const before = await bodyStatements(QUOTE);
    const after = await bodyStatements(await edited(kind, 2));
    expect(after).toHaveLength(before.length + count);
    let i = 0;
    for (const statement of after) if (statement === before[i]) i++;
    expect(i).toBe(before.length);
  });

  it('delete-1: exactly one single-line statement gone, the rest kept in order', async () => {
    const before = await bodyStatements(QUOTE);
    const after = await bodyStatements(await edited('delete-1', 1));
    expect(after).toHaveLength(before.length - 1);
    const gone = before.findIndex((s, i) => s !== after[i]);
    expect(before.filter((_, i) => i !== gone)).toEqual(after);
  });

  it('reorder-2: two adjacent independent statements swapped', async () => {
    const before = await bodyStatements(QUOTE);
    const seen = new Set<number>();
    for (const seed of [1, 2, 3, 4, 5, 6]) {
      const after = await bodyStatements(await edited('reorder-2', seed));
      const moved = before.flatMap((s, i) => (s === after[i] ? [] : [i]));
      expect(moved).toHaveLength(2);
      const [i, j] = moved as [number, number];
      expect(j).toBe(i + 1);
      expect([after[i], after[j]]).toEqual([before[j], before[i]]);
      expect(INDEPENDENT_PAIRS).toContain(i);
      seen.add(i);
    }
    expect(seen.size).toBeGreaterThan(1);
  });

  describe('edge cases', () => {
    it('a one-statement body is never emptied, and a function without literals is skipped with a reason', async () => {
      const tiny: PySnippet = { text: 'def f(a):\n    return a\n', line: 1 };
      expect(await applyPyEdit('delete-1', tiny, random(1))).toEqual({ skipped: 'no single-line statement in a block of two or more' });
      expect(await applyPyEdit('literals', tiny, random(1))).toEqual({ skipped: 'no plain number or string literal' });
    });

    it('a decorated function is found by its first decorator line', async () => {
      const decorated: PySnippet = { text: '@cache\ndef f(a, b):\n    c = a + 1\n    return c + b\n', line: 1 };
      const result = await applyPyEdit('rename-one', decorated, random(1));
      expect('text' in result && result.text.startsWith('@cache\ndef f(')).toBe(true);
    });
  });
});
