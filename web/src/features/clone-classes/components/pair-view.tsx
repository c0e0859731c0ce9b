import { useMemo, useRef, type RefObject, type UIEvent } from 'react';
import type { CloneClassMemberDTO } from '@shared/api/snapshots';
import { formatLocation } from '@/lib/format';
import { useHighlightedLines } from '@/features/clone-classes/hooks/use-highlighted-lines';
import { alignLines, lineOf, lineStarts } from '@/features/clone-classes/lib/align-lines';
import { grammarFor } from '@/features/clone-classes/lib/highlight';
import { memberPlace } from '@/features/clone-classes/lib/member-place';
import { diffTokens } from '@/features/clone-classes/lib/token-diff';
import { tokenize } from '@/features/clone-classes/lib/tokenize';
import { CodeView } from './code-view';

function MemberHeader({ member }: { member: CloneClassMemberDTO }) {
  return (
    <header className="space-y-0.5 px-3 py-2">
      <div className="flex items-center justify-between gap-2">
        <span className="truncate font-mono text-sm font-semibold" title={member.name}>
          {member.name}
        </span>
        {/* No opposite label: the API's `changed` is also false for a member that is new in this release. */}
        {member.changed ? (
          <span className="shrink-0 rounded-sm bg-amber-soft px-1.5 py-0.5 font-mono text-[11px] leading-none text-amber-strong" title="Its code differs from the previous snapshot">
            changed since last release
          </span>
        ) : null}
      </div>
      <div className="truncate font-mono text-xs text-muted" title={formatLocation(memberPlace(member), member.startLine, member.endLine)}>
        {formatLocation(memberPlace(member), member.startLine, member.endLine)}
        <span className="ml-2">
          {member.kind} · {member.tokens} tokens
        </span>
      </div>
    </header>
  );
}

/** The token comparison of two members and the rows that line their code up. */
function usePairDiff(left: CloneClassMemberDTO, right: CloneClassMemberDTO) {
  return useMemo(() => {
    const a = tokenize(left.code);
    const b = tokenize(right.code);
    const diff = diffTokens(a, b);
    const startsA = lineStarts(left.code);
    const startsB = lineStarts(right.code);
    const anchors = diff.matched.map(([i, j]): [number, number] => [lineOf(startsA, a[i].start), lineOf(startsB, b[j].start)]);
    const rows = alignLines(anchors, startsA.length, startsB.length);
    return { diff, leftRows: rows.map((r) => r[0]), rightRows: rows.map((r) => r[1]) };
  }, [left.code, right.code]);
}

const LEGEND: Array<{ change: string; label: string }> = [
  { change: 'removed', label: 'only on the left' },
  { change: 'inserted', label: 'only on the right' },
  { change: 'changed', label: 'changed' },
  { change: 'renamed', label: 'renamed identifier' },
];

/**
 * Two members side by side: coloured code, lines aligned (blank rows face lines only one side
 * has), scrolling together, with what differs marked token by token.
 */
export function PairView({ left, right, language }: { left: CloneClassMemberDTO; right: CloneClassMemberDTO; language: string }) {
  const { diff, leftRows, rightRows } = usePairDiff(left, right);
  const leftThemed = useHighlightedLines(left.code, grammarFor(language, left.path));
  const rightThemed = useHighlightedLines(right.code, grammarFor(language, right.path));
  const leftPane = useRef<HTMLDivElement>(null);
  const rightPane = useRef<HTMLDivElement>(null);
  // Both panes have the same rows, so equal offsets keep the aligned lines next to each other.
  const follow = (other: RefObject<HTMLDivElement | null>) => (event: UIEvent<HTMLDivElement>) => {
    const source = event.currentTarget;
    const target = other.current;
    if (!target) return;
    if (target.scrollTop !== source.scrollTop) target.scrollTop = source.scrollTop;
    if (target.scrollLeft !== source.scrollLeft) target.scrollLeft = source.scrollLeft;
  };
  const renames = [...diff.renames].map(([from, to]) => `${from} → ${to}`);
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-center gap-x-4 gap-y-1 text-xs text-muted" aria-label="Marks" role="note">
        {LEGEND.map((l) => (
          <span key={l.change} className="flex items-center gap-1.5">
            <span data-legend={l.change} className="inline-block rounded-sm px-1 font-mono text-ink">
              abc
            </span>
            {l.label}
          </span>
        ))}
        {renames.length ? <span className="font-mono">renamed: {renames.join(', ')}</span> : null}
      </div>
      <div className="grid gap-3 lg:grid-cols-2">
        <article aria-label={`Left: ${memberPlace(left)}`} className="min-w-0 rounded-sm border border-line bg-panel">
          <MemberHeader member={left} />
          <CodeView
            code={left.code}
            startLine={left.startLine}
            label={`Code of ${left.name} in ${memberPlace(left)}`}
            themed={leftThemed}
            marks={diff.left}
            rows={leftRows}
            scrollRef={leftPane}
            onScroll={follow(rightPane)}
          />
        </article>
        <article aria-label={`Right: ${memberPlace(right)}`} className="min-w-0 rounded-sm border border-line bg-panel">
          <MemberHeader member={right} />
          <CodeView
            code={right.code}
            startLine={right.startLine}
            label={`Code of ${right.name} in ${memberPlace(right)}`}
            themed={rightThemed}
            marks={diff.right}
            rows={rightRows}
            scrollRef={rightPane}
            onScroll={follow(leftPane)}
          />
        </article>
      </div>
    </div>
  );
}
