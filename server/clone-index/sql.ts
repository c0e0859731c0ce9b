import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';
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

/** One column of a binary COPY: PostgreSQL type and the values in row order (null for SQL NULL). */
export type CopyColumn =
  | { type: 'int4'; values: ArrayLike<number> }
  | { type: 'float8'; values: ArrayLike<number> }
  | { type: 'text'; values: readonly (string | null)[] }
  | { type: 'int4[]'; values: readonly Int32Array[] };

/** Bytes a binary COPY stream is cut into: a few MB keep memory flat and the socket busy. */
const COPY_CHUNK_BYTES = 4 * 2 ** 20;
const COPY_HEADER = Buffer.from('PGCOPY\n\xff\r\n\0\0\0\0\0\0\0\0\0', 'latin1');
const INT4_OID = 23;

/**
 * Writes rows into a table with COPY … FROM STDIN in PostgreSQL's binary format, on the
 * transaction's own connection: no SQL text to build or parse, no unnest, about three times faster
 * than an unnest insert for the index's integer tables (measured: 583k prefix entries). Every
 * column must have the same number of values.
 */
export async function copyRows(tx: Transaction, table: string, columns: string[], data: CopyColumn[]): Promise<void> {
  const rows = data[0]?.values.length ?? 0;
  if (data.length !== columns.length || data.some((c) => c.values.length !== rows)) {
    throw new Error(`copyRows into ${table}: ${columns.length} columns and ${data.length} value lists of unequal lengths`);
  }
  if (rows === 0) return;
  const client = (tx as unknown as { connection: pg.Client }).connection;
  const stream = client.query(copyFrom(`copy ${table} (${columns.join(', ')}) from stdin (format binary)`));
  await pipeline(Readable.from(binaryCopyChunks(data, rows)), stream);
}

function* binaryCopyChunks(data: CopyColumn[], rows: number): Generator<Buffer> {
  let buffer = Buffer.allocUnsafe(COPY_CHUNK_BYTES);
  let at = COPY_HEADER.copy(buffer, 0);
  const room = (bytes: number) => {
    if (at + bytes <= buffer.length) return undefined;
    const full = buffer.subarray(0, at);
    buffer = Buffer.allocUnsafe(Math.max(COPY_CHUNK_BYTES, bytes));
    at = 0;
    return full;
  };
  for (let r = 0; r < rows; r++) {
    let bytes = 2;
    for (const column of data) bytes += 4 + fieldBytes(column, r);
    const full = room(bytes);
    if (full) yield full;
    at = buffer.writeInt16BE(data.length, at);
    for (const column of data) at = writeField(buffer, at, column, r);
  }
  const full = room(2);
  if (full) yield full;
  at = buffer.writeInt16BE(-1, at);
  yield buffer.subarray(0, at);
}

function fieldBytes(column: CopyColumn, r: number): number {
  switch (column.type) {
    case 'int4':
      return 4;
    case 'float8':
      return 8;
    case 'text': {
      const value = column.values[r];
      return value === null ? 0 : Buffer.byteLength(value, 'utf8');
    }
    case 'int4[]':
      return 20 + 8 * column.values[r].length;
  }
}

function writeField(buffer: Buffer, at: number, column: CopyColumn, r: number): number {
  switch (column.type) {
    case 'int4':
      at = buffer.writeInt32BE(4, at);
      return buffer.writeInt32BE(column.values[r], at);
    case 'float8':
      at = buffer.writeInt32BE(8, at);
      return buffer.writeDoubleBE(column.values[r], at);
    case 'text': {
      const value = column.values[r];
      if (value === null) return buffer.writeInt32BE(-1, at);
      const length = buffer.write(value, at + 4, 'utf8');
      buffer.writeInt32BE(length, at);
      return at + 4 + length;
    }
    case 'int4[]': {
      // one dimension, no nulls, int4 elements, lower bound 1
      const values = column.values[r];
      at = buffer.writeInt32BE(20 + 8 * values.length, at);
      at = buffer.writeInt32BE(1, at);
      at = buffer.writeInt32BE(0, at);
      at = buffer.writeInt32BE(INT4_OID, at);
      at = buffer.writeInt32BE(values.length, at);
      at = buffer.writeInt32BE(1, at);
      for (let i = 0; i < values.length; i++) {
        at = buffer.writeInt32BE(4, at);
        at = buffer.writeInt32BE(values[i], at);
      }
      return at;
    }
  }
}
