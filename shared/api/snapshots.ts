/**
 * API types and schemas of snapshots and their clone classes: listing, one snapshot, its classes
 * (sorted, filtered, paginated on the server), one class with its members' code, and the
 * comparison with the previous snapshot.
 */
import { z } from 'zod';
import { serialIdSchema } from './ids';

/** Path parameters of /api/snapshots/:id and /api/clone-classes/:id. */
export const idParamsSchema = z.object({ id: serialIdSchema('record') });

/** What a class is, compared with the previous snapshot. */
export const CLASS_STATUSES = ['new', 'unchanged', 'grown', 'shrunk', 'edited', 'drifted'] as const;
/** A class status. */
export type ClassStatus = (typeof CLASS_STATUSES)[number];

/** Query of GET /api/snapshots/:id/classes. */
export const classListQuerySchema = z.object({
  sort: z.enum(['size', 'tokens', 'similarity', 'type']).default('tokens'),
  order: z.enum(['asc', 'desc']).default('desc'),
  type: z.coerce.number().int().min(1).max(3).optional(),
  language: z.string().max(40).optional(),
  path: z.string().max(300, 'A path filter has at most 300 characters.').optional(),
  status: z.enum(CLASS_STATUSES).optional(),
  /** only the waived classes, or all but them (absent: both) */
  waived: z.enum(['only', 'exclude']).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200, 'At most 200 a page.').default(50),
});
/** Parsed class list query. */
export type ClassListQuery = z.infer<typeof classListQuerySchema>;

/** Where a snapshot's load stands: queued, running, done, or failed with its reason. */
export const SNAPSHOT_STATUSES = ['pending', 'running', 'ready', 'failed'] as const;
/** A snapshot status. */
export type SnapshotStatus = (typeof SNAPSHOT_STATUSES)[number];

/** A snapshot's figures (absent until the load has finished). */
export interface SnapshotMetricsDTO {
  fragmentTokens: number;
  clonedTokens: number;
  cloneRatio: number;
  /** cloned tokens without the classes whose lineage is waived */
  unwaivedClonedTokens: number;
  /** the clone ratio without the classes whose lineage is waived */
  unwaivedCloneRatio: number;
  pairCount: number;
  classCount: number;
  type1Pairs: number;
  type2Pairs: number;
  type3Pairs: number;
  crossPairCount: number;
  newClassCount: number;
  driftedClassCount: number;
  goneClassCount: number;
}

/** A snapshot as the API returns it. */
export interface SnapshotDTO {
  id: number;
  repositoryId: number;
  label: string;
  source: string;
  commitSha: string | null;
  status: SnapshotStatus;
  error: string | null;
  fileCount: number;
  skippedCount: number;
  failedCount: number;
  analyzedFileCount: number;
  fragmentCount: number;
  newSetCount: number;
  cloneRatio: number | null;
  timings: Record<string, number>;
  createdAt: string;
  metrics: SnapshotMetricsDTO | null;
}

/** GET /api/repositories/:id/snapshots, newest first. */
export interface SnapshotListDTO {
  snapshots: SnapshotDTO[];
}

/** A clone class as a list row shows it. */
export interface CloneClassSummaryDTO {
  id: number;
  snapshotId: number;
  size: number;
  tokens: number;
  minSimilarity: number;
  maxSimilarity: number;
  cloneType: number;
  language: string;
  status: ClassStatus;
  /** the class lineage it belongs to: the same group of copies across snapshots (tasks and waivers point at it) */
  lineageId: number;
  /** the members' paths, for the list (at most five) */
  paths: string[];
  /** the lineage's active waiver: the class is left out of the budget verdict */
  waiver: ClassWaiverDTO | null;
  /** the lineage's last waiver, when it ended by itself in this class's snapshot (a new member joined) */
  waiverEnded: { reason: string; snapshotLabel: string } | null;
}

/** A lead's waiver of a class lineage, as class views show it. */
export interface ClassWaiverDTO {
  reason: string;
  /** "until release …", as the lead wrote it */
  untilLabel: string | null;
  /** null once that user is deleted */
  createdByName: string | null;
  createdAt: string;
}

/** Body of POST /api/clone-classes/:id/waiver. */
export const waiveClassSchema = z
  .object({
    reason: z.string().trim().min(1, 'A waiver needs a reason.').max(500, 'A reason has at most 500 characters.'),
    untilLabel: z.string().trim().min(1, 'Leave "until release" out, or name the release.').max(100, 'A release label has at most 100 characters.').optional(),
  })
  .strict();
/** Parsed waiver body. */
export type WaiveClassInput = z.infer<typeof waiveClassSchema>;

/** POST /api/clone-classes/:id/waiver. */
export interface WaiverCreatedDTO {
  waiver: ClassWaiverDTO;
}

/** GET /api/snapshots/:id/classes. */
export interface CloneClassPageDTO {
  classes: CloneClassSummaryDTO[];
  total: number;
  /** how many of the classes the other filters match are waived (whatever the waived filter says) */
  waivedCount: number;
  page: number;
  pageSize: number;
}

/** A member of a class with its code. */
export interface CloneClassMemberDTO {
  fragmentId: number;
  path: string;
  name: string;
  kind: string;
  startLine: number;
  endLine: number;
  tokens: number;
  /** whether its code changed since the previous snapshot */
  changed: boolean;
  /** the fragment's source lines (startLine..endLine) */
  code: string;
  /** set on the members of a class that spans repositories: the repository the member is in */
  repositoryName?: string;
}

/** A pair inside a class, by member index. */
export interface CloneClassPairDTO {
  a: number;
  b: number;
  similarity: number;
  type: 1 | 2 | 3;
}

/** GET /api/clone-classes/:id. */
export interface CloneClassDetailDTO extends CloneClassSummaryDTO {
  repositoryId: number;
  snapshotLabel: string;
  members: CloneClassMemberDTO[];
  pairs: CloneClassPairDTO[];
}

/** A previous snapshot's class that no current class continues. */
export interface GoneClassDTO {
  id: number;
  size: number;
  tokens: number;
  paths: string[];
}

/** GET /api/snapshots/:id/comparison. */
export interface SnapshotComparisonDTO {
  snapshotId: number;
  previous: { id: number; label: string } | null;
  counts: Record<ClassStatus | 'gone', number>;
  classes: CloneClassSummaryDTO[];
  gone: GoneClassDTO[];
}
