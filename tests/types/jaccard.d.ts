/**
 * Types for jaccard@0.4.0 (npm; CommonJS, ships none). Only the synchronous forms are used.
 * Beware: it counts duplicates in its first array, and gives NaN for two empty arrays.
 */
declare module 'jaccard' {
  const jaccard: {
    /** |a ∩ b| / |a ∪ b| of two arrays compared with indexOf. */
    index(a: readonly unknown[], b: readonly unknown[]): number;
    /** 1 − index(a, b). */
    distance(a: readonly unknown[], b: readonly unknown[]): number;
  };
  export = jaccard;
}
