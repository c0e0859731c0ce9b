/** The one schema of a Jaccard threshold a request may carry (repository settings, find copies). */
import { z } from 'zod';
import { INDEX_MIN_THRESHOLD } from '../constants';
import { hasAtMostSixDecimals } from './ids';

/**
 * A threshold between the index threshold and 1 with at most six decimals (the server keeps it
 * as an exact fraction; below the index threshold the stored prefixes are too short).
 *
 * @example thresholdSchema.parse(0.85) // 0.85
 */
export const thresholdSchema = z
  .number({ error: 'The threshold is a number.' })
  .min(INDEX_MIN_THRESHOLD, `The threshold is at least ${INDEX_MIN_THRESHOLD}.`)
  .max(1, 'The threshold is at most 1.')
  .refine(hasAtMostSixDecimals, 'The threshold has at most six decimals.');
