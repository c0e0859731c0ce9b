import { useState } from 'react';
import type { CloneClassDetailDTO, CloneClassMemberDTO, CloneClassPairDTO } from '@shared/api/snapshots';
import { SelectField } from '@/components/field';
import { formatLocation, formatSimilarity } from '@/lib/format';
import { memberPlace } from '@/features/clone-classes/lib/member-place';
import { PairView } from './pair-view';
import { SimilarityMatrix } from './similarity-matrix';

/** What the views of a class's members read: a class of one repository, or one that spans repositories. */
type ClassWithMembers = Pick<CloneClassDetailDTO, 'members' | 'pairs' | 'language'>;

const TYPE_NAMES: Record<1 | 2 | 3, string> = {
  1: 'type 1 · identical tokens',
  2: 'type 2 · identical after renaming',
  3: 'type 3 · similar',
};

/** The pair between two members, whichever way round it was stored. */
function pairOf(pairs: CloneClassPairDTO[], a: number, b: number): CloneClassPairDTO | undefined {
  return pairs.find((p) => (p.a === a && p.b === b) || (p.a === b && p.b === a));
}

function memberLabel(member: CloneClassMemberDTO): string {
  return `${member.name} — ${formatLocation(memberPlace(member), member.startLine, member.endLine)}`;
}

/**
 * Two members of a class side by side, with the similarity of their pair and what differs marked.
 * Classes with more than two members get a matrix of every pair and a chooser for each side; two
 * members that are only connected through others have no pair of their own, and the view says so.
 */
export function ClassMembers({ detail }: { detail: ClassWithMembers }) {
  const { members, pairs } = detail;
  // Start with the most similar pair: the one a reviewer most likely wants to merge first.
  const best = [...pairs].sort((x, y) => y.similarity - x.similarity)[0];
  const [left, setLeft] = useState(best ? best.a : 0);
  const [right, setRight] = useState(best ? best.b : Math.min(1, members.length - 1));
  const pair = pairOf(pairs, left, right);
  // Picking on one side the member shown on the other swaps the two, so both sides stay distinct.
  const pickLeft = (i: number) => {
    if (i === right) setRight(left);
    setLeft(i);
  };
  const pickRight = (i: number) => {
    if (i === left) setLeft(right);
    setRight(i);
  };

  const open = (a: number, b: number) => {
    setLeft(a);
    setRight(b);
  };

  return (
    <div className="space-y-3">
      {members.length > 2 ? (
        <section aria-labelledby="similarity-matrix-title" className="rounded-sm border border-line bg-panel px-4 py-3">
          <h2 id="similarity-matrix-title" className="mb-2 text-xs font-semibold tracking-wide text-muted uppercase">
            Every pair
          </h2>
          <SimilarityMatrix detail={detail} selected={[left, right]} onOpen={open} />
        </section>
      ) : null}
      {members.length > 2 ? (
        <div className="grid gap-3 md:grid-cols-2">
          <SelectField label="Left" value={left} onChange={(e) => pickLeft(Number(e.target.value))}>
            {members.map((m, i) => (
              <option key={m.fragmentId} value={i}>
                {memberLabel(m)}
              </option>
            ))}
          </SelectField>
          <SelectField label="Right" value={right} onChange={(e) => pickRight(Number(e.target.value))}>
            {members.map((m, i) => (
              <option key={m.fragmentId} value={i}>
                {memberLabel(m)}
              </option>
            ))}
          </SelectField>
        </div>
      ) : null}
      <div className="flex items-center gap-3 font-mono text-xs" aria-label="Pair shown" role="status">
        {pair ? (
          <>
            <span className="rounded-sm bg-accent-soft px-1.5 py-0.5 text-accent-strong">similarity {formatSimilarity(pair.similarity)}</span>
            <span className="text-muted">{TYPE_NAMES[pair.type]}</span>
          </>
        ) : (
          <span className="text-muted">No direct pair: these two are in one class through other members.</span>
        )}
      </div>
      {members[left] && members[right] && right !== left ? (
        <PairView left={members[left]} right={members[right]} language={detail.language} />
      ) : null}
    </div>
  );
}

/** Every pair of the class, most similar first. */
export function ClassPairs({ detail }: { detail: ClassWithMembers }) {
  const { members, pairs } = detail;
  return (
    <table className="w-full text-sm" aria-label="Pairs">
      <thead>
        <tr className="text-left text-xs tracking-wide text-muted uppercase">
          <th className="pb-2 font-semibold">Member</th>
          <th className="pb-2 font-semibold">Member</th>
          <th className="pb-2 text-right font-semibold">Similarity</th>
          <th className="pb-2 text-right font-semibold">Type</th>
        </tr>
      </thead>
      <tbody className="font-mono text-xs">
        {[...pairs]
          .sort((x, y) => y.similarity - x.similarity)
          .map((p) => (
            <tr key={`${p.a}-${p.b}`} className="border-t border-line">
              <td className="py-1.5 pr-3">
                {members[p.a].name} <span className="text-muted">{memberPlace(members[p.a])}</span>
              </td>
              <td className="py-1.5 pr-3">
                {members[p.b].name} <span className="text-muted">{memberPlace(members[p.b])}</span>
              </td>
              <td className="py-1.5 pr-3 text-right tabular-nums">{formatSimilarity(p.similarity)}</td>
              <td className="py-1.5 text-right">{p.type}</td>
            </tr>
          ))}
      </tbody>
    </table>
  );
}
