/**
 * Integer sets read straight from bytes: one set per line, tokens separated by spaces or tabs,
 * each a non-negative integer of at most 10 digits and at most 2^31 − 1. One loop over the bytes
 * writes the tokens into one Int32Array, with one offset per set; no line or token ever becomes a
 * string (on 20k sets, splitting into strings cost more than the join itself).
 */

/** Sets as one flat array: set s is tokens[offsets[s] .. offsets[s + 1]). */
export interface FlatSets {
  tokens: Int32Array;
  /** length = count + 1; offsets[count] = the number of tokens. */
  offsets: Int32Array;
}

/** The largest token: 2^31 − 1. */
export const MAX_SET_TOKEN = 0x7fffffff;

/** A token that is not an integer in 0..2^31 − 1, with where it is. */
export class SetSyntaxError extends Error {
  constructor(
    /** 0-based set (line) number. */
    readonly set: number,
    /** The token as written, cut to 20 characters. */
    readonly token: string,
  ) {
    // JSON quoting shows a stray control character ("\r") instead of printing it
    super(`line ${set + 1} (set ${set}): ${JSON.stringify(token)} is not an integer in 0..${MAX_SET_TOKEN}`);
  }
}

const NEWLINE = 0x0a;
const SPACE = 0x20;
const TAB = 0x09;
const MAX_DIGITS = 10;

/**
 * Parses sets from bytes. A final newline does not start another set; an empty line is an empty
 * set; a line may end in "\r\n"; a carriage return anywhere else is an error, so a file with
 * old-style "\r" line ends is refused instead of being read as one set. Repeats are kept (the
 * ranking counts them once).
 *
 * @example parseSetBytes(Buffer.from('3 1 3\n\n7\n')) // tokens [3, 1, 3, 7], offsets [0, 3, 3, 4]
 * @throws SetSyntaxError naming the 0-based set and the token
 */
export function parseSetBytes(bytes: Uint8Array): FlatSets {
  const length = bytes.length;
  let lines = 0;
  for (let at = bytes.indexOf(NEWLINE); at !== -1; at = bytes.indexOf(NEWLINE, at + 1)) lines++;
  const count = length === 0 ? 0 : bytes[length - 1] === NEWLINE ? lines : lines + 1;
  const offsets = new Int32Array(count + 1);
  // Every token takes at least one digit and one separator (the last one none).
  const tokens = new Int32Array((length + 1) >>> 1);
  let filled = 0;
  let set = 0;
  // A token is read by its own inner loop (the separators between tokens by the outer one), and
  // the bounds are checked as digits arrive, so `value` stays a small integer (never a double).
  // Literals rather than the named constants in the hot loop: a module-level constant is a
  // context load in bundled code, which measured ~1.8× slower on 20k sets.
  let i = 0;
  while (i < length) {
    let byte = bytes[i];
    let digit = byte - 0x30;
    if (digit >>> 0 <= 9) {
      const from = i;
      let value = digit;
      for (i++; i < length; i++) {
        digit = bytes[i] - 0x30;
        if (digit >>> 0 > 9) break;
        // at most MAX_DIGITS digits; from the 10th on, check against MAX_SET_TOKEN
        if (i - from >= 9) {
          if (i - from >= MAX_DIGITS) throw badToken(bytes, from, set);
          value = value * 10 + digit;
          if (value > MAX_SET_TOKEN) throw badToken(bytes, from, set);
        } else value = value * 10 + digit;
      }
      tokens[filled++] = value;
      if (i === length) break;
      byte = bytes[i];
      if (byte !== 0x20 && byte !== 0x0a && byte !== 0x09 && !(byte === 0x0d && (i + 1 === length || bytes[i + 1] === 0x0a))) {
        throw badToken(bytes, from, set);
      }
    } else if (byte !== 0x20 && byte !== 0x0a && byte !== 0x09 && !(byte === 0x0d && (i + 1 === length || bytes[i + 1] === 0x0a))) {
      throw badToken(bytes, i, set);
    }
    if (byte === 0x0a) offsets[++set] = filled;
    i++;
  }
  if (set < count) offsets[set + 1] = filled;
  return { tokens: filled === tokens.length ? tokens : tokens.subarray(0, filled), offsets };
}

/** The error for the token that starts at `start`: up to the next space, tab or newline, cut to 20 characters. */
function badToken(bytes: Uint8Array, start: number, set: number): SetSyntaxError {
  let end = start;
  while (end < bytes.length && end - start < 80) {
    const byte = bytes[end];
    if (byte === SPACE || byte === TAB || byte === NEWLINE) break;
    end++;
  }
  const text = new TextDecoder().decode(bytes.subarray(start, Math.max(end, start + 1)));
  const chars = [...text];
  return new SetSyntaxError(set, chars.length > 20 ? `${chars.slice(0, 20).join('')}…` : text);
}
