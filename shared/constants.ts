/**
 * The lowest Jaccard threshold any repository may use. The prefix index is written for it, and an
 * index prefix for this threshold serves every query at or above it exactly.
 */
export const INDEX_MIN_THRESHOLD = 0.6;

/** Default analysis settings of a new repository. */
export const DEFAULT_REPOSITORY_SETTINGS = {
  threshold: 0.8,
  minTokens: 50,
  shingleSize: 3,
} as const;
