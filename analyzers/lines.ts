/**
 * Lines of source text, defined once: a line ends at `\n`, at `\r\n` or at a lone `\r` (old Mac
 * files). Fragment line numbers (LineIndex) and the code cut out of a file for display
 * (splitLines) both come from here, so they cannot disagree about where a line starts.
 */
import { lowerBound } from './tokens';

/** One line break as this module reads it: `\r\n`, a lone `\r`, or `\n`. */
export const LINE_BREAK = /\r\n|\r|\n/;

/**
 * The lines of a text, without their line breaks. A text ending in a break has an empty last
 * line, so line n (1-based) of LineIndex is `splitLines(text)[n - 1]`.
 *
 * @example splitLines('a\r\nb\rc\nd') // ['a', 'b', 'c', 'd']
 */
export function splitLines(text: string): string[] {
  return text.split(LINE_BREAK);
}

/**
 * Maps offsets to 1-based lines and columns with the line breaks of splitLines; columns count
 * UTF-16 code units, like editors that index JavaScript strings.
 *
 * @example new LineIndex('a\rb').position(2) // { line: 2, column: 1 }
 */
export class LineIndex {
  private readonly lineStarts: number[] = [0];

  constructor(text: string) {
    for (let i = 0; i < text.length; i++) {
      const c = text.charCodeAt(i);
      if (c === 10) this.lineStarts.push(i + 1);
      else if (c === 13 && text.charCodeAt(i + 1) !== 10) this.lineStarts.push(i + 1);
    }
  }

  /** 1-based line and column of the character at `offset`. */
  position(offset: number): { line: number; column: number } {
    const line = lowerBound(this.lineStarts, offset + 1) - 1;
    // lowerBound(…, offset + 1) ≥ 1 for offset ≥ 0, since lineStarts[0] = 0 < offset + 1.
    const lineStart = this.lineStarts[line] ?? 0;
    return { line: line + 1, column: offset - lineStart + 1 };
  }
}
