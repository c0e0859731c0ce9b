/**
 * The clone report: built once from fragments and clone pairs (by `doublet scan` from folders in
 * memory, by `doublet classes` from the database), then written as text, JSON, CSV or SARIF
 * (write.ts). Pure functions: the caller decides where the text goes. Source text never enters a
 * report, only paths, names, lines and counts.
 */
import type { CloneReport, ReportClass, ReportFragment, ReportPair, ReportSettings } from '../../shared/api/clone-report';
import { cloneClasses, clonedTokens, cloneType } from '../matching/classes';
import { classStats } from './class-stats';

/** A fragment as the report needs it; `id` defaults to its index in the input. */
export interface ReportFragmentInput {
  id?: number;
  /** Relative to the folder scanned, with `/`. */
  file: string;
  name: string;
  startLine: number;
  endLine: number;
  tokens: number;
  /** The fragment's token range in its file (Fragment.tokenStart/tokenEnd): the clone ratio counts each token once. */
  tokenStart: number;
  tokenEnd: number;
  rawHash: string;
  normalizedHash: string;
}

/** A clone pair by INDEX into the fragments array, with its Jaccard similarity. */
export interface ReportPairInput {
  a: number;
  b: number;
  similarity: number;
}

/** Everything buildReport needs. */
export interface BuildReportInput {
  settings: ReportSettings;
  fragments: readonly ReportFragmentInput[];
  pairs: readonly ReportPairInput[];
  /** File counts: analyzed (parsed or failed), skipped, failed. */
  files?: { analyzed: number; skipped: number; failed: number };
  /** Join counters, when the join ran here. */
  join?: { candidates: number; verified: number };
  durationMs?: number;
}

/**
 * Builds the report: clone types from the hashes, clone classes (connected components, largest
 * first, ids 1, 2, … in that order) with their similarity range, and the clone ratio.
 *
 * @example
 * buildReport({ settings: { threshold: 0.8, minTokens: 50, shingleSize: 3 }, fragments, pairs: [{ a: 0, b: 2, similarity: 0.9 }] })
 * // { stats: { pairCount: 1, classCount: 1, … }, classes: [{ id: 1, members: [0, 2], minSimilarity: 0.9, maxSimilarity: 0.9 }], … }
 * @throws when a pair names a fragment outside the list or fragment ids repeat
 */
export function buildReport(input: BuildReportInput): CloneReport {
  const { settings, fragments: inputs, pairs: inputPairs } = input;
  const ids = inputs.map((fragment, index) => fragment.id ?? index);
  if (new Set(ids).size !== ids.length) throw new Error('buildReport: fragment ids must be unique');
  const fragments: ReportFragment[] = inputs.map((f, index) => ({
    id: ids[index],
    file: f.file,
    name: f.name,
    startLine: f.startLine,
    endLine: f.endLine,
    tokens: f.tokens,
  }));

  const classesByIndex = cloneClasses(inputs.length, inputPairs);
  const pairs: ReportPair[] = [];
  const typed: { a: number; b: number; similarity: number; type: 1 | 2 | 3 }[] = [];
  for (const { a, b, similarity } of inputPairs) {
    if (a === b) continue;
    const [x, y] = ids[a] < ids[b] ? [a, b] : [b, a];
    const type = cloneType(inputs[x], inputs[y]);
    typed.push({ a, b, similarity, type });
    pairs.push({ a: ids[x], b: ids[y], similarity, type });
  }
  pairs.sort((p, q) => p.a - q.a || p.b - q.b);
  const stats = classStats(inputs.length, classesByIndex, typed);
  const classes: ReportClass[] = classesByIndex.map((members, c) => ({
    id: c + 1,
    members: members.map((m) => ids[m]).sort((x, y) => x - y),
    minSimilarity: stats[c].minSimilarity,
    maxSimilarity: stats[c].maxSimilarity,
  }));

  const { cloned, total } = clonedTokens(
    inputs,
    inputPairs.filter(({ a, b }) => a !== b),
  );
  return {
    settings,
    stats: {
      files: input.files?.analyzed ?? new Set(inputs.map((f) => f.file)).size,
      skippedFiles: input.files?.skipped ?? 0,
      failedFiles: input.files?.failed ?? 0,
      fragmentCount: fragments.length,
      fragmentTokens: total,
      clonedTokens: cloned,
      cloneRatio: total === 0 ? 0 : cloned / total,
      pairCount: pairs.length,
      classCount: classes.length,
      ...(input.join ? { candidates: input.join.candidates, verified: input.join.verified } : {}),
      ...(input.durationMs !== undefined ? { durationMs: Math.round(input.durationMs) } : {}),
    },
    fragments,
    pairs,
    classes,
  };
}

