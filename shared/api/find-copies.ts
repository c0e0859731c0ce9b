/** API types and schemas of POST /api/find-copies: every indexed copy of a pasted snippet. */
import { z } from 'zod';
import { thresholdSchema } from './threshold';

/** Languages a snippet may be in (the analyzers' language ids). */
export const SNIPPET_LANGUAGES = ['javascript', 'typescript', 'python', 'java', 'go', 'csharp', 'c', 'cpp'] as const;

/** Body of POST /api/find-copies. */
export const findCopiesSchema = z.object({
  language: z.enum(SNIPPET_LANGUAGES, { error: `The language is one of ${SNIPPET_LANGUAGES.join(', ')}.` }),
  text: z.string({ error: 'Paste some code.' }).min(1, 'Paste some code.').max(200_000, 'A snippet has at most 200000 characters.'),
  threshold: thresholdSchema.optional(),
});
/** Input of find copies. */
export type FindCopiesInput = z.infer<typeof findCopiesSchema>;

/** One copy found. */
export interface FoundCopyDTO {
  repositoryId: number;
  repositoryName: string;
  snapshotId: number;
  snapshotLabel: string;
  path: string;
  name: string;
  startLine: number;
  endLine: number;
  similarity: number;
  snippetFragment: string;
}

/** The answer of POST /api/find-copies. */
export interface FindCopiesResultDTO {
  threshold: number;
  copies: FoundCopyDTO[];
}
