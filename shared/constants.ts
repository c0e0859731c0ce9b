/**
 * The lowest Jaccard threshold any repository may use. The prefix index is written for it, and an
 * index prefix for this threshold serves every query at or above it exactly.
 */
export const INDEX_MIN_THRESHOLD = 0.6;

/**
 * Default analysis settings of a new repository, of `doublet scan` without flags and of find copies
 * without a threshold. A repository keeps the settings stored when it was created. The threshold
 * is 0.7 because the detection-quality benchmark (`npm run bench:quality`, README "Why 0.7") finds
 * every copy with one inserted statement there, against 87.5 % at 0.8.
 */
export const DEFAULT_REPOSITORY_SETTINGS = {
  threshold: 0.7,
  minTokens: 50,
  shingleSize: 3,
} as const;

/**
 * Bounds on the analysis of one file or pasted snippet, so that no input can make the work grow
 * faster than its size. A nested function is a fragment of its own and its tokens count again in
 * every function around it, so without them nesting makes the work grow with the square of the
 * depth. An input over a bound is refused with a reason that names it. Measured on 1,530
 * published and own JS/TS files: at most 9 levels of nested functions, and all fragments
 * together at most 2.9 times the file's tokens.
 */
export const ANALYSIS_LIMITS = {
  /** Functions and classes nested inside each other, at most (every language). */
  maxNestingDepth: 100,
  /** Fragments kept in one file, at most. */
  maxFragmentsPerFile: 10_000,
  /** Fragments of one snippet for find copies, at most (each is searched for on its own). */
  maxSnippetFragments: 1_000,
  /** The tokens of all kept fragments together, at most this multiple of the file's own tokens. */
  maxNestedTokenFactor: 8,
} as const;
