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
