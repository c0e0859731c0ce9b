import { NOTICE_KINDS, type NoticeKind, type NoticePreferencesDTO } from '../../shared/api/notices';

/** Every notice kind with its setting: stored, else on. */
export function presentNoticePreferences(settings: Map<string, boolean>): NoticePreferencesDTO {
  return { notices: Object.fromEntries(NOTICE_KINDS.map((kind) => [kind, settings.get(kind) ?? true])) as Record<NoticeKind, boolean> };
}
