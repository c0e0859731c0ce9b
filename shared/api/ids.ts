/**
 * The one parser of numeric record ids in paths and queries, and the one check of a threshold's
 * decimals: every route that takes such a value goes through these, so `0x1`, `1e3`, `01`, `-1`
 * or an id beyond PostgreSQL's `integer` never reach a query, and a threshold never reaches the
 * exact-fraction arithmetic with more decimals than it can hold.
 */
import { z } from 'zod';

/** Largest value of PostgreSQL's `integer` (int4), the type of every serial id. */
export const MAX_SERIAL_ID = 2_147_483_647;

/**
 * A serial id as it appears in a URL: plain decimal digits, no sign, no leading zero, no
 * exponent or hex, at most 2,147,483,647. Parses to a number.
 *
 * @example
 * serialIdSchema('repository').parse('42') // 42
 * serialIdSchema('repository').safeParse('0x1').success // false
 */
export function serialIdSchema(what: string) {
  const message = `Not a ${what} id: ids are whole numbers from 1 to ${MAX_SERIAL_ID}, written in plain digits.`;
  return z
    .string({ error: message })
    .regex(/^[1-9][0-9]{0,9}$/, message)
    .transform(Number)
    .refine((id) => id <= MAX_SERIAL_ID, message);
}

/** Decimals a threshold may have (the matching keeps it as an exact fraction over 10^6). */
export const THRESHOLD_MAX_DECIMALS = 6;

/**
 * True when a number is written with at most six decimals in its shortest form, as JSON carries
 * it: 0.85 yes, 0.7999999999999999 no.
 *
 * @example
 * hasAtMostSixDecimals(0.123456) // true
 */
export function hasAtMostSixDecimals(value: number): boolean {
  return new RegExp(`^\\d+(\\.\\d{1,${THRESHOLD_MAX_DECIMALS}})?$`).test(String(value));
}
