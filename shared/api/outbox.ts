/**
 * API types and schemas of /api/outbox: the mail the local catcher received, for the admins of
 * the organisation each message is about.
 */
import { z } from 'zod';

/** Query of GET /api/outbox: newest first, a page at a time. */
export const outboxQuerySchema = z.object({
  page: z.coerce.number({ error: 'page must be a number.' }).int().min(1, 'page starts at 1.').max(1000, 'At most page 1000.').default(1),
  pageSize: z.coerce.number({ error: 'pageSize must be a number.' }).int().min(1, 'At least 1 a page.').max(100, 'At most 100 a page.').default(25),
});

/** Parsed outbox query. */
export type OutboxQuery = z.infer<typeof outboxQuerySchema>;

/** Path parameters of /api/outbox/:id. */
export const outboxParamsSchema = z.object({ id: z.uuid({ error: 'Not a message id.' }) });

/** One message in the list: who it went to, what about, when it arrived. */
export interface OutboxMessageSummaryDTO {
  id: string;
  /** The recipients, comma-separated. */
  to: string;
  from: string;
  subject: string;
  receivedAt: string;
  sizeBytes: number;
}

/** One message with its bodies. `html` is the sender's HTML: show it only in a sandboxed frame. */
export interface OutboxMessageDTO extends OutboxMessageSummaryDTO {
  text: string;
  html: string | null;
}

/** Answer of GET /api/outbox. */
export interface OutboxListDTO {
  messages: OutboxMessageSummaryDTO[];
  /** Mail about the organisation still queued: the mail server has not accepted it yet (it is retried). */
  waiting: number;
  total: number;
  page: number;
  pageSize: number;
}

/** Answer of GET /api/outbox/:id. */
export interface OutboxMessageAnswerDTO {
  message: OutboxMessageDTO;
}
