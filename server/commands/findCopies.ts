import { analyzeSnippetInPool } from '../../analyzers';
import { INDEX_MIN_THRESHOLD } from '../../shared/constants';
import { findSimilarSets, locateSets, type CopyLocation } from '../clone-index/find-copies';
import { select } from '../clone-index/sql';
import { HttpError, ValidationError } from '../errors';
import { parseThreshold, thresholdValue } from '../matching/threshold';

/** One copy found: where it stands and how similar it is to the snippet's fragment. */
export interface FoundCopy extends CopyLocation {
  /** the fragment of the snippet it matches (a snippet may hold several functions) */
  snippetFragment: string;
  similarity: number;
}

/** What find copies searches with. */
export interface FindCopiesInput {
  organisationId: string;
  language: string;
  text: string;
  /** default 0.8; at least the index threshold */
  threshold?: number;
}

/**
 * Every fragment in the latest snapshot of each repository of the organisation whose similarity
 * to the pasted snippet reaches the threshold. The snippet is analysed with each shingle size the
 * organisation's repositories use, and compared only with repositories that use the same size.
 * The snippet text is never stored or logged. It is analysed in the analyzers' worker pool under
 * the analysis bounds: a snippet over one is refused with 422 naming it, and `signal` (the client
 * going away) stops the analysis and rejects with the signal's reason.
 */
export async function findCopies(input: FindCopiesInput, options: { signal?: AbortSignal } = {}): Promise<FoundCopy[]> {
  const t = parseThreshold(input.threshold ?? 0.8);
  if (thresholdValue(t) < INDEX_MIN_THRESHOLD) {
    throw new ValidationError(`threshold must be at least ${INDEX_MIN_THRESHOLD}`, 'threshold');
  }
  const sizes = await select<{ shingleSize: number; repositoryIds: number[] }>(
    undefined,
    `select shingle_size as "shingleSize", array_agg(id) as "repositoryIds" from repositories
      where organisation_id = $1 group by shingle_size`,
    [input.organisationId],
  );
  const found: FoundCopy[] = [];
  for (const { shingleSize, repositoryIds } of sizes) {
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
