/** Small formatting helpers the report writers share. */
import type { CloneReport, ReportClass, ReportFragment } from '../../shared/api/clone-report';

/** A ratio as a percentage with one decimal. */
export function percent(ratio: number): string {
  return `${(ratio * 100).toFixed(1)}%`;
}

/** A class's similarity range: one value when min = max, else min–max, two decimals each. */
export function similarityRange(c: ReportClass): string {
  return c.minSimilarity === c.maxSimilarity ? c.minSimilarity.toFixed(2) : `${c.minSimilarity.toFixed(2)}–${c.maxSimilarity.toFixed(2)}`;
}

/** The report's fragments by id. */
export function fragmentIndex(report: CloneReport): Map<number, ReportFragment> {
  return new Map(report.fragments.map((f) => [f.id, f]));
}
