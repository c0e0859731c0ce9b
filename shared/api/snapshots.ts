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

/** Where a snapshot's load stands: waiting for a worker, in progress, done, failed with its reason, or cancelled. */
export const SNAPSHOT_STATUSES = ['queued', 'running', 'ready', 'failed', 'cancelled'] as const;
/** A snapshot status. */
export type SnapshotStatus = (typeof SNAPSHOT_STATUSES)[number];

/** Whether a load in this status may still change (it is waiting or in progress). */
export function isLoadActive(status: SnapshotStatus): boolean {
  return status === 'queued' || status === 'running';
}

/**
 * The steps of a load, in order: reading the archive, analysing the files never analysed before,
 * adding their fragments' shingle sets to the index, then deriving the snapshot's pairs and classes.
 */
export const LOAD_PHASES = ['unpacking', 'analysing', 'indexing', 'deriving'] as const;
/** A load phase. */
export type LoadPhase = (typeof LOAD_PHASES)[number];

/** How far a queued or running load has got: its phase and `done` of `total` (files, sets; 0 of 0 when the phase has no count). */
export interface LoadProgressDTO {
  phase: LoadPhase;
  done: number;
  total: number;
}

/** Largest archive label: a release name. */
export const MAX_LABEL_LENGTH = 100;

/** Text fields of POST /api/repositories/:id/snapshots (multipart/form-data; the file is the `archive` field). */
export const uploadSnapshotSchema = z
  .object({
    label: z
      .string({ error: 'Name the release in the field "label".' })
      .trim()
      .min(1, 'Name the release in the field "label".')
      .max(MAX_LABEL_LENGTH, `A label has at most ${MAX_LABEL_LENGTH} characters.`)
      .refine((label) => ![...label].some((c) => c.charCodeAt(0) < 32 || c.charCodeAt(0) === 127), 'A label may not hold control characters.'),
  })
  .strict();
/** Parsed upload fields. */
export type UploadSnapshotInput = z.infer<typeof uploadSnapshotSchema>;

/** POST /api/repositories/:id/snapshots (202 for a new load, 200 for the same archive sent again under its label) and POST /api/snapshots/:id/cancel. */
export interface SnapshotAnswerDTO {
  snapshot: SnapshotDTO;
}

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
  /** why the load failed, in words (null unless failed) */
  error: string | null;
  /** where a queued or running load stands (null once it has ended) */
  progress: LoadProgressDTO | null;
  /** who uploaded it (null for loads started from the command line, or once that user is deleted) */
  startedById: string | null;
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
