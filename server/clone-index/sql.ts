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
  if (text.charCodeAt(0) !== 123 || text.charCodeAt(text.length - 1) !== 125) {
    throw new Error(`not an integer array literal: "${text.slice(0, 40)}"`);
  }
  if (text.length === 2) return new Int32Array(0);
  let count = 1;
  for (let i = 1; i < text.length - 1; i++) if (text.charCodeAt(i) === 44) count++;
  const out = new Int32Array(count);
  let k = 0;
  let value = 0;
  let sign = 1;
  let digits = 0;
  for (let i = 1; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      value = value * 10 + (c - 48);
      digits++;
    } else if (c === 45 && digits === 0 && sign === 1) {
      sign = -1;
    } else if ((c === 44 || c === 125) && digits > 0) {
      out[k++] = sign * value;
      value = 0;
      sign = 1;
      digits = 0;
    } else {
      throw new Error(`not an integer array literal: unexpected "${text[i]}" at ${i} in "${text.slice(0, 40)}"`);
    }
  }
  return out;
}
