import type { Ref, UIEvent } from 'react';
import type { ThemedToken } from 'shiki/core';
import type { ChangeKind, ChangeMark } from '@/features/clone-classes/lib/token-diff';

/** A piece of one line: text with its colour and, when marked, the kind of change. */
interface Piece {
  text: string;
  color?: string;
  italic?: boolean;
  change?: ChangeKind;
}

/** Cuts one line into pieces at colour boundaries and at the edges of change marks. */
function piecesOf(lineStart: number, text: string, themed: ThemedToken[] | undefined, marks: ChangeMark[]): Piece[] {
  const base: Piece[] = themed?.length
    ? themed.map((t) => ({ text: t.content, color: t.color, italic: ((t.fontStyle ?? 0) & 1) === 1 }))
    : [{ text }];
  const pieces: Piece[] = [];
  let offset = lineStart;
  for (const piece of base) {
    let from = 0;
    while (from < piece.text.length) {
      const at = offset + from;
      const mark = marks.find((m) => m.start <= at && at < m.end);
      // The piece runs to its own end, the end of the mark it is in, or the start of the next mark.
      const nextStart = marks.find((m) => m.start > at && m.start < offset + piece.text.length)?.start;
      const until = Math.min(offset + piece.text.length, mark ? mark.end : (nextStart ?? Infinity));
      pieces.push({ ...piece, text: piece.text.slice(from, until - offset), change: mark?.change });
      from = until - offset;
    }
    offset += piece.text.length;
  }
  return pieces;
}

function Line({ pieces }: { pieces: Piece[] }) {
  // Consecutive pieces of one mark share one marked span, so a test or a reader sees one change.
  const groups: Array<{ change?: ChangeKind; pieces: Piece[] }> = [];
  for (const piece of pieces) {
    const last = groups[groups.length - 1];
    if (last && last.change === piece.change) last.pieces.push(piece);
    else groups.push({ change: piece.change, pieces: [piece] });
  }
  const render = (p: Piece, i: number) =>
    p.color ? (
      <span key={i} style={{ color: p.color, fontStyle: p.italic ? 'italic' : undefined }}>
        {p.text}
      </span>
    ) : (
      p.text
    );
  return (
    <>
      {groups.map((g, i) =>
        g.change ? (
          <span key={i} data-change={g.change} title={g.change}>
            {g.pieces.map(render)}
          </span>
        ) : (
          <span key={i}>{g.pieces.map(render)}</span>
        ),
      )}
    </>
  );
}

/** What a code view shows: the code, its first line number, and optionally colours, marks and row alignment. */
export interface CodeViewProps {
  code: string;
  startLine: number;
  label: string;
  /** coloured tokens per line, when the grammar has loaded */
  themed?: ThemedToken[][] | null;
  /** change marks by character offset */
  marks?: ChangeMark[];
  /** the 0-based line shown in each row, null for a blank row facing lines of the other copy */
  rows?: Array<number | null>;
  scrollRef?: Ref<HTMLDivElement>;
  onScroll?: (event: UIEvent<HTMLDivElement>) => void;
}

/**
 * Source lines with their numbers in the file, in IBM Plex Mono, coloured and marked when given.
 * The numbers are not selectable, so selecting code does not pick them up.
 */
export function CodeView({ code, startLine, label, themed, marks = [], rows, scrollRef, onScroll }: CodeViewProps) {
  const lines = code.split('\n');
  const starts: number[] = [];
  lines.reduce((offset, line) => (starts.push(offset), offset + line.length + 1), 0);
  const shown = rows ?? lines.map((_, i) => i);
  const width = String(startLine + lines.length - 1).length;
  return (
    <div
      ref={scrollRef}
      onScroll={onScroll}
      className="max-h-[32rem] overflow-auto border-t border-line bg-white focus-visible:outline-2 focus-visible:outline-offset-[-2px] focus-visible:outline-accent"
      role="region"
      aria-label={label}
      tabIndex={0}
    >
      <pre className="m-0 min-w-max font-mono text-[12.5px] leading-5 text-ink">
        <code>
          {shown.map((line, row) =>
            line === null ? (
              <div key={`gap-${row}`} className="code-gap flex" aria-hidden="true">
                <span className="sticky left-0 inline-block border-r border-line bg-paper px-2 select-none" style={{ minWidth: `calc(${width}ch + 1rem)` }}>
                  {' '}
                </span>
              </div>
            ) : (
              <div key={line} className="flex">
                <span
                  aria-hidden="true"
                  className="sticky left-0 inline-block border-r border-line bg-paper px-2 text-right text-muted select-none"
                  style={{ minWidth: `calc(${width}ch + 1rem)` }}
                >
                  {startLine + line}
                </span>
                <span className="px-3 whitespace-pre">
                  <Line pieces={piecesOf(starts[line], lines[line], themed?.[line], marks)} />
                  {'\n'}
                </span>
              </div>
            ),
          )}
        </code>
      </pre>
    </div>
  );
}
