import fc from 'fast-check';
import { parse as parsePgArray } from 'postgres-array';
import { describe, expect, it } from 'vitest';
import { intArrayLiteral, parseIntArray } from '../../../server/clone-index/sql';
import { select } from '../../../server/clone-index/sql';
import { useDatabase } from '../../support';

useDatabase();

const int32 = fc.integer({ min: -2147483648, max: 2147483647 });

describe('parseIntArray', () => {
  it('reads back what intArrayLiteral writes', () => {
    fc.assert(
      fc.property(fc.array(int32, { maxLength: 60 }), (values) => {
        expect([...parseIntArray(intArrayLiteral(values))]).toEqual(values);
      }),
    );
  });

  it('agrees with the pg driver’s own array parser (postgres-array, as node-postgres uses it)', () => {
    // reference: postgres-array 2.0.0 from node_modules, the parser behind pg-types' int[] type
    fc.assert(
      fc.property(fc.array(int32, { maxLength: 60 }), (values) => {
        const text = `{${values.join(',')}}`;
        expect([...parseIntArray(text)]).toEqual(parsePgArray(text, Number));
      }),
    );
  });

  it('reads PostgreSQL’s own text form of integer[] columns', async () => {
    const values = [0, -1, 7, 2147483647, -2147483648, 42];
    const [row] = await select<{ text: string }>(undefined, 'select $1::int[]::text as text', [values]);
    expect(row.text).toBe('{0,-1,7,2147483647,-2147483648,42}');
    expect([...parseIntArray(row.text)]).toEqual(values);
  });

  describe('edge cases', () => {
    it('reads the empty array and single values', () => {
      expect(parseIntArray('{}')).toEqual(new Int32Array(0));
      expect([...parseIntArray('{5}')]).toEqual([5]);
      expect([...parseIntArray('{-0}')]).toEqual([0]);
    });

    it.each([
      ['', 'no braces at all'],
      ['1,2', 'no braces'],
      ['{1,2', 'no closing brace'],
      ['{1,,2}', 'an empty element'],
      ['{,1}', 'a leading comma'],
      ['{1,}', 'a trailing comma'],
      ['{1,-}', 'a sign without digits'],
      ['{1,--2}', 'two signs'],
      ['{1,2-3}', 'a sign inside a number'],
      ['{1, 2}', 'a space'],
      ['{NULL}', 'a NULL element'],
      ['{{1,2},{3,4}}', 'a two-dimensional array'],
      ['{1.5}', 'a decimal'],
    ])('rejects %j (%s) with the offending text in the message', (text) => {
      expect(() => parseIntArray(text)).toThrow(/not an integer array literal/);
    });
  });
});
