import clsx from 'clsx';
import type { CloneClassDetailDTO } from '@shared/api/snapshots';
import { formatSimilarity } from '@/lib/format';
import { memberPlace } from '@/features/clone-classes/lib/member-place';

/**
 * Every member against every other: the similarity of the pairs the class holds, and a dash for
 * two members joined only through others. Choosing a cell opens that pair side by side.
 */
export function SimilarityMatrix({
  detail,
  selected,
  onOpen,
}: {
  detail: Pick<CloneClassDetailDTO, 'members' | 'pairs'>;
  selected: [number, number];
  onOpen: (a: number, b: number) => void;
}) {
  const { members, pairs } = detail;
  const similarity = new Map<string, number>();
  for (const p of pairs) {
    similarity.set(`${p.a}:${p.b}`, p.similarity);
    similarity.set(`${p.b}:${p.a}`, p.similarity);
  }
  const isSelected = (a: number, b: number) => (selected[0] === a && selected[1] === b) || (selected[0] === b && selected[1] === a);
  return (
    <div className="overflow-x-auto">
      <table className="border-collapse font-mono text-xs" aria-label="Similarity of every pair">
        <thead>
          <tr>
            <td />
            {members.map((m, i) => (
              <th key={m.fragmentId} scope="col" className="px-2 pb-1 text-center font-semibold text-muted" title={`${m.name} in ${memberPlace(m)}`}>
                {i + 1}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {members.map((row, a) => (
            <tr key={row.fragmentId}>
              <th scope="row" className="max-w-[22rem] truncate py-0.5 pr-3 text-left font-normal" title={`${row.name} in ${memberPlace(row)}`}>
                <span className="text-muted">{a + 1}</span> {row.name} <span className="text-muted">{memberPlace(row)}</span>
              </th>
              {members.map((col, b) => {
                if (a === b) return <td key={col.fragmentId} className="border border-line bg-paper" aria-label="same member" />;
                const value = similarity.get(`${a}:${b}`);
                const label = `${row.name} (${memberPlace(row)}) and ${col.name} (${memberPlace(col)})`;
                return (
                  <td key={col.fragmentId} className="border border-line p-0">
                    <button
                      type="button"
                      aria-pressed={isSelected(a, b)}
                      aria-label={value === undefined ? `Compare ${label}: no direct pair` : `Compare ${label}: similarity ${formatSimilarity(value)}`}
                      onClick={() => onOpen(a, b)}
                      className={clsx(
                        'block w-full min-w-16 px-2 py-1 text-center tabular-nums focus-visible:outline-2 focus-visible:outline-offset-[-2px] focus-visible:outline-accent',
                        isSelected(a, b) ? 'bg-accent text-white' : value === undefined ? 'text-muted hover:bg-paper' : 'bg-accent-soft text-accent-strong hover:bg-[#cfe2d8]',
                      )}
                    >
                      {value === undefined ? '—' : formatSimilarity(value)}
                    </button>
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-2 text-xs text-muted">A dash: no pair of their own; the two are in the class through other members.</p>
    </div>
  );
}
