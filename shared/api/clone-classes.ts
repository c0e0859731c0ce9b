/**
 * API types and schemas of the organisation's clone classes: the list across the latest ready
 * snapshot of every repository (classes within one repository and classes that span several),
 * and one class that spans repositories with its members' code.
 */
import { z } from 'zod';
import { serialIdSchema } from './ids';
import { CLASS_STATUSES, type ClassStatus, type ClassWaiverDTO, type CloneClassMemberDTO, type CloneClassPairDTO } from './snapshots';

/** Where a class lies: within one repository, or across several. */
export const CLASS_SCOPES = ['within', 'across'] as const;
/** A class scope. */
export type ClassScope = (typeof CLASS_SCOPES)[number];

/** Sort keys of the organisation's class list. */
export const ORGANISATION_CLASS_SORTS = ['tokens', 'size', 'similarity', 'type', 'repository'] as const;

/** Most rows a page of the organisation's class list may hold. */
export const MAX_CLASS_PAGE_SIZE = 100;

/** Query of GET /api/clone-classes: every filter optional, sorted and paged on the server. */
export const organisationClassQuerySchema = z.object({
  repository: serialIdSchema('repository').optional(),
  language: z.string().max(40, 'A language has at most 40 characters.').optional(),
  type: z.coerce.number().int('A clone type is 1, 2 or 3.').min(1, 'A clone type is 1, 2 or 3.').max(3, 'A clone type is 1, 2 or 3.').optional(),
  status: z.enum(CLASS_STATUSES).optional(),
  /** only the waived classes, or all but them (absent: both) */
  waived: z.enum(['only', 'exclude']).optional(),
  /** only classes within one repository, or only those that span repositories (absent: both) */
  scope: z.enum(CLASS_SCOPES).optional(),
  minMembers: z.coerce.number().int('Whole members only.').min(2, 'A class has at least 2 members.').max(100_000, 'At most 100000 members.').optional(),
  minTokens: z.coerce.number().int('Whole tokens only.').min(0, 'At least 0 tokens.').max(100_000_000, 'At most 100000000 tokens.').optional(),
  /** a member's path contains this text (case-insensitive); a directory ends with "/" */
  path: z.string().max(300, 'A path filter has at most 300 characters.').optional(),
  /** a member's function name contains this text (case-insensitive) */
  name: z.string().max(200, 'A function name filter has at most 200 characters.').optional(),
  sort: z.enum(ORGANISATION_CLASS_SORTS).default('tokens'),
  order: z.enum(['asc', 'desc']).default('desc'),
  page: z.coerce.number().int('A whole page number.').min(1, 'Pages start at 1.').max(1_000_000, 'At most page 1000000.').default(1),
  pageSize: z.coerce.number().int('A whole page size.').min(1, 'At least 1 a page.').max(MAX_CLASS_PAGE_SIZE, `At most ${MAX_CLASS_PAGE_SIZE} a page.`).default(25),
});
/** Parsed organisation class query. */
export type OrganisationClassQuery = z.infer<typeof organisationClassQuerySchema>;

/** A repository a class lies in. */
export interface ClassRepositoryDTO {
  id: number;
  name: string;
}

/** A row of the organisation's class list. */
export interface OrganisationClassDTO {
  scope: ClassScope;
  /** a clone class id (within) or a class-across-repositories id (across) */
  id: number;
  size: number;
  tokens: number;
  minSimilarity: number;
  maxSimilarity: number;
  cloneType: number;
  language: string;
  /** compared with the repository's previous snapshot (within only) */
  status: ClassStatus | null;
  /** the repositories it lies in, by name */
  repositories: ClassRepositoryDTO[];
  /** the snapshot it belongs to (within only) */
  snapshot: { id: number; label: string } | null;
  /** the members' paths (at most five) */
  paths: string[];
  /** the lineage's active waiver (within only) */
  waiver: ClassWaiverDTO | null;
  /** the class across repositories this class is part of (within only) */
  acrossClassId: number | null;
}

/** GET /api/clone-classes. */
export interface OrganisationClassPageDTO {
  classes: OrganisationClassDTO[];
  total: number;
  /** how many of the classes the other filters match are waived (whatever the waived filter says) */
  waivedCount: number;
  page: number;
  pageSize: number;
  /** languages and repositories with classes, for the filters' choices */
  languages: string[];
  repositories: ClassRepositoryDTO[];
}

/** A member of a class across repositories: where it is, and its code. */
export interface CrossClassMemberDTO extends CloneClassMemberDTO {
  repositoryId: number;
  repositoryName: string;
  snapshotId: number;
  snapshotLabel: string;
  /** its repository's own clone class, when the copy has copies in its own repository too */
  classId: number | null;
}

/** GET /api/cross-classes/:id. */
export interface CrossClassDetailDTO {
  id: number;
  size: number;
  tokens: number;
  minSimilarity: number;
  maxSimilarity: number;
  cloneType: number;
  language: string;
  repositories: ClassRepositoryDTO[];
  members: CrossClassMemberDTO[];
  /** the pairs among the members, within and across repositories, by member index */
  pairs: CloneClassPairDTO[];
}
