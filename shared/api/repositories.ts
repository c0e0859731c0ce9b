/**
 * API types and schemas of /api/repositories: tracked codebases, their settings, and the trend of
 * their clone ratio over releases.
 */
import { z } from 'zod';
import { serialIdSchema } from './ids';
import { thresholdSchema } from './threshold';

/** Path parameters of /api/repositories/:id. */
export const repositoryParamsSchema = z.object({ id: serialIdSchema('repository') });

const settingsShape = {
  description: z.string().trim().max(500, 'A description has at most 500 characters.'),
  threshold: thresholdSchema,
  minTokens: z.number().int('Whole tokens only.').min(5, 'At least 5 tokens.').max(10_000, 'At most 10000 tokens.'),
  shingleSize: z.number().int('A whole number.').min(1, 'At least 1.').max(10, 'At most 10.'),
  ignore: z.array(z.string().max(300, 'An ignore line has at most 300 characters.')).max(500, 'At most 500 ignore lines.'),
  cloneBudget: z.number().min(0, 'The budget is a share between 0 and 1.').max(1, 'The budget is a share between 0 and 1.').nullable(),
};

/** A repository name: what import, push and the web client all know it by. */
export const repositoryNameSchema = z
  .string({ error: 'Enter a name.' })
  .trim()
  .min(1, 'Enter a name.')
  .max(100, 'A name has at most 100 characters.')
  .regex(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/, 'Letters, digits, dot, dash, underscore and slash only.');

/** Body of POST /api/repositories. */
export const createRepositorySchema = z.object({ name: repositoryNameSchema, ...settingsShape }).partial({
  description: true,
  threshold: true,
  minTokens: true,
  shingleSize: true,
  ignore: true,
  cloneBudget: true,
});

/** Body of PATCH /api/repositories/:id (settings and budget). */
export const updateRepositorySchema = z.object({ name: repositoryNameSchema, ...settingsShape }).partial();

/** Input of creating a repository. */
export type CreateRepositoryInput = z.infer<typeof createRepositorySchema>;
/** Input of updating a repository. */
export type UpdateRepositoryInput = z.infer<typeof updateRepositorySchema>;

/** The latest ready snapshot as a repository row shows it. */
export interface LatestSnapshotDTO {
  id: number;
  label: string;
  cloneRatio: number | null;
  /** the clone ratio without the classes whose lineage is waived (what the budget verdict uses) */
  unwaivedCloneRatio: number | null;
  createdAt: string;
}

/** A repository as the API returns it. */
export interface RepositoryDTO {
  id: number;
  name: string;
  description: string;
  threshold: number;
  minTokens: number;
  shingleSize: number;
  ignore: string[];
  cloneBudget: number | null;
  createdAt: string;
  latestSnapshot: LatestSnapshotDTO | null;
  /** true when the latest snapshot's unwaived clone ratio is above the budget */
  overBudget: boolean;
}

/** GET /api/repositories. */
export interface RepositoryListDTO {
  repositories: RepositoryDTO[];
}

/** One point of the trend: a ready snapshot's figures. */
export interface TrendPointDTO {
  snapshotId: number;
  label: string;
  createdAt: string;
  cloneRatio: number;
  fragmentTokens: number;
  clonedTokens: number;
  pairCount: number;
  classCount: number;
  crossPairCount: number;
  newClassCount: number;
  driftedClassCount: number;
  goneClassCount: number;
}

/** GET /api/repositories/:id/metrics: the figures over releases, oldest first. */
export interface RepositoryMetricsDTO {
  repositoryId: number;
  cloneBudget: number | null;
  points: TrendPointDTO[];
}

/** Most nodes (directories and files) a clone map holds: a deeper tree loses its deepest levels. */
export const CLONE_MAP_MAX_NODES = 400;

/** A directory (path ending with "/") or file of the clone map. */
export interface CloneMapNodeDTO {
  name: string;
  path: string;
  /** tokens inside fragments, each counted once */
  tokens: number;
  /** of those, tokens in at least one clone pair */
  clonedTokens: number;
  children?: CloneMapNodeDTO[];
}

/** GET /api/repositories/:id/clone-map: the latest ready snapshot's directory tree. */
export interface CloneMapDTO {
  repositoryId: number;
  /** null until a snapshot is ready */
  snapshot: { id: number; label: string } | null;
  root: CloneMapNodeDTO | null;
  /** false when the deepest levels were left out to stay within CLONE_MAP_MAX_NODES */
  complete: boolean;
}
