import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '../db/connection';

/** Runs a SELECT (or RETURNING) with $n bind parameters inside the given transaction. */
export function select<T extends object>(tx: Transaction | undefined, sql: string, bind: unknown[] = []): Promise<T[]> {
  return db().query<T>(sql, { bind, transaction: tx, type: QueryTypes.SELECT });
}

/** Runs a statement whose rows are not needed. */
export async function execute(tx: Transaction | undefined, sql: string, bind: unknown[] = []): Promise<void> {
  await db().query(sql, { bind, transaction: tx, type: QueryTypes.RAW });
}

/** Splits `count` items into chunks of at most `size`, yielding [start, end) ranges. */
export function* chunks(count: number, size: number): Generator<[number, number]> {
  for (let start = 0; start < count; start += size) yield [start, Math.min(count, start + size)];
}

/** One key for the advisory lock that serialises writes to the prefix index. */
export const INDEX_WRITE_LOCK = 0x646f75626c;

/** Takes the index write lock until the transaction ends (loads and rebuilds queue behind it). */
export function lockIndex(tx: Transaction): Promise<void> {
  return execute(tx, 'select pg_advisory_xact_lock($1)', [INDEX_WRITE_LOCK]);
}

/** A PostgreSQL array literal of integers, to send many int[] values as one text[] parameter. */
export function intArrayLiteral(values: ArrayLike<number>): string {
  return `{${Array.prototype.join.call(values, ',')}}`;
}

/**
 * Parses PostgreSQL's text form of a one-dimensional integer array into an Int32Array.
 *
 * @example parseIntArray('{3,-1,7}') // Int32Array [3, -1, 7]
 * @throws when the text is not such an array
 */
export function parseIntArray(text: string): Int32Array {
  const n = text.length;
  if (text.charCodeAt(0) !== 123 || text.charCodeAt(n - 1) !== 125) {
    throw new Error(`not an integer array literal: "${text.slice(0, 40)}"`);
  }
  if (n === 2) return new Int32Array(0);
  // indexOf runs natively: counting commas with it is several times faster than a charCodeAt loop
  let count = 1;
  for (let at = text.indexOf(',', 1); at >= 0; at = text.indexOf(',', at + 1)) count++;
  const out = new Int32Array(count);
  let k = 0;
  let i = 1;
  // one element per turn: optional sign, at least one digit, then ',' or the closing brace at the end
  while (i < n) {
    let c = text.charCodeAt(i);
    const negative = c === 45;
    if (negative) c = text.charCodeAt(++i);
    let value = c - 48;
    if (!(value >= 0 && value <= 9)) return badElement(text, i);
    c = text.charCodeAt(++i);
    while (c >= 48 && c <= 57) {
      value = value * 10 + (c - 48);
      c = text.charCodeAt(++i);
    }
    if (c !== 44 && !(c === 125 && i === n - 1)) return badElement(text, i);
    if (c === 44 && i === n - 2) return badElement(text, i + 1);
    out[k++] = negative ? -value : value;
    i++;
  }
  return out;
}

function badElement(text: string, i: number): never {
  throw new Error(`not an integer array literal: unexpected "${text[i]}" at ${i} in "${text.slice(0, 40)}"`);
}
