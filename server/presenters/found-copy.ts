import type { FoundCopyDTO } from '../../shared/api/find-copies';
import type { FoundCopy } from '../commands/findCopies';

/** A copy found by find copies, as the API shows it. */
export function presentFoundCopy(copy: FoundCopy): FoundCopyDTO {
  return {
    repositoryId: copy.repositoryId,
    repositoryName: copy.repositoryName,
    snapshotId: copy.snapshotId,
    snapshotLabel: copy.snapshotLabel,
    path: copy.path,
    name: copy.name,
    startLine: copy.startLine,
    endLine: copy.endLine,
    similarity: copy.similarity,
    snippetFragment: copy.snippetFragment,
  };
}
