/**
 * API types and schemas of /api/tasks (refactor tasks on class lineages: statuses, history,
 * comments) and /api/members (the organisation's active members a lead may assign).
 */
import { z } from 'zod';
import type { Role } from '../roles';
import { MAX_SERIAL_ID, serialIdSchema } from './ids';
import { ACTIVE_TASK_STATUSES, TASK_STATUSES, type TaskStatus } from '../task-statuses';

export { ACTIVE_TASK_STATUSES, TASK_STATUS_LABELS, TASK_STATUSES, type TaskStatus } from '../task-statuses';

/**
 * Where each status may move (besides won't do, which a lead may choose from any active status).
 * Work goes forward one step at a time and may step back one (a review sends it back to in
 * progress); a done task can be reopened; only a lead reopens a task closed as won't do.
 */
export const TASK_TRANSITIONS: Readonly<Record<TaskStatus, readonly TaskStatus[]>> = {
  open: ['in_progress'],
  in_progress: ['open', 'in_review'],
  in_review: ['in_progress', 'done'],
  done: ['open'],
  wont_do: ['open'],
};

/**
 * Whether a task may move from one status to another: by the table above, plus won't do from any
 * active status. Who may (a lead for won't do and out of it) is checked separately.
 *
 * @example
 * mayMoveTask('open', 'in_progress') // true
 * mayMoveTask('open', 'done') // false
 */
export function mayMoveTask(from: TaskStatus, to: TaskStatus): boolean {
  if (to === 'wont_do') return ACTIVE_TASK_STATUSES.includes(from);
  return TASK_TRANSITIONS[from].includes(to);
}

/** Moves only a lead may make: closing as won't do and reopening from it. */
export function isLeadMove(from: TaskStatus, to: TaskStatus): boolean {
  return to === 'wont_do' || from === 'wont_do';
}

/** Bounds of the free texts. */
export const TASK_LIMITS = { title: 200, description: 5000, reason: 500, comment: 5000, pageSize: 100 } as const;

/** Path parameters of /api/tasks/:id. */
export const taskParamsSchema = z.object({ id: serialIdSchema('task') });

const titleSchema = z
  .string({ error: 'Enter a title.' })
  .trim()
  .min(1, 'Enter a title.')
  .max(TASK_LIMITS.title, `A title has at most ${TASK_LIMITS.title} characters.`)
  // one line: it is also the subject of the notice mails
  .regex(/^[^\r\n]*$/, 'A title is one line.');
const descriptionSchema = z
  .string({ error: 'A description is text.' })
  .trim()
  .max(TASK_LIMITS.description, `A description has at most ${TASK_LIMITS.description} characters.`);
const assigneeSchema = z.uuid({ error: 'Choose an assignee (a user id).' });

/** A due day, YYYY-MM-DD, a real calendar day between 2000 and 2099. */
export const dueOnSchema = z
  .string({ error: 'A due date is a day written YYYY-MM-DD.' })
  .regex(/^20\d\d-\d\d-\d\d$/, 'A due date is a day between 2000 and 2099, written YYYY-MM-DD.')
  .refine((value) => {
    const day = new Date(`${value}T00:00:00Z`);
    return !Number.isNaN(day.getTime()) && day.toISOString().slice(0, 10) === value;
  }, 'A due date must be a real calendar day.');

/** Body of POST /api/tasks. */
export const createTaskSchema = z
  .object({
    cloneClassId: z
      .number({ error: 'Name the clone class (a whole number id).' })
      .int('A clone class id is a whole number.')
      .min(1, 'A clone class id is at least 1.')
      .max(MAX_SERIAL_ID, `A clone class id is at most ${MAX_SERIAL_ID}.`),
    assigneeId: assigneeSchema,
    title: titleSchema,
    description: descriptionSchema.optional(),
    dueOn: dueOnSchema.nullish(),
  })
  .strict();
/** Parsed body of POST /api/tasks. */
export type CreateTaskInput = z.infer<typeof createTaskSchema>;

/**
 * Body of PATCH /api/tasks/:id: a lead edits the title, description, assignee or due date (null
 * clears it); the lead or the assignee changes the status. `reason` goes with won't do, and only with it.
 */
export const updateTaskSchema = z
  .object({
    title: titleSchema.optional(),
    description: descriptionSchema.optional(),
    assigneeId: assigneeSchema.optional(),
    dueOn: dueOnSchema.nullable().optional(),
    status: z.enum(TASK_STATUSES, { error: `A status is one of ${TASK_STATUSES.join(', ')}.` }).optional(),
    reason: z
      .string({ error: 'A reason is text.' })
      .trim()
      .min(1, "Closing as won't do needs a reason.")
      .max(TASK_LIMITS.reason, `A reason has at most ${TASK_LIMITS.reason} characters.`)
      .optional(),
  })
  .strict()
  .refine((body) => Object.keys(body).length > 0, 'Send at least one field to change.')
  .refine((body) => body.status !== 'wont_do' || body.reason !== undefined, { message: "Closing as won't do needs a reason.", path: ['reason'] })
  .refine((body) => body.reason === undefined || body.status === 'wont_do', { message: "A reason goes only with the status wont_do.", path: ['reason'] });
/** Parsed body of PATCH /api/tasks/:id. */
export type UpdateTaskInput = z.infer<typeof updateTaskSchema>;

/** Body of POST /api/tasks/:id/comments. */
export const createTaskCommentSchema = z
  .object({
    body: z
      .string({ error: 'Write a comment.' })
      .trim()
      .min(1, 'Write a comment.')
      .max(TASK_LIMITS.comment, `A comment has at most ${TASK_LIMITS.comment} characters.`),
  })
  .strict();
/** Parsed body of POST /api/tasks/:id/comments. */
export type CreateTaskCommentInput = z.infer<typeof createTaskCommentSchema>;

/** The status filter: one status, or every active (open, in progress, in review) or closed one. */
export const TASK_STATUS_FILTERS = [...TASK_STATUSES, 'active', 'closed'] as const;
/** A status filter value. */
export type TaskStatusFilter = (typeof TASK_STATUS_FILTERS)[number];

/** How the task list may be sorted. */
export const TASK_SORTS = ['due', 'updated', 'created', 'status', 'title'] as const;
/** A sort key of the task list. */
export type TaskSort = (typeof TASK_SORTS)[number];

/** Query of GET /api/tasks. */
export const taskListQuerySchema = z
  .object({
    /** 'me', or a user id */
    assignee: z.union([z.literal('me'), z.uuid()], { error: 'An assignee is "me" or a user id.' }).optional(),
    status: z.enum(TASK_STATUS_FILTERS, { error: `A status is one of ${TASK_STATUS_FILTERS.join(', ')}.` }).optional(),
    repositoryId: serialIdSchema('repository').optional(),
    lineageId: serialIdSchema('lineage').optional(),
    /** '1': only active tasks whose due date has passed */
    overdue: z.enum(['1', '0'], { error: 'overdue is 1 or 0.' }).optional(),
    sort: z.enum(TASK_SORTS, { error: `Sort by one of ${TASK_SORTS.join(', ')}.` }).default('updated'),
    order: z.enum(['asc', 'desc']).optional(),
    page: z.coerce.number({ error: 'A page is a whole number.' }).int('A page is a whole number.').min(1, 'Pages start at 1.').max(100_000, 'At most page 100000.').default(1),
    pageSize: z.coerce
      .number({ error: 'A page size is a whole number.' })
      .int('A page size is a whole number.')
      .min(1, 'At least 1 a page.')
      .max(TASK_LIMITS.pageSize, `At most ${TASK_LIMITS.pageSize} a page.`)
      .default(25),
  })
  .strict();
/** Parsed query of GET /api/tasks. */
export type TaskListQuery = z.infer<typeof taskListQuerySchema>;

/** A person as a task shows them. */
export interface TaskPersonDTO {
  id: string;
  name: string;
}

/** A task as lists and its page show it. */
export interface TaskDTO {
  id: number;
  title: string;
  description: string;
  status: TaskStatus;
  /** the lead's reason, when closed as won't do */
  wontDoReason: string | null;
  /** YYYY-MM-DD, or null */
  dueOn: string | null;
  /** active, with a due day before today (UTC) */
  overdue: boolean;
  repositoryId: number;
  repositoryName: string;
  lineageId: number;
  /** the lineage's latest class (in the newest snapshot that has it), for the side-by-side view */
  cloneClassId: number | null;
  snapshotId: number | null;
  snapshotLabel: string | null;
  /** null once that user is deleted */
  assignee: TaskPersonDTO | null;
  createdBy: TaskPersonDTO | null;
  /** the snapshot whose load found the copies gone and marked the task done by itself */
  closedBySnapshot: { id: number; label: string } | null;
  commentCount: number;
  createdAt: string;
  updatedAt: string;
}

/** What a history entry records. */
export type TaskEventKind = 'created' | 'status' | 'assignee' | 'title' | 'description' | 'due';

/** One change of a task: who (Doublet itself when automatic), when, from, to. */
export interface TaskEventDTO {
  id: number;
  kind: TaskEventKind;
  /** true for Doublet's own changes (the automatic check on a load) */
  automatic: boolean;
  /** the person who made the change; null when automatic or the user is deleted */
  actor: TaskPersonDTO | null;
  from: string | null;
  to: string | null;
  note: string | null;
  createdAt: string;
}

/** A comment on a task. */
export interface TaskCommentDTO {
  id: number;
  author: TaskPersonDTO | null;
  body: string;
  createdAt: string;
}

/** GET /api/tasks/:id, and the answer of PATCH and POST /api/tasks. */
export interface TaskDetailDTO extends TaskDTO {
  /** oldest first */
  events: TaskEventDTO[];
  /** oldest first */
  comments: TaskCommentDTO[];
}

/** POST /api/tasks and PATCH /api/tasks/:id. */
export interface TaskAnswerDTO {
  task: TaskDetailDTO;
}

/** POST /api/tasks/:id/comments. */
export interface TaskCommentAnswerDTO {
  comment: TaskCommentDTO;
}

/** GET /api/tasks. */
export interface TaskPageDTO {
  tasks: TaskDTO[];
  total: number;
  page: number;
  pageSize: number;
}

/** An active member of the organisation, as a lead assigning work sees them. */
export interface MemberDTO {
  id: string;
  name: string;
  role: Role;
}

/** GET /api/members. */
export interface MemberListDTO {
  members: MemberDTO[];
}
