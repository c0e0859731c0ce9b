import type { AnalyzeOptions } from '../../analyzers/types';
import { DEFAULT_REPOSITORY_SETTINGS, INDEX_MIN_THRESHOLD } from '../../shared/constants';
import { ValidationError } from '../errors';
import { parseThreshold, type Threshold } from '../matching/threshold';

/** The settings of a repository that decide how its snapshots are analyzed and matched. */
export interface RepositorySettings {
  threshold: string | number;
  minTokens: number;
  shingleSize: number;
  ignore: string[];
}

/** The threshold the stored prefixes and set pairs are written for (the lowest a repository may use). */
export const indexThreshold: Threshold = parseThreshold(INDEX_MIN_THRESHOLD);

/** Analyzer options derived from repository settings. */
export function analyzeOptions(settings: RepositorySettings): AnalyzeOptions {
  return { shingleSize: settings.shingleSize, minTokens: settings.minTokens, normalize: true, includeTypeAnnotations: false };
}

/**
 * The key under which an analysis is stored: two files with the same content analyzed with the
 * same options have the same fragments, so a content is analyzed once per key. Missing options
 * take the shared defaults, the same ones the analyzers fill in.
 *
 * @example optionsKey({ shingleSize: 3, minTokens: 50 }) // 'k3-m50-n1-t0'
 */
export function optionsKey(options: AnalyzeOptions): string {
  const shingleSize = options.shingleSize ?? DEFAULT_REPOSITORY_SETTINGS.shingleSize;
  const minTokens = options.minTokens ?? DEFAULT_REPOSITORY_SETTINGS.minTokens;
  return `k${shingleSize}-m${minTokens}-n${options.normalize === false ? 0 : 1}-t${options.includeTypeAnnotations ? 1 : 0}`;
}

/** The repository's threshold as an exact fraction. */
export function repositoryThreshold(settings: Pick<RepositorySettings, 'threshold'>): Threshold {
  return parseThreshold(settings.threshold);
}

/**
 * A threshold the index can answer exactly: parsed into a fraction and compared in integers with
 * the index threshold (below it, pairs would be missed: the stored prefixes are too short).
 *
 * @example servedThreshold(0.8) // { p: 4, q: 5 }
 * @throws ValidationError on `field` when the value is not a threshold or is below the index threshold
 */
export function servedThreshold(value: string | number, field = 'threshold'): Threshold {
  let t: Threshold;
  try {
    t = parseThreshold(value);
  } catch (error) {
    throw new ValidationError((error as Error).message, field);
  }
  if (t.p * indexThreshold.q < indexThreshold.p * t.q) {
    throw new ValidationError(`${field} must be at least ${INDEX_MIN_THRESHOLD} (the index is built for it), got ${value}`, field);
  }
  return t;
}
