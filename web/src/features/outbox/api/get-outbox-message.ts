import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OutboxMessageAnswerDTO } from '@shared/api/outbox';
import { api } from '@/lib/api-client';

/** GET /api/outbox/:id: one message with its text and HTML. */
export function getOutboxMessage(id: string): Promise<OutboxMessageAnswerDTO> {
  return api.get<OutboxMessageAnswerDTO>(`/outbox/${encodeURIComponent(id)}`);
}

/** Query options of one received message. */
export const outboxMessageQueryOptions = (id: string) =>
  queryOptions({ queryKey: ['outbox', 'message', id], queryFn: () => getOutboxMessage(id) });

/** One received message; idle without an id. */
export function useOutboxMessage(id: string | undefined) {
  return useQuery({ ...outboxMessageQueryOptions(id ?? ''), enabled: Boolean(id) });
}
