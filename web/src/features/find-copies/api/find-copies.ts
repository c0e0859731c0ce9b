import { useMutation } from '@tanstack/react-query';
import type { FindCopiesInput, FindCopiesResultDTO } from '@shared/api/find-copies';
import { api } from '@/lib/api-client';

/** POST /api/find-copies (a POST because the snippet can be large; nothing is stored). */
export function findCopies(input: FindCopiesInput): Promise<FindCopiesResultDTO> {
  return api.post<FindCopiesResultDTO>('/find-copies', input);
}

/**
 * Searches the indexed snapshots for copies of a snippet. A mutation rather than a query: the
 * snippet is the user's code and is kept out of the query cache and its keys.
 */
export function useFindCopies() {
  return useMutation({ mutationFn: findCopies });
}
