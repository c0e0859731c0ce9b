import { analyzeSnippetInPool } from '../../analyzers';
import type { FindCopiesInput } from '../../shared/api/find-copies';
import { DEFAULT_REPOSITORY_SETTINGS } from '../../shared/constants';
import { findSimilarSets, locateSets, type CopyLocation } from '../clone-index/find-copies';
import { servedThreshold } from '../clone-index/options';
import { HttpError, ValidationError } from '../errors';
import { repositoriesByShingleSize } from '../queries/repositories';

/** One copy found: where it stands and how similar it is to the snippet's fragment. */
export interface FoundCopy extends CopyLocation {
  /** the fragment of the snippet it matches (a snippet may hold several functions) */
  snippetFragment: string;
  similarity: number;
}

/**
 * Every fragment in the latest snapshot of each repository of the organisation whose similarity
 * to the pasted snippet reaches the threshold (default: the repositories' default, at least the
 * index threshold). The snippet is analyzed with each shingle size the organisation's
 * repositories use, and compared only with repositories that use the same size. The snippet text
 * is never stored or logged. It is analyzed in the analyzers' worker pool under the analysis
 * bounds: a snippet over one is refused with 422 naming it, and `signal` (the client going away)
 * stops the analysis and rejects with the signal's reason.
 */
export async function findCopies(input: FindCopiesInput & { organisationId: string }, options: { signal?: AbortSignal } = {}): Promise<FoundCopy[]> {
  const t = servedThreshold(input.threshold ?? DEFAULT_REPOSITORY_SETTINGS.threshold);
  const found: FoundCopy[] = [];
  for (const { shingleSize, repositoryIds } of await repositoriesByShingleSize(input.organisationId)) {
    const outcome = await analyzeSnippetInPool(input.language, input.text, { shingleSize, minTokens: 1, signal: options.signal });
    if (!outcome.ok) {
      if (outcome.refusal === 'invalid') throw new ValidationError(outcome.message, 'text');
      if (outcome.refusal === 'busy') throw new HttpError(503, 'busy', outcome.message);
      throw new HttpError(422, 'analysis_limit', `the snippet was refused: ${outcome.message}`, 'text');
    }
    for (const fragment of outcome.fragments) {
      const similar = await findSimilarSets(undefined, fragment.shingles, t);
      const similarity = new Map(similar.map((s) => [s.setId, s.similarity]));
      const locations = await locateSets(undefined, input.organisationId, [...similarity.keys()]);
      for (const location of locations) {
        if (!repositoryIds.includes(location.repositoryId)) continue;
        found.push({ ...location, snippetFragment: fragment.name, similarity: similarity.get(location.setId)! });
      }
    }
  }
  return found.sort((a, b) => b.similarity - a.similarity || a.repositoryName.localeCompare(b.repositoryName) || a.path.localeCompare(b.path) || a.startLine - b.startLine);
}
