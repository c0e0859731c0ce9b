/**
 * The clone report: what `doublet scan --format json` writes (from folders, in memory) and what
 * `doublet classes` writes (from a snapshot in the database). One schema, so that CI scripts
 * read both the same way. Counts are named as the web API names them (fragmentCount,
 * fragmentTokens, pairCount, classCount).
 */
import { z } from 'zod';

const count = z.number().int().nonnegative();
const share = z.number().min(0).max(1);

/** The settings the report was made with. */
export const reportSettingsSchema = z.object({
  /** Jaccard threshold, for display (the join itself compares exact fractions). */
  threshold: share,
  /** Fragments with fewer raw tokens were dropped. */
  minTokens: count,
  /** Shingle size k. */
  shingleSize: z.number().int().positive(),
  /** Folders scanned, as given on the command line (scan). */
  roots: z.array(z.string()).optional(),
  /** Repository and release label (reports made from the database). */
  repository: z.string().optional(),
  snapshot: z.string().optional(),
});

/** Totals. Clone ratio = clonedTokens / fragmentTokens (0 when there are no tokens). */
export const reportStatsSchema = z.object({
  /** Files analysed (parsed or failed). */
  files: count,
  /** Files not analysed (ignore rules, size, binary, unknown language…). */
  skippedFiles: count,
  /** Files that failed to parse or were cut off by the time limit. */
  failedFiles: count,
  fragmentCount: count,
  /** Source tokens inside fragments, each counted once (a nested function's tokens lie in its outer one too). */
  fragmentTokens: count,
  /** Source tokens inside fragments that are in at least one clone pair, each counted once. */
  clonedTokens: count,
  cloneRatio: share,
  pairCount: count,
  classCount: count,
  /** Join counters (scan only). */
  candidates: count.optional(),
  verified: count.optional(),
  /** Wall time of the whole run in milliseconds (scan only). */
  durationMs: z.number().nonnegative().optional(),
});

/** One function-level unit of code. `file` is relative to the folder scanned, with `/`. */
export const reportFragmentSchema = z.object({
  id: count,
  file: z.string().min(1),
  name: z.string(),
  startLine: z.number().int().positive(),
  endLine: z.number().int().positive(),
  tokens: count,
  /**
   * Set only on fragments of other repositories (`doublet classes --cross`): "name@label" of the
   * snapshot they stand in. Stats and classes cover the report's own fragments alone.
   */
  repository: z.string().optional(),
});

/** A clone pair (a < b, fragment ids) with its Jaccard similarity and clone type. */
export const reportPairSchema = z
  .object({
    a: count,
    b: count,
    similarity: share,
    type: z.union([z.literal(1), z.literal(2), z.literal(3)]),
  })
  .refine((pair) => pair.a < pair.b, { message: 'a pair names the lower fragment id first (a < b)' });

/** A clone class: a connected component of clone pairs, members sorted ascending. */
export const reportClassSchema = z.object({
  id: z.number().int().positive(),
  members: z.array(count).min(2),
  /** Lowest and highest similarity among the class's clone pairs. */
  minSimilarity: share,
  maxSimilarity: share,
});

/** The whole report. Classes come largest first. */
export const cloneReportSchema = z.object({
  settings: reportSettingsSchema,
  stats: reportStatsSchema,
  fragments: z.array(reportFragmentSchema),
  pairs: z.array(reportPairSchema),
  classes: z.array(reportClassSchema),
});

export type ReportSettings = z.infer<typeof reportSettingsSchema>;
export type ReportStats = z.infer<typeof reportStatsSchema>;
export type ReportFragment = z.infer<typeof reportFragmentSchema>;
export type ReportPair = z.infer<typeof reportPairSchema>;
export type ReportClass = z.infer<typeof reportClassSchema>;
/** The clone report (see cloneReportSchema). */
export type CloneReport = z.infer<typeof cloneReportSchema>;
