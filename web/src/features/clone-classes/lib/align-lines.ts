/** One row of a side-by-side view: a 0-based line of each copy, or null where that side has a gap. */
export type AlignedRow = [number | null, number | null];

/**
 * Lines up two copies for display side by side. `anchors` are pairs of lines known to correspond
 * (from matched tokens), in order; lines between two anchors are shown next to each other as far
 * as both sides have them, and the longer side faces blank rows. Anchors that would cross an
 * earlier one are skipped, so the result always keeps both copies in order, every line once.
 *
 * @example alignLines([[0, 0], [2, 3]], 3, 4) // [[0,0],[1,1],[null,2],[2,3]]
 */
export function alignLines(anchors: Array<[number, number]>, leftLines: number, rightLines: number): AlignedRow[] {
  const rows: AlignedRow[] = [];
  let a = 0;
  let b = 0;
  const fill = (untilA: number, untilB: number) => {
    while (a < untilA || b < untilB) {
      rows.push([a < untilA ? a++ : null, b < untilB ? b++ : null]);
    }
  };
  for (const [la, lb] of anchors) {
    if (la < a || lb < b || la >= leftLines || lb >= rightLines) continue;
    fill(la, lb);
    rows.push([a++, b++]);
  }
  fill(leftLines, rightLines);
  return rows;
}

/**
 * The 0-based line of each character offset's line start, for turning token offsets into lines.
 *
 * @example lineStarts('a\nb') // [0, 2]
 */
export function lineStarts(code: string): number[] {
  const starts = [0];
  for (let i = 0; i < code.length; i++) if (code[i] === '\n') starts.push(i + 1);
  return starts;
}

/**
 * The 0-based line holding a character offset, given the line starts.
 *
 * @example lineOf([0, 2], 3) // 1
 */
export function lineOf(starts: number[], offset: number): number {
  let lo = 0;
  let hi = starts.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (starts[mid] <= offset) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}
