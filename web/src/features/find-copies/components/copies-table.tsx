import { Link } from 'react-router-dom';
import type { FindCopiesResultDTO } from '@shared/api/find-copies';
import { formatLocation, formatSimilarity } from '@/lib/format';

/** The copies found, most similar first; the release links to that snapshot's clone classes. */
export function CopiesTable({ result }: { result: FindCopiesResultDTO }) {
  if (result.copies.length === 0) {
    return (
      <p className="text-sm text-muted">
        No indexed function reaches similarity {formatSimilarity(result.threshold)} with the pasted code.
      </p>
    );
  }
  // Which pasted function a copy matches only needs saying when more than one was pasted.
  const several = new Set(result.copies.map((c) => c.snippetFragment)).size > 1;
  const copies = [...result.copies].sort((x, y) => y.similarity - x.similarity || x.path.localeCompare(y.path));
  return (
    <table className="w-full text-sm" aria-label="Copies found">
      <thead>
        <tr className="text-left text-xs tracking-wide text-muted uppercase">
          <th className="pb-2 font-semibold">Similarity</th>
          <th className="pb-2 font-semibold">Release</th>
          <th className="pb-2 font-semibold">Location</th>
          <th className="pb-2 font-semibold">Function</th>
        </tr>
      </thead>
      <tbody className="font-mono text-xs">
        {copies.map((copy) => (
          <tr key={`${copy.snapshotId}:${copy.path}:${copy.startLine}:${copy.snippetFragment}`} className="border-t border-line">
            <td className="py-1.5 pr-4 tabular-nums">{formatSimilarity(copy.similarity)}</td>
            <td className="py-1.5 pr-4">
              <Link to={`/snapshots/${copy.snapshotId}`} className="text-accent hover:underline">
                {copy.repositoryName}@{copy.snapshotLabel}
              </Link>
            </td>
            <td className="py-1.5 pr-4">{formatLocation(copy.path, copy.startLine, copy.endLine)}</td>
            <td className="py-1.5">
              {copy.name}
              {several ? <span className="ml-2 text-muted">copy of pasted {copy.snippetFragment}</span> : null}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
