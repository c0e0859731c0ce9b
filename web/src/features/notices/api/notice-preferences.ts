import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { NoticePreferencesDTO, NoticePreferencesInput } from '@shared/api/notices';
import { api } from '@/lib/api-client';

/** GET /api/account/notices. */
export function getNoticePreferences(): Promise<NoticePreferencesDTO> {
  return api.get<NoticePreferencesDTO>('/account/notices');
}

/** PUT /api/account/notices. */
export function updateNoticePreferences(input: NoticePreferencesInput): Promise<NoticePreferencesDTO> {
  return api.put<NoticePreferencesDTO>('/account/notices', input);
}

/** Query options of the signed-in user's notice settings. */
export const noticePreferencesQueryOptions = () => queryOptions({ queryKey: ['account', 'notices'], queryFn: getNoticePreferences });

/** Which notice mails the signed-in user receives. */
export function useNoticePreferences() {
  return useQuery(noticePreferencesQueryOptions());
}

/** Turns notice kinds on or off; the answer (every kind's setting) replaces the cached one. */
export function useUpdateNoticePreferences() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateNoticePreferences,
    onSuccess: (answer) => queryClient.setQueryData(noticePreferencesQueryOptions().queryKey, answer),
  });
}
