/**
 * The bounds of shared/constants.ts ANALYSIS_LIMITS as checks. Each refusal is an
 * AnalysisLimitError whose message names the bound, for the file's error record or the 4xx answer
 * to a snippet; it never quotes the source.
 */
import { ANALYSIS_LIMITS } from '../shared/constants';

/** Which bound an input went over (`time` and `memory`: the pool's per-file limits). */
export type AnalysisLimit = 'nesting' | 'fragments' | 'nestedTokens' | 'time' | 'memory';

/** An input refused because it goes over one of the analysis bounds. */
export class AnalysisLimitError extends Error {
  constructor(
    readonly limit: AnalysisLimit,
    message: string,
  ) {
    super(message);
    this.name = 'AnalysisLimitError';
  }
}

/**
 * Throws when functions and classes nest deeper than ANALYSIS_LIMITS.maxNestingDepth; `depth`
 * counts the one being entered. Every language's walker calls it, so the bound is the same in all.
 *
 * @example checkNestingDepth(101) // throws: "functions and classes nested more than 100 deep (nesting limit)"
 */
export function checkNestingDepth(depth: number): void {
  if (depth > ANALYSIS_LIMITS.maxNestingDepth) {
    throw new AnalysisLimitError(
      'nesting',
      `functions and classes nested more than ${ANALYSIS_LIMITS.maxNestingDepth} deep (nesting limit)`,
    );
  }
}

/**
 * Throws when the fragments about to be built are too many, or hold too many tokens together
 * (a nested fragment's tokens count in each fragment around it), for a file of `fileTokens`
 * tokens.
 *
 * @example checkFragmentWork(12_000, 50_000, 200_000) // throws: "… more than 10,000 fragments (fragment limit)"
 */
export function checkFragmentWork(
  fragments: number,
  fragmentTokens: number,
  fileTokens: number,
  maxFragments: number = ANALYSIS_LIMITS.maxFragmentsPerFile,
): void {
  if (fragments > maxFragments) {
    throw new AnalysisLimitError('fragments', `${fragments.toLocaleString('en')} fragments, more than ${maxFragments.toLocaleString('en')} (fragment limit)`);
  }
  const factor = ANALYSIS_LIMITS.maxNestedTokenFactor;
  if (fragmentTokens > factor * fileTokens) {
    throw new AnalysisLimitError(
      'nestedTokens',
      `nested fragments hold ${(fragmentTokens / fileTokens).toFixed(1)} times the file's tokens, more than ${factor} times (nested-token limit)`,
    );
  }
}
