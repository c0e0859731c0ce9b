import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { OutboxListDTO } from '@shared/api/outbox';
import { api } from '@/lib/api-client';

/** Messages a page of the outbox shows. */
export const OUTBOX_PAGE_SIZE = 25;

/** GET /api/outbox, one page, newest first. */
export function getOutbox(page: number): Promise<OutboxListDTO> {
  return api.get<OutboxListDTO>(`/outbox?page=${page}&pageSize=${OUTBOX_PAGE_SIZE}`);
}

/** Query options of one outbox page. */
export const outboxQueryOptions = (page: number) =>
  queryOptions({ queryKey: ['outbox', 'list', { page }], queryFn: () => getOutbox(page) });

/**
 * One page of the organisation's received mail (admins only). Re-read every few seconds, since
 * mail arrives through a job a moment after whatever sent it.
 */
export function useOutbox(page: number) {
  return useQuery({ ...outboxQueryOptions(page), placeholderData: keepPreviousData, refetchInterval: 5000 });
}
