import type { AnalyzeOptions } from '../../analyzers/types';
import { parseThreshold, type Threshold } from '../matching/threshold';

/** The settings of a repository that decide how its snapshots are analysed and matched. */
export interface RepositorySettings {
  threshold: string | number;
  minTokens: number;
  shingleSize: number;
  ignore: string[];
}

/** Analyzer options derived from repository settings. */
export function analyzeOptions(settings: RepositorySettings): AnalyzeOptions {
  return { shingleSize: settings.shingleSize, minTokens: settings.minTokens, normalize: true, includeTypeAnnotations: false };
}

/**
 * The key under which an analysis is stored: two files with the same content analysed with the
 * same options have the same fragments, so a content is analysed once per key.
 */
export function optionsKey(options: AnalyzeOptions): string {
  return `k${options.shingleSize ?? 3}-m${options.minTokens ?? 50}-n${options.normalize === false ? 0 : 1}-t${options.includeTypeAnnotations ? 1 : 0}`;
}

/** The repository's threshold as an exact fraction. */
export function repositoryThreshold(settings: Pick<RepositorySettings, 'threshold'>): Threshold {
  return parseThreshold(settings.threshold);
}
