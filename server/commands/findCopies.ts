import { analyzeSnippet } from '../../analyzers';
import type { FindCopiesInput } from '../../shared/api/find-copies';
import { DEFAULT_REPOSITORY_SETTINGS } from '../../shared/constants';
import { findSimilarSets, locateSets, type CopyLocation } from '../clone-index/find-copies';
import { servedThreshold } from '../clone-index/options';
import { ValidationError } from '../errors';
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
 * is never stored or logged.
 */
export async function findCopies(input: FindCopiesInput & { organisationId: string }): Promise<FoundCopy[]> {
  const t = servedThreshold(input.threshold ?? DEFAULT_REPOSITORY_SETTINGS.threshold);
  const found: FoundCopy[] = [];
  for (const { shingleSize, repositoryIds } of await repositoriesByShingleSize(input.organisationId)) {
    let fragments;
    try {
      fragments = await analyzeSnippet(input.language, input.text, { shingleSize, minTokens: 1 });
    } catch (error) {
      throw new ValidationError(error instanceof Error ? error.message : String(error), 'text');
    }
    for (const fragment of fragments) {
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
